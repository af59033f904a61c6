import { readFileSync, writeFileSync } from 'node:fs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BrowserContext, Page } from 'playwright-core'
import { artifactsDir, launchBrowser } from '../../support/browser'
import { createWorkspace, type TestWorkspace } from '../../support/users'
import { waitForBuild } from '../../integration/workflow/build-helpers'
import { openAs, samplesDir } from './fixtures'

// Building fragmentation functions from a fit through the library's form: the INVENTED demo
// fit Verrel-FF-26-K+ as a file, queued, built on the queue, in the library with a header that
// says fragmentation into K+; a fragmentation input with parton sum rules is refused in the form
// with its JSON path, and nothing is queued.
describe('the build form with a fragmentation input', () => {
  let context: BrowserContext
  let close: () => Promise<void>
  let ws: TestWorkspace
  const shot = (page: Page, name: string) => page.screenshot({ path: `${artifactsDir}fragmentation-${name}.png`, fullPage: true, animations: 'disabled' })

  beforeAll(async () => {
    ws = await createWorkspace('Hadron fragmentation group')
    ;({ context, close } = await launchBrowser())
  })
  afterAll(async () => { await close?.() })

  async function openForm() {
    const page = await openAs(context, ws.analyst, '/sets')
    await page.getByRole('button', { name: 'Build from a fit' }).click()
    return page
  }

  it('queues and builds Verrel-FF-26-K+ from its file; the set says fragmentation into K+', async () => {
    const page = await openForm()
    await page.getByLabel('Input file').setInputFiles(`${samplesDir}fits/verrel-ff-26-K+.json`)
    // The file's own members and grid become the form's values (13 members on 70 × 30 nodes).
    await expect.poll(() => page.getByLabel('x nodes').inputValue()).toBe('70')
    await shot(page, 'form')
    await page.getByRole('button', { name: 'Queue the build' }).click()
    await page.getByText('Verrel-FF-26-K+').first().waitFor()
    const build = (await ws.viewer.client.get(`/api/workspaces/${ws.id}/sets`)).body.builds[0]
    const done = await waitForBuild(ws.viewer.client, ws.id, build.id)
    expect(done.state, done.error).toBe('done')
    await page.reload()
    await page.getByRole('link', { name: 'Verrel-FF-26-K+' }).waitFor()
    await shot(page, 'library')
    const detail = (await ws.viewer.client.get(`/api/workspaces/${ws.id}/sets/${done.setId}`)).body
    expect(detail.header).toMatchObject({ density: { type: 'fragmentation', hadron: 'K+' }, memberCount: 13, kind: 'hessian-pairs' })
  })

  it('refuses a fragmentation input with parton sum rules in the form, naming sumRules, and queues nothing', async () => {
    const page = await openForm()
    const doc = JSON.parse(readFileSync(`${samplesDir}fits/verrel-ff-26-pi+.json`, 'utf8'))
    doc.sumRules = { momentum: 'gluon' }
    const file = `${artifactsDir}fragmentation-with-sum-rules.json`
    writeFileSync(file, JSON.stringify(doc))
    const before = (await ws.viewer.client.get(`/api/workspaces/${ws.id}/sets`)).body.builds
    await page.getByLabel('Input file').setInputFiles(file)
    await expect.poll(() => page.getByLabel('x nodes').inputValue()).toBe('70')
    await page.getByRole('button', { name: 'Queue the build' }).click()
    const notice = page.getByText(/sumRules: the parton-density sum rules .* do not apply to fragmentation functions/)
    await notice.waitFor()
    await shot(page, 'refused')
    expect((await ws.viewer.client.get(`/api/workspaces/${ws.id}/sets`)).body.builds).toEqual(before)
  })
})
