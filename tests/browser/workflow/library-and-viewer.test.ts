import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BrowserContext, Page } from 'playwright-core'
import { artifactsDir, launchBrowser } from '../../support/browser'
import { openAs, runThroughApi, samplesDir, workflowFixture, type WorkflowFixture } from './fixtures'

// The error-set library (a malformed upload is refused with its location and nothing stored;
// the set page plots densities and reads out the sum rules), the new-study form, and the
// viewer, who reads a study but has no Run button and whose run the API refuses. The file's
// workspace is made once through the API; each test opens its own page as its own user, and
// none changes what another reads (the viewer's test runs the study, which no other test uses).
describe('the library, the new-study form and the viewer', () => {
  let context: BrowserContext
  let close: () => Promise<void>
  let fx: WorkflowFixture
  const shot = (page: Page, name: string) => page.screenshot({ path: `${artifactsDir}workflow-${name}.png`, fullPage: true, animations: 'disabled' })

  beforeAll(async () => {
    fx = await workflowFixture('Osprey neutrino group', 5)
    ;({ context, close } = await launchBrowser())
  })
  afterAll(async () => { await close?.() })

  it('refuses a malformed set file with the located problem and stores nothing', async () => {
    const page = await openAs(context, fx.ws.analyst, '/sets')
    await page.locator('[data-set="toy-hessian"]').waitFor()
    await shot(page, 'sets')
    await page.getByRole('button', { name: 'Upload a set file' }).click()
    await page.locator('input[type="file"]').setInputFiles(`${samplesDir}sets/bad-nan.sheafset`)
    await page.getByRole('button', { name: 'Upload set' }).click()
    const alert = page.getByRole('alert')
    await alert.waitFor()
    const text = await alert.textContent()
    expect(text).toContain('Nothing was stored')
    expect(text).toContain('member 2 · x node 3 · Q² node 1 · flavour 21')
    expect(text).toContain('NaN')
    await shot(page, 'set-upload-error')
    const sets = await fx.ws.analyst.client.get(`/api/workspaces/${fx.ws.id}/sets`)
    expect(sets.body.sets.map((s: { name: string }) => s.name).sort()).toEqual(['toy-hessian', 'toy-replicas'])
  })

  it('shows a set: summary, densities on a log-x plot and the sum rules', async () => {
    const page = await openAs(context, fx.ws.analyst, '/sets')
    await page.getByRole('link', { name: 'toy-hessian' }).click()
    await page.waitForURL(/\/sets\/[0-9a-f-]{36}/)
    await page.locator('.js-plotly-plot').first().waitFor()
    await page.locator('[data-rule="momentum"]').waitFor()
    expect(await page.getByRole('heading', { name: 'toy-hessian 1' }).isVisible()).toBe(true)
    await page.getByLabel('Ratio to').selectOption(fx.replicasId)
    await expect.poll(() => page.locator('.js-plotly-plot').count()).toBe(2)
    await shot(page, 'set-detail')
  })

  it('offers the library kernels and the user kernel in the new-study form', async () => {
    const page = await openAs(context, fx.ws.analyst, '/studies')
    await page.getByRole('button', { name: 'New study' }).click()
    await page.getByLabel('Observable (kernel)').selectOption('drell-yan')
    expect(await page.getByLabel('√s').inputValue()).toBe('13000')
    await page.getByLabel('Observable (kernel)').selectOption('user')
    await page.getByLabel(/^Expression/).fill('x ** (')
    await expect.poll(() => page.locator('[data-expression-check]').textContent(), { timeout: 10_000 }).toMatch(/column \d+/)
    await page.getByLabel(/^Expression/).fill('x / q2')
    await expect.poll(() => page.locator('[data-expression-check]').textContent(), { timeout: 10_000 }).toContain('valid')
    await shot(page, 'new-study')
  })

  it('lets the viewer read the study and its bands without a Run button; the API refuses the viewer\'s run', async () => {
    const results = await runThroughApi(fx)
    expect(results.map(r => r.state)).toEqual(['done', 'done'])
    const page = await openAs(context, fx.ws.viewer, `/studies/${fx.studyId}`)
    await page.locator('.sheaf-bins .ht_master td').first().waitFor()
    expect(await page.getByRole('heading', { name: 'Computation' }).isVisible()).toBe(true)
    expect(await page.getByRole('button', { name: /^Run on/ }).count()).toBe(0)
    expect(await page.getByRole('button', { name: 'Save bins' }).count()).toBe(0)
    await page.locator('[data-band-plot] .js-plotly-plot').waitFor()
    expect(await page.getByRole('button', { name: /Submit version/ }).count()).toBe(0)
    await shot(page, 'study-viewer')
    const refused = await fx.ws.viewer.client.post(`/api/workspaces/${fx.ws.id}/studies/${fx.studyId}/run`, {})
    expect(refused.status).toBe(403)
  })
})
