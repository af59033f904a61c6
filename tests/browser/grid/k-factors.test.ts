// K-factors entered in the bins grid: switched on above the grid, read from a CSV file with the
// grid's columns, saved with their source and the quadrature choice; after a run the grid shows
// the K-factor uncertainty beside the band, and the caution says K-factors are the user's.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchBrowser } from '../../support/browser'
import { K_FACTOR_CAUTION } from '../../../shared/export/caution'
import { gridColumn, openAs, runThroughApi, workflowFixture, type WorkflowFixture } from '../workflow/fixtures'

let browser: Awaited<ReturnType<typeof launchBrowser>>
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

describe('K-factors in the bins grid', () => {
  let fx: WorkflowFixture
  beforeAll(async () => { fx = await workflowFixture('K-factors in the grid', 3) })

  it('reads K and δK from a CSV file, saves them with the source, and shows δK apart after a run', async () => {
    const page = await openAs(browser.context, fx.ws.analyst, `/studies/${fx.studyId}`)
    await page.locator('.sheaf-bins .ht_master tbody td').first().waitFor()
    await page.getByLabel('per bin, with uncertainty').check()
    await expect.poll(() => gridColumn(page, 'K-factor')).toEqual(['', '', ''])
    // The grid's own check refuses a K-factor ≤ 0 on its cell before anything is sent.
    const csv = ['x,q2,kFactor,kFactorError', '0.001,10,1.2,0.06', '0.003,10,0,0', '0.009,10,1.5,0.15'].join('\n')
    await page.locator('.sheaf-bins input[type=file]').setInputFiles({ name: 'k.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) })
    await page.getByText('the K-factor must be above 0').first().waitFor()
    const fixed = csv.replace('0.003,10,0,0', '0.003,10,0.9,0')
    await page.locator('.sheaf-bins input[type=file]').setInputFiles({ name: 'k2.csv', mimeType: 'text/csv', buffer: Buffer.from(fixed) })
    await expect.poll(() => gridColumn(page, 'K-factor')).toEqual(['1.2', '0.9', '1.5'])
    await page.locator('[data-k-source]').fill('NNLO/LO ratios of our note')
    await page.locator('[data-k-quadrature]').check()
    await page.getByRole('button', { name: 'Save bins' }).click()
    await page.getByText('Saved 3 bins.').waitFor()
    const study = (await fx.ws.analyst.client.get(`/api/workspaces/${fx.ws.id}/studies/${fx.studyId}`)).body
    expect(study.spec.kFactors).toEqual({ values: [1.2, 0.9, 1.5], errors: [0.06, 0, 0.15], source: 'NNLO/LO ratios of our note', addErrorInQuadrature: true })
    expect(study.spec.bins).toEqual([{ x: 0.001, q2: 10 }, { x: 0.003, q2: 10 }, { x: 0.009, q2: 10 }])

    await runThroughApi(fx)
    await page.reload()
    await page.locator('[data-k-factor-note]').waitFor({ timeout: 20_000 })
    expect(await page.locator('[data-k-factor-note]').innerText()).toMatch(/source: NNLO\/LO ratios of our note.*added in quadrature/)
    expect(await page.locator('[data-caution]').innerText()).toContain(K_FACTOR_CAUTION)
    await expect.poll(async () => (await gridColumn(page, 'δ(K) Δ')).length).toBe(3)
    expect((await gridColumn(page, 'δ(K) Δ'))[1]).toBe('0')
  })
})
