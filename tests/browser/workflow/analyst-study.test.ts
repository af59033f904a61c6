import { readFileSync } from 'node:fs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BrowserContext, Page } from 'playwright-core'
import { artifactsDir, launchBrowser } from '../../support/browser'
import { gridColumn, openAs, runThroughApi, workflowFixture, type WorkflowFixture } from './fixtures'

// An analyst edits a study's bins in the grid, saves, runs it on two TOY sets, watches the
// progress reach 100 %, reads the bands, switches the prescription (the grid's values change
// without a new job) and exports the CSV, whose provenance and numbers are checked; the owner
// approves a submitted version. Each test makes its own workspace, sets and study through the
// API (runs too, when it needs results), so the tests run alone or in any order.
describe('an analyst runs a study in the browser', () => {
  let context: BrowserContext
  let close: () => Promise<void>
  // Screenshots with transitions finished (the progress bars' width, the tabs' underline).
  const shot = (page: Page, name: string) => page.screenshot({ path: `${artifactsDir}workflow-${name}.png`, fullPage: true, animations: 'disabled' })
  const nav = (page: Page, name: string) => page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name })
  const studyResult = async (fx: WorkflowFixture, setId: string) => {
    const study = (await fx.ws.analyst.client.get(`/api/workspaces/${fx.ws.id}/studies/${fx.studyId}`)).body
    return { study, result: study.results.find((r: { setId: string }) => r.setId === setId) as { id: string } }
  }
  /** The study's page once the first set's values stand beside the bins. */
  async function studyWithValues(fx: WorkflowFixture): Promise<Page> {
    const page = await openAs(context, fx.ws.analyst, `/studies/${fx.studyId}`)
    await page.locator('.sheaf-bins .ht_master td').first().waitFor()
    await expect.poll(() => gridColumn(page, '+Δ').then(v => v.length), { timeout: 15_000 }).toBe(6)
    return page
  }
  /** Chooses the replica prescription and waits until the grid shows its values. */
  async function chooseReplicaInterval(page: Page) {
    const before = await gridColumn(page, 'central')
    await Promise.all([
      page.waitForResponse(r => r.url().includes('prescription=replica-68-interval') && r.ok()),
      page.getByLabel('Prescription, Monte-Carlo replicas').selectOption('replica-68-interval')
    ])
    await expect.poll(() => gridColumn(page, 'central')).not.toEqual(before)
  }

  beforeAll(async () => {
    ({ context, close } = await launchBrowser())
  })
  afterAll(async () => { await close?.() })

  it('opens the study from the list and edits a bin in the grid, then saves', async () => {
    const fx = await workflowFixture('Heron structure-function group', 6, 'replicas-first')
    const page = await openAs(context, fx.ws.analyst, '/')
    await nav(page, 'Studies').click()
    await page.locator('[data-study="Proton F2 at low x"]').waitFor()
    await shot(page, 'studies')
    await page.getByRole('link', { name: 'Proton F2 at low x' }).click()
    await page.waitForURL(/\/studies\/[0-9a-f-]{36}/)
    await page.locator('.sheaf-bins .ht_master td').first().waitFor()
    expect(await gridColumn(page, 'x')).toEqual(['0.001', '0.003', '0.009', '0.027', '0.081', '0.243'])

    // Bin 1: x from 0.001 to 0.0015 (typing on a selected cell replaces it; Enter commits).
    await page.locator('.sheaf-bins .ht_master tbody tr').first().locator('td').first().click()
    await page.keyboard.type('0.0015')
    await page.keyboard.press('Enter')
    await page.locator('[data-unsaved]').waitFor()
    expect((await gridColumn(page, 'x'))[0]).toBe('0.0015')
    await shot(page, 'study-grid-edit')
    // Leaving with unsaved bins asks first; staying keeps the draft.
    let asked = ''
    page.once('dialog', (d) => { asked = d.message(); void d.dismiss() })
    await nav(page, 'Error sets').click()
    await expect.poll(() => asked).toContain('unsaved changes')
    expect(page.url()).toContain(`/studies/${fx.studyId}`)
    await page.getByRole('button', { name: 'Save bins' }).click()
    await page.getByText('Saved 6 bins.').waitFor()
    const saved = await fx.ws.analyst.client.get(`/api/workspaces/${fx.ws.id}/studies/${fx.studyId}`)
    expect(saved.body.revision).toBe(2)
    expect(saved.body.spec.bins[0]).toEqual({ x: 0.0015, q2: 10 })
  })

  it('refuses x ≥ 1 at once and an x below the sets\' grid after the server\'s check, on the cell', async () => {
    const fx = await workflowFixture('Kite structure-function group', 6, 'replicas-first')
    const page = await openAs(context, fx.ws.analyst, `/studies/${fx.studyId}`)
    await page.locator('.sheaf-bins .ht_master td').first().waitFor()
    const cell = () => page.locator('.sheaf-bins .ht_master tbody tr').nth(1).locator('td').first()
    const messages = page.getByText(/^Bins to fix before running/).locator('..')
    await cell().click()
    await page.keyboard.type('1.2')
    await page.keyboard.press('Enter')
    await expect.poll(() => messages.textContent()).toContain('row 2, column x: x must be in (0, 1)')
    expect(await cell().getAttribute('class')).toContain('htInvalid')
    // Enter moved the selection down; back up by keyboard (a second click would read as a double-click and edit in place).
    await page.keyboard.press('ArrowUp')
    await page.keyboard.type('1e-7')
    await page.keyboard.press('Enter')
    await expect.poll(() => messages.textContent(), { timeout: 10_000 }).toContain('x = 1e-7 (bin as entered: x = 1e-7, Q² = 10 GeV²) is below the set\'s smallest x node 0.00001')
    expect(await cell().getAttribute('class')).toContain('htInvalid')
    await shot(page, 'study-grid-reach')
    // A value inside the set's reach clears the mark of the cell that was edited, and only that
    // cell changed (a one-cell edit redraws that cell alone).
    const before = await gridColumn(page, 'x')
    await page.keyboard.press('ArrowUp')
    await page.keyboard.type('0.05')
    await page.keyboard.press('Enter')
    await expect.poll(() => cell().getAttribute('class'), { timeout: 10_000 }).not.toContain('htInvalid')
    expect(await gridColumn(page, 'x')).toEqual([before[0], '0.05', ...before.slice(2)])
    await expect.poll(() => page.getByText(/^Bins to fix before running/).count(), { timeout: 10_000 }).toBe(0)
    await page.getByRole('button', { name: 'Discard' }).click()
    await expect.poll(() => gridColumn(page, 'x').then(x => x[1])).toBe('0.003')
    expect(await page.getByText(/^Bins to fix before running/).count()).toBe(0)
  })

  it('runs on both sets and the progress reaches 100 %', async () => {
    const fx = await workflowFixture('Harrier structure-function group', 6, 'replicas-first')
    const page = await openAs(context, fx.ws.analyst, `/studies/${fx.studyId}`)
    await page.getByRole('button', { name: 'Run on 2 sets' }).click()
    const rows = page.locator('[data-run-state]')
    await expect.poll(() => rows.count()).toBe(2)
    await expect.poll(() => page.locator('[data-run-state="done"]').count(), { timeout: 30_000 }).toBe(2)
    const percents = await page.locator('[data-progress-percent]').allTextContents()
    expect(percents).toHaveLength(2)
    for (const text of percents) expect(text).toMatch(/9 \/ 9 · 100 %/)
    await shot(page, 'study-run')
  })

  it('shows the band plot and the values beside the bins', async () => {
    const fx = await workflowFixture('Merlin structure-function group', 6, 'replicas-first')
    await runThroughApi(fx)
    const page = await studyWithValues(fx)
    await page.locator('[data-band-plot] .js-plotly-plot').waitFor()
    expect(await page.locator('[data-caution]').textContent()).toContain('PDF uncertainty only')
    await shot(page, 'study-results')
  })

  it('switches the prescription: the grid shows the replica median and 68 % interval, no new job', async () => {
    const fx = await workflowFixture('Falcon structure-function group', 6, 'replicas-first')
    await runThroughApi(fx)
    const page = await studyWithValues(fx)
    const plusBefore = await gridColumn(page, '+Δ')
    await chooseReplicaInterval(page)
    expect(await gridColumn(page, '+Δ')).not.toEqual(plusBefore)
    const { study, result } = await studyResult(fx, fx.replicasId)
    expect(study.results.length).toBe(2) // the run's two versions, nothing new
    // The grid shows what the route computes from the stored members for that prescription.
    const bands = (await fx.ws.analyst.client.get(`/api/workspaces/${fx.ws.id}/results/${result.id}?prescription=replica-68-interval`)).body.bands
    expect(Number((await gridColumn(page, 'central'))[0])).toBeCloseTo(bands.central[0], 4)
  })

  it('exports the CSV with its provenance and the values of the chosen prescription', async () => {
    const fx = await workflowFixture('Hobby structure-function group', 6, 'replicas-first')
    await runThroughApi(fx)
    const page = await studyWithValues(fx)
    await chooseReplicaInterval(page)
    await page.getByRole('button', { name: 'Export ▾' }).click()
    const [download] = await Promise.all([page.waitForEvent('download'), page.locator('[data-export="csv"]').click()])
    const text = readFileSync(await download.path(), 'utf8')
    const comments = text.split(/\r?\n/).filter(l => l.startsWith('#'))
    expect(comments.some(l => l.includes('set: toy-replicas version 1'))).toBe(true)
    expect(comments.some(l => /prescription: .*median.*; 68% CL/.test(l))).toBe(true)
    expect(comments.some(l => l.includes(`run by: ${fx.ws.analyst.name}`))).toBe(true)
    expect(comments.some(l => l.startsWith('# caution:'))).toBe(true)
    const [header, first] = text.split(/\r?\n/).filter(l => l && !l.startsWith('#'))
    const columns = header!.split(',')
    const cells = first!.split(',')
    expect(cells[columns.indexOf('x')]).toBe('0.001')
    const { result } = await studyResult(fx, fx.replicasId)
    const bands = (await fx.ws.analyst.client.get(`/api/workspaces/${fx.ws.id}/results/${result.id}?prescription=replica-68-interval`)).body.bands
    expect(Number(cells[columns.indexOf('central[replica-68-interval]')])).toBe(bands.central[0])
    expect(Number(cells[columns.indexOf('plus[replica-68-interval]')])).toBe(bands.plus[0])
  })

  it('shows the eigenvector contributions of a Hessian set and submits its version for review', async () => {
    const fx = await workflowFixture('Kestrel structure-function group', 6, 'replicas-first')
    await runThroughApi(fx)
    const page = await studyWithValues(fx)
    await page.getByLabel('Values in the grid').selectOption(fx.hessianId)
    await page.getByRole('heading', { name: 'Eigenvector contributions' }).scrollIntoViewIfNeeded()
    await page.locator('[data-eigenvector-bars] .js-plotly-plot').waitFor()
    await page.getByRole('button', { name: /Submit version 1 for review/ }).click()
    await expect.poll(() => page.locator('[data-review-state]').textContent()).toContain('Submitted')
    await page.locator('[data-trail="result.submitted"]').waitFor()
    const { result } = await studyResult(fx, fx.hessianId)
    expect((await fx.ws.analyst.client.get(`/api/workspaces/${fx.ws.id}/results/${result.id}`)).body.reviewState).toBe('submitted')
  })

  it('lets the owner approve a submitted version, which is then marked frozen', async () => {
    const fx = await workflowFixture('Goshawk structure-function group', 6, 'replicas-first')
    const results = await runThroughApi(fx)
    const hessian = results.find(r => r.setId === fx.hessianId)!
    const submitted = await fx.ws.analyst.client.post(`/api/workspaces/${fx.ws.id}/results/${hessian.id}/submit`, {})
    expect(submitted.status).toBe(200)
    const page = await openAs(context, fx.ws.owner, `/studies/${fx.studyId}`)
    await page.getByLabel('Values in the grid').selectOption(fx.hessianId)
    await expect.poll(() => page.locator('[data-review-state]').textContent()).toContain('Submitted')
    await page.getByLabel('Comment').fill('Bands agree with the note draft.')
    const [approved] = await Promise.all([
      page.waitForResponse(r => r.url().endsWith(`/results/${hessian.id}/approve`) && r.request().method() === 'POST'),
      page.getByRole('button', { name: 'Approve' }).click()
    ])
    expect(approved.status()).toBe(200)
    await expect.poll(() => page.locator('[data-review-state]').textContent()).toContain('frozen')
    await page.locator('[data-trail="result.approved"]').waitFor()
    expect(await page.getByText('is approved and frozen').isVisible()).toBe(true)
    await shot(page, 'study-review')
    await nav(page, 'Dashboard').click()
    await page.getByRole('link', { name: 'Proton F2 at low x' }).waitFor()
    expect(await page.getByText(/toy-hessian 1 v1 approved/).isVisible()).toBe(true)
    await shot(page, 'dashboard')
  })
})
