// The bins grid behaves like a spreadsheet: its height follows the rows, a pasted block's
// trailing line break adds no bin, moved and added bins stay selected, Enter saves and moves down
// (scrolling when the bin below is out of view), the Export menu opens
// above the grid, and a reach problem sits on the cell to change, quoting the bin as entered and
// the limit to narrow to.
import type { Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchBrowser } from '../../support/browser'
import { gridColumn, openAs, runThroughApi, workflowFixture, type WorkflowFixture } from '../workflow/fixtures'

let browser: Awaited<ReturnType<typeof launchBrowser>>
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

const gridHeight = (page: Page) => page.evaluate(() => (document.querySelector('.sheaf-bins .handsontable') as HTMLElement | null)?.getBoundingClientRect().height ?? 0)
/** 1-based numbers of the rows whose row header shows them selected. */
const selectedRowNumbers = (page: Page) => page.evaluate(() => Array.from(document.querySelectorAll('.sheaf-bins .ht_master tbody tr th'))
  .filter(th => /highlight/.test(th.className)).map(th => Number(th.textContent?.trim())))
const binCount = async (page: Page) => Number(/(\d+) bins/.exec(await page.getByRole('toolbar', { name: 'Bins' }).innerText())?.[1])

/** Clicks the x cell of 1-based grid row `row`. */
async function clickCell(page: Page, row: number, column = 0) {
  await page.locator('.sheaf-bins .ht_master tbody tr').nth(row - 1).locator('td').nth(column).click()
}

/** Pastes plain text into the grid at its selection, as a spreadsheet's copy puts it on the clipboard. */
async function paste(page: Page, text: string) {
  await page.evaluate((t) => {
    const data = new DataTransfer()
    data.setData('text/plain', t)
    const target = document.activeElement ?? document.body
    target.dispatchEvent(new ClipboardEvent('paste', { clipboardData: data, bubbles: true, cancelable: true }))
  }, text)
}

describe('the bins grid as a spreadsheet', () => {
  let fx: WorkflowFixture
  beforeAll(async () => { fx = await workflowFixture('Grid as a spreadsheet', 1) })

  it('grows with the rows of an imported CSV file, and a pasted block\'s trailing line break adds no bin', async () => {
    const page = await openAs(browser.context, fx.ws.analyst, `/studies/${fx.studyId}`)
    await page.locator('.sheaf-bins .ht_master tbody td').first().waitFor()
    const before = await gridHeight(page)
    const csv = ['x,q2', ...Array.from({ length: 12 }, (_, i) => `${(0.01 * (i + 1)).toFixed(2)},10`)].join('\n')
    await page.locator('.sheaf-bins input[type=file]').setInputFiles({ name: 'twelve.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) })
    await page.getByText('Read 12 bins from twelve.csv.').waitFor()
    // 29 px a row: twelve rows need well over 300 px; the grid used to keep the 77 px of one bin until a reload
    await expect.poll(() => gridHeight(page)).toBeGreaterThan(12 * 29)
    expect(before).toBeLessThan(12 * 29)

    await clickCell(page, 12)
    await paste(page, '0.5\t20\n0.6\t30\n')
    await expect.poll(() => binCount(page)).toBe(13)
    expect(await page.getByText('a value is required').count()).toBe(0)
    await page.getByRole('button', { name: 'Save bins' }).click()
    await page.getByText('Saved 13 bins.').waitFor()
  })

  it('keeps moved bins selected, and selects the bin that Add bin puts below the selection; undo takes both back', async () => {
    const study = await workflowFixture('Grid rows and selection', 5)
    const page = await openAs(browser.context, study.ws.analyst, `/studies/${study.studyId}`)
    await page.locator('.sheaf-bins .ht_master tbody td').first().waitFor()
    const x = await gridColumn(page, 'x')
    // the row's own header selects it (the grid draws its row headers in the table itself)
    await page.locator('.sheaf-bins .ht_master tbody tr').nth(1).locator('th').click()
    expect(await selectedRowNumbers(page)).toEqual([2])
    await page.getByRole('button', { name: 'Move selected down' }).click()
    await expect.poll(() => gridColumn(page, 'x')).toEqual([x[0], x[2], x[1], x[3], x[4]])
    expect(await selectedRowNumbers(page)).toEqual([3])
    await page.getByRole('button', { name: 'Add bin', exact: true }).click()
    await expect.poll(() => binCount(page)).toBe(6)
    expect(await gridColumn(page, 'x')).toEqual([x[0], x[2], x[1], '', x[3], x[4]])
    expect(await selectedRowNumbers(page)).toEqual([4])
    await page.getByRole('button', { name: 'Undo', exact: true }).click()
    await page.getByRole('button', { name: 'Undo', exact: true }).click()
    await expect.poll(() => gridColumn(page, 'x')).toEqual(x)
    expect(await binCount(page)).toBe(5)
  })

  it('saves a value with Enter and selects the bin below, also when that bin is out of view and the grid scrolls to it', async () => {
    // 300 bins: more than 255, so the page's payload carries them as JSON text (stores/plugins/flat-rows.ts)
    const bins = Array.from({ length: 300 }, (_, i) => ({ x: Number((0.001 + 0.0025 * i).toPrecision(4)), q2: 10 }))
    const study = await fx.ws.analyst.client.post(`/api/workspaces/${fx.ws.id}/studies`, {
      name: 'Three hundred bins', spec: { kernel: 'dis-nc-f2', options: {}, bins }, setIds: [fx.hessianId]
    })
    expect(study.status).toBe(201)
    const page = await openAs(browser.context, fx.ws.analyst, `/studies/${study.body.id}`)
    await page.locator('.sheaf-bins .ht_master tbody td').first().waitFor()
    expect(await binCount(page)).toBe(300)
    const row = (n: number) => page.locator('.sheaf-bins .ht_master tbody tr', { has: page.locator('th', { hasText: new RegExp(`^${n}$`) }) })
    const xOf = (n: number) => row(n).locator('td').first().innerText()

    // the bin below is in view: the value, the new selection and the neighbours all show
    await row(2).locator('td').first().click()
    await page.keyboard.type('0.3')
    await page.keyboard.press('Enter')
    await expect.poll(() => xOf(2)).toBe('0.3')
    expect(await selectedRowNumbers(page)).toEqual([3])
    expect([await xOf(1), await xOf(3)]).toEqual([String(bins[0]!.x), String(bins[2]!.x)])

    // the last bin in full view: Enter moves below it, and the grid scrolls to draw that bin
    const last = await page.evaluate(() => {
      const holder = document.querySelector('.sheaf-bins .ht_master .wtHolder') as HTMLElement
      const bottom = holder.getBoundingClientRect().top + holder.clientHeight
      return Math.max(...Array.from(holder.querySelectorAll('tbody tr'))
        .filter(tr => tr.getBoundingClientRect().bottom <= bottom + 0.5)
        .map(tr => Number(tr.querySelector('th')?.textContent?.trim())))
    })
    expect(last).toBeLessThan(bins.length)
    await row(last).locator('td').first().click()
    await page.keyboard.type('0.4')
    await page.keyboard.press('Enter')
    await expect.poll(() => selectedRowNumbers(page)).toEqual([last + 1])
    expect(await xOf(last)).toBe('0.4')
    expect(await xOf(last + 1)).toBe(String(bins[last]!.x))
    const shown = await row(last + 1).evaluate((tr) => {
      const holder = tr.closest('.wtHolder') as HTMLElement
      return tr.getBoundingClientRect().bottom <= holder.getBoundingClientRect().top + holder.clientHeight + 0.5
    })
    expect(shown).toBe(true)
  })

  it('opens the Export menu above the grid\'s header, so "Figure, PNG" can be clicked and downloads', async () => {
    const fx2 = await workflowFixture('Export menu above the grid', 6)
    await runThroughApi(fx2)
    const page = await openAs(browser.context, fx2.ws.analyst, `/studies/${fx2.studyId}`)
    await page.locator('[data-band-plot] .main-svg').first().waitFor()
    await page.locator('.sheaf-bins .ht_master tbody td').first().waitFor()
    await page.getByRole('button', { name: 'Export ▾' }).click()
    const item = page.getByRole('menuitem', { name: 'Figure, PNG' })
    // the grid's header must not cover the item: Playwright refuses a click another element would take
    const [download] = await Promise.all([page.waitForEvent('download', { timeout: 20_000 }), item.click({ timeout: 5_000 })])
    expect(download.suggestedFilename()).toMatch(/\.png$/)
  })

  it('puts a reach problem on the Q² max cell, quoting the range as entered and the largest Q² the set reaches', async () => {
    const study = await fx.ws.analyst.client.post(`/api/workspaces/${fx.ws.id}/studies`, {
      name: 'Wide Q² bin', spec: { kernel: 'dis-nc-f2', options: {}, bins: [{ x: 0.01, q2Min: 100, q2Max: 1000 }] }, setIds: [fx.hessianId]
    })
    expect(study.status).toBe(201)
    const page = await openAs(browser.context, fx.ws.analyst, `/studies/${study.body.id}`)
    await page.locator('.sheaf-bins .ht_master tbody td').first().waitFor()
    // columns: x, Q² min, Q² max, label — the toy set's grid ends at Q² = 10⁵ GeV²
    await clickCell(page, 1, 2)
    await page.keyboard.type('200000')
    await page.keyboard.press('Enter')
    const invalid = page.locator('.sheaf-bins .ht_master tbody td.htInvalid')
    await invalid.first().waitFor({ timeout: 15_000 })
    const headers = await page.evaluate(() => {
      const table = document.querySelector('.sheaf-bins .ht_master table.htCore')!
      const heads = Array.from(table.querySelectorAll('thead tr:last-child th')).map(th => th.textContent?.trim() ?? '')
      return Array.from(table.querySelectorAll('tbody td.htInvalid')).map(td => heads[(td as HTMLTableCellElement).cellIndex])
    })
    expect(headers).toEqual(['Q² max [GeV²]'])
    const list = await page.getByText(/Bins to fix before running/).locator('..').innerText()
    expect(list).toContain('Q² 100 to 200000 GeV²')
    expect(list).toMatch(/narrow Q² to at most 1e\+05 GeV²|narrow Q² to at most 100000 GeV²/)
    expect(list).not.toMatch(/\d\.\d{7,}/) // no quadrature node
  })
})
