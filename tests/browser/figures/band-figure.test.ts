// Figures a physicist can put in a paper: the band plot keeps its legend, note and titles clear
// of the curves and of each other, labels log axes with their decades, draws each value of a
// second bin variable as its own curve, and exports PDF, SVG and PNG at journal widths with the
// provenance and the caution inside the file.
import { execFileSync } from 'node:child_process'
import { existsSync, readFileSync, writeFileSync } from 'node:fs'
import type { Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { pngTextChunks } from '../../../shared/export/figures'
import { artifactsDir, launchBrowser } from '../../support/browser'
import { uploadSample, openAs, runThroughApi, type WorkflowFixture } from '../workflow/fixtures'
import { createWorkspace } from '../../support/users'

let browser: Awaited<ReturnType<typeof launchBrowser>>
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

/** A workspace with both toy sets and a study of `bins` on both. */
async function studyFixture(name: string, spec: Record<string, unknown>, order: 'hessian-first' | 'replicas-first' = 'hessian-first'): Promise<WorkflowFixture> {
  const ws = await createWorkspace(name)
  const [hessian, replicas] = await Promise.all(['toy-hessian.sheafset', 'toy-replicas.sheafset'].map(f => uploadSample(ws.analyst.client, ws.id, f)))
  const setIds = order === 'hessian-first' ? [hessian!.body.id, replicas!.body.id] : [replicas!.body.id, hessian!.body.id]
  const study = await ws.analyst.client.post(`/api/workspaces/${ws.id}/studies`, { name, spec, setIds })
  if (study.status !== 201) throw new Error(`study creation answered ${study.status}: ${JSON.stringify(study.body)}`)
  return { ws, hessianId: hessian!.body.id, replicasId: replicas!.body.id, studyId: study.body.id }
}

// An x–Q² study: four x values at each of three Q² values (the neutrino-iron study's layout).
const XS = [0.001, 0.01, 0.1, 0.3]
const Q2S = [10, 100, 1000]
const xq2Bins = Q2S.flatMap(q2 => XS.map(x => ({ x, q2 })))

interface Box { x: number, y: number, width: number, height: number }
const overlap = (a: Box, b: Box) => a.x < b.x + b.width - 0.5 && b.x < a.x + a.width - 0.5 && a.y < b.y + b.height - 0.5 && b.y < a.y + a.height - 0.5

/** Boxes of the band plot's parts, read from Plotly's SVG. */
function layoutBoxes(page: Page) {
  return page.evaluate(() => {
    const root = document.querySelector('[data-band-plot] .js-plotly-plot') as HTMLElement
    const box = (el: Element | null) => {
      if (!el) return null
      const r = el.getBoundingClientRect()
      return { x: r.x, y: r.y, width: r.width, height: r.height }
    }
    const all = (sel: string) => Array.from(root.querySelectorAll(sel)).map(e => ({ text: e.textContent ?? '', box: box(e)! }))
    return {
      svg: box(root.querySelector('.main-svg'))!,
      plot: box(root.querySelector('.draglayer .xy .nsewdrag'))!,
      legend: box(root.querySelector('.legend')),
      entries: all('.legend .traces'),
      notes: all('.annotation'),
      yTitle: box(root.querySelector('.g-ytitle')),
      yTicks: all('.yaxislayer-above .ytick text, .yaxislayer-above text.ytick'),
      xTicks: all('.xaxislayer-above .xtick text, .xaxislayer-above .x2tick text').filter(t => t.text.trim() !== ''),
      layout: (root as unknown as { layout: { xaxis: { type: string }, yaxis: { type: string } } }).layout,
      traces: (root as unknown as { data: Array<{ name?: string, customdata?: Array<unknown[] | null>, x?: Array<number | null>, mode?: string, fill?: string }> }).data
        .map(t => ({ name: t.name, bins: (t.customdata ?? []).filter(Boolean).map(c => (c as number[])[3]!), mode: t.mode, fill: t.fill }))
    }
  })
}

describe('the band figure', () => {
  let fx: WorkflowFixture
  beforeAll(async () => {
    fx = await studyFixture('x–Q² figure', { kernel: 'dis-nc-f2', options: {}, bins: xq2Bins })
    await runThroughApi(fx)
  })

  it('draws one curve per Q² value, keeps the legend, the note and the y title clear, and labels the log axis with decades', async () => {
    const page = await openAs(browser.context, fx.ws.analyst, `/studies/${fx.studyId}`)
    await page.locator('[data-band-plot] .main-svg').first().waitFor()
    await page.waitForTimeout(500)
    const b = await layoutBoxes(page)
    await page.locator('[data-band-plot]').screenshot({ path: `${artifactsDir}band-plot-xq2.png` })

    // one curve per Q²: every trace with bins holds bins of one Q² only, and each Q² has its legend entry
    for (const t of b.traces.filter(t => t.bins.length)) expect(new Set(t.bins.map(i => xq2Bins[i]!.q2)).size).toBe(1)
    const legendText = b.entries.map(e => e.text).join(' | ')
    for (const q2 of Q2S) expect(legendText).toContain(`Q² = ${q2} GeV²`)

    // the legend lies outside the frame, its entries apart from each other and inside the image
    expect(b.legend).not.toBeNull()
    expect(overlap(b.legend!, b.plot)).toBe(false)
    for (const [i, e] of b.entries.entries()) {
      expect(e.box.x + e.box.width).toBeLessThanOrEqual(b.svg.x + b.svg.width + 0.5)
      expect(e.box.y + e.box.height).toBeLessThanOrEqual(b.svg.y + b.svg.height + 0.5)
      for (const f of b.entries.slice(i + 1)) expect(overlap(e.box, f.box), `${e.text} / ${f.text}`).toBe(false)
    }
    // the note (prescription and CL) sits above the frame, not on the curves
    expect(b.notes.length).toBeGreaterThan(0)
    for (const n of b.notes) expect(overlap(n.box, b.plot)).toBe(false)
    // the y title is clear of every y tick label
    expect(b.yTitle).not.toBeNull()
    for (const t of b.yTicks) expect(overlap(b.yTitle!, t.box), `y title over tick ${t.text}`).toBe(false)
    // x spans 0.001–0.3: a log axis whose labels all name their decade (never a bare "2" or "5")
    expect(b.layout.xaxis.type).toBe('log')
    expect(b.xTicks.length).toBeGreaterThan(1)
    for (const t of b.xTicks) expect(t.text.trim()).toMatch(/^(1|10|\d+)?(×)?10[⁻⁰¹²³⁴⁵⁶⁷⁸⁹]*$|^1$|^10$/)
  })

  it('switches the axes between log and linear and takes limits', async () => {
    const page = await openAs(browser.context, fx.ws.analyst, `/studies/${fx.studyId}`)
    await page.locator('[data-band-plot] .main-svg').first().waitFor()
    await page.locator('[data-axis-controls] input[name=x-log]').uncheck()
    await expect.poll(async () => (await layoutBoxes(page)).layout.xaxis.type).toBe('linear')
    await page.getByLabel('x to').fill('0.2')
    await page.getByLabel('x to').press('Enter')
    await expect.poll(() => page.evaluate(() => (document.querySelector('[data-band-plot] .js-plotly-plot') as unknown as { layout: { xaxis: { range: number[] } } }).layout.xaxis.range[1])).toBe(0.2)
  })

  it('exports a two-column PDF, an SVG and a PNG with the provenance and the caution inside', async () => {
    const page = await openAs(browser.context, fx.ws.analyst, `/studies/${fx.studyId}`)
    await page.locator('[data-band-plot] .main-svg').first().waitFor()
    await page.locator('[data-band-plot]').getByRole('button', { name: 'Figure for a paper…' }).click()
    const dialog = page.getByRole('dialog', { name: 'Figure for a paper' })
    await dialog.waitFor()
    await dialog.locator('select[name=width-preset]').selectOption('double')
    await dialog.locator('input[name=footer]').check()
    await dialog.locator('[data-figure-preview] .main-svg').first().waitFor()
    await page.waitForTimeout(300)
    await dialog.screenshot({ path: `${artifactsDir}figure-dialog.png` })

    const save = async (format: string) => {
      const [download] = await Promise.all([page.waitForEvent('download', { timeout: 60_000 }), dialog.locator(`[data-save=${format}]`).click()])
      const path = `${artifactsDir}figure-export.${format}`
      await download.saveAs(path)
      return readFileSync(path)
    }
    const pdf = await save('pdf')
    const pdfText = pdf.toString('latin1')
    expect(pdfText.startsWith('%PDF-')).toBe(true)
    expect(pdfText).toMatch(/\/Subject \(Leading-order prediction/)
    expect(pdfText).toMatch(/\/Keywords \(.*set: toy-hessian 1/)
    expect(pdfText).toContain('/Creator (Sheaf)')
    // 17.8 cm wide: 504.6 pt
    expect(pdfText).toMatch(/\/MediaBox \[0 0 50[45]\.\d*/)
    if (existsSync('/usr/bin/pdftoppm')) execFileSync('/usr/bin/pdftoppm', ['-png', '-r', '150', '-singlefile', `${artifactsDir}figure-export.pdf`, `${artifactsDir}figure-export-pdf`])

    const svg = (await save('svg')).toString('utf8')
    expect(svg).toMatch(/<metadata>.*<dc:description>[^<]*set: toy-hessian 1/s)
    expect(svg).toMatch(/<desc>[^<]*caution: Leading-order prediction/)

    const png = new Uint8Array(await save('png'))
    const chunks = pngTextChunks(png)
    expect(chunks.find(c => c.type === 'tEXt' && c.key === 'Description')?.text).toContain('set: toy-hessian 1')
    expect(chunks.find(c => c.type === 'iTXt' && c.key === 'Disclaimer')?.text).toMatch(/^Leading-order prediction/)
    // 17.8 cm at 300 dpi: 2102 px (± rounding of the pt size)
    const width = new DataView(png.buffer, png.byteOffset).getUint32(16)
    expect(Math.abs(width - 2102)).toBeLessThan(8)
    writeFileSync(`${artifactsDir}figure-export-chunks.json`, JSON.stringify(chunks, null, 2))
  })
})

describe('the result controls', () => {
  it('name in the axis menu the variable the plot shows (a fixed M, ranges in y)', async () => {
    const fx = await studyFixture('Rapidity bins at one mass', {
      kernel: 'drell-yan', options: { sqrtSGeV: 8160 }, bins: [-2, -1, 0, 1].map(y => ({ m: 20, yMin: y, yMax: y + 1 }))
    })
    await runThroughApi(fx)
    const page = await openAs(browser.context, fx.ws.analyst, `/studies/${fx.studyId}`)
    await page.locator('[data-band-plot] .main-svg').first().waitFor()
    const chosen = await page.getByLabel('Horizontal axis').evaluate(el => (el as HTMLSelectElement).selectedOptions[0]?.textContent?.trim())
    expect(chosen).toBe('rapidity y')
    const title = await page.locator('[data-band-plot] .g-x2title, [data-band-plot] .g-xtitle').filter({ hasText: /\S/ }).first().textContent()
    expect(title?.trim()).toBe('y')
  })

  it('keep "Values in the grid" on the set first shown while the other set\'s run ends', async () => {
    const fx = await studyFixture('Grid set stays', { kernel: 'dis-nc-f2', options: {}, bins: xq2Bins }, 'replicas-first')
    const page = await openAs(browser.context, fx.ws.analyst, `/studies/${fx.studyId}`)
    await page.getByRole('button', { name: 'Run on 2 sets' }).click()
    const select = page.getByLabel('Values in the grid')
    await select.waitFor({ timeout: 60_000 })
    const first = await select.inputValue()
    await expect.poll(() => page.locator('[data-run-state=done]').count(), { timeout: 60_000 }).toBe(2)
    await page.waitForTimeout(1500)
    expect(await select.inputValue()).toBe(first)
  })
})
