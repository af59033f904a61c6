// Fixtures of the workflow browser tests, made through the API like a user would: a workspace
// with an owner, an analyst and a viewer, the TOY sample sets uploaded by the analyst, and a
// study created by the analyst. (The seeded demo scenario is not assumed.)
import { readFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import type { BrowserContext, Page } from 'playwright-core'
import { testEnv } from '../../support/env'
import type { ApiClient } from '../../support/http'
import { createWorkspace, type TestUser, type TestWorkspace } from '../../support/users'

export const samplesDir = fileURLToPath(new URL('../../../samples/', import.meta.url))

/** Uploads samples/sets/<file> as multipart with the client's session; returns the status and body. */
export async function uploadSample(client: ApiClient, workspaceId: string, file: string) {
  const form = new FormData()
  form.append('file', new Blob([readFileSync(`${samplesDir}sets/${file}`)]), file)
  const headers: Record<string, string> = { 'x-forwarded-for': client.address, cookie: [...client.cookies].map(([k, v]) => `${k}=${v}`).join('; ') }
  if (client.origin) headers.origin = client.origin
  const res = await fetch(`${client.baseUrl}/api/workspaces/${workspaceId}/sets`, { method: 'POST', headers, body: form })
  return { status: res.status, body: await res.json() as { id: string, name: string, kind: string } }
}

export interface WorkflowFixture {
  ws: TestWorkspace
  hessianId: string
  replicasId: string
  studyId: string
}

/**
 * A workspace with toy-hessian and toy-replicas uploaded and a DIS F₂ study of `bins` bins at
 * Q² = 10 GeV² (x = 0.001 · 3^i) on both sets, not run yet. The first set of the study is the
 * one the page shows beside the bins.
 */
export async function workflowFixture(name: string, bins = 6, order: 'hessian-first' | 'replicas-first' = 'hessian-first'): Promise<WorkflowFixture> {
  const ws = await createWorkspace(name)
  const [hessian, replicas] = await Promise.all(['toy-hessian.sheafset', 'toy-replicas.sheafset'].map(f => uploadSample(ws.analyst.client, ws.id, f)))
  if (hessian!.status !== 201 || replicas!.status !== 201) throw new Error(`sample upload answered ${hessian!.status}/${replicas!.status}`)
  const study = await ws.analyst.client.post(`/api/workspaces/${ws.id}/studies`, {
    name: 'Proton F2 at low x',
    spec: { kernel: 'dis-nc-f2', options: {}, bins: Array.from({ length: bins }, (_, i) => ({ x: Number((0.001 * 3 ** i).toPrecision(6)), q2: 10 })) },
    setIds: order === 'hessian-first' ? [hessian!.body.id, replicas!.body.id] : [replicas!.body.id, hessian!.body.id]
  })
  if (study.status !== 201) throw new Error(`study creation answered ${study.status}: ${JSON.stringify(study.body)}`)
  return { ws, hessianId: hessian!.body.id, replicasId: replicas!.body.id, studyId: study.body.id }
}

/** Waits until a result has ended (done, failed or cancelled); throws after `ms`. */
export async function waitForEnd(client: ApiClient, workspaceId: string, resultId: string, ms = 30_000) {
  const deadline = Date.now() + ms
  for (;;) {
    const res = await client.get(`/api/workspaces/${workspaceId}/results/${resultId}/progress`)
    if (['done', 'failed', 'cancelled'].includes(res.body?.state)) return res.body.state as string
    if (Date.now() > deadline) throw new Error(`result ${resultId} still ${res.body?.state} after ${ms} ms`)
    await new Promise(r => setTimeout(r, 150))
  }
}

/**
 * Waits until Nuxt has hydrated the page after a full load, so that clicks and form input reach
 * Vue's handlers rather than the server-rendered HTML.
 */
export async function hydrated(page: Page) {
  await page.waitForFunction(() => {
    const app = (document.querySelector('#__nuxt') as { __vue_app__?: { config: { globalProperties: { $nuxt?: { isHydrating?: boolean } } } } } | null)?.__vue_app__
    const nuxt = app?.config.globalProperties.$nuxt
    return Boolean(nuxt) && !nuxt!.isHydrating
  })
}

/** Signs `user` in through the sign-in form and waits until the app leaves the sign-in page. */
export async function signInThroughForm(context: BrowserContext, user: TestUser, page?: Page): Promise<Page> {
  page ??= await context.newPage()
  await page.goto(`${testEnv().appUrl}/signin`)
  await hydrated(page)
  await page.getByLabel('E-mail').fill(user.email)
  await page.getByLabel('Password').fill(user.password)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.waitForURL(url => !url.pathname.startsWith('/signin'))
  return page
}

/**
 * A fresh page of `user` at `path`: closes the context's other pages, drops every cookie (no
 * session of an earlier test), signs in through the form and opens `path`. Each test calls it
 * for itself, so no test depends on the page another one left.
 */
export async function openAs(context: BrowserContext, user: TestUser, path: string): Promise<Page> {
  const page = await context.newPage() // first: a persistent context keeps at least one page open
  await Promise.all(context.pages().filter(p => p !== page).map(p => p.close()))
  await context.clearCookies()
  await signInThroughForm(context, user, page)
  await page.goto(`${testEnv().appUrl}${path}`)
  await hydrated(page)
  return page
}

/** Runs the fixture's study on all its sets through the API as the analyst and waits until every result has ended. */
export async function runThroughApi(fx: WorkflowFixture): Promise<Array<{ id: string, setId: string, state: string }>> {
  const run = await fx.ws.analyst.client.post(`/api/workspaces/${fx.ws.id}/studies/${fx.studyId}/run`, {})
  if (run.status !== 202) throw new Error(`run answered ${run.status}: ${JSON.stringify(run.body)}`)
  const results = run.body.results as Array<{ id: string, setId: string }>
  const states = await Promise.all(results.map(r => waitForEnd(fx.ws.analyst.client, fx.ws.id, r.id)))
  if (states.some(s => s !== 'done')) throw new Error(`the fixture's run ended ${states.join(', ')}`)
  return results.map((r, k) => ({ ...r, state: states[k]! }))
}

/** Text of the grid's body cells in the column whose header reads `header` (rendered rows only). */
export async function gridColumn(page: Page, header: string): Promise<string[]> {
  return page.evaluate((wanted) => {
    const table = document.querySelector('.sheaf-bins .ht_master table.htCore')
    if (!table) return []
    const index = Array.from(table.querySelectorAll('thead tr:last-child th')).findIndex(th => th.textContent?.trim() === wanted)
    if (index < 0) return []
    return Array.from(table.querySelectorAll('tbody tr')).map(tr => tr.children[index]?.textContent?.trim() ?? '')
  }, header)
}
