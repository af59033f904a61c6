import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BrowserContext, Page } from 'playwright-core'
import { partonName } from '../../../shared/physics/partons'
import { artifactsDir, launchBrowser } from '../../support/browser'
import { createWorkspace, type TestWorkspace } from '../../support/users'
import { openAs, samplesDir, uploadSample } from './fixtures'

// A fragmentation set in the web app: uploaded through the form, listed with what it holds and
// found by the library's filter, and shown on its page as z·D(z, Q²) with bands, flavour labels
// "u → π⁺", log or linear z, and without the proton's sum rules. The sample file is the TOY set
// of samples/sets/toy-ff-piplus.sheafset (scripts/make-sample-fragmentation.ts).

/** The Plotly layout of the first plot on the page: axis types and titles, legend names. */
const plotOf = (page: Page) => page.evaluate(() => {
  const el = document.querySelector('.js-plotly-plot') as unknown as { layout: any, data: Array<{ name?: string }> }
  const title = (t: unknown) => (typeof t === 'string' ? t : (t as { text?: string } | undefined)?.text ?? '')
  return { xType: el.layout.xaxis.type as string, xTitle: title(el.layout.xaxis.title), yTitle: title(el.layout.yaxis.title), names: el.data.map(d => d.name ?? '') }
})

describe('fragmentation sets in the library and on the set page', () => {
  let context: BrowserContext
  let close: () => Promise<void>
  let ws: TestWorkspace
  const shot = (page: Page, name: string) => page.screenshot({ path: `${artifactsDir}ff-${name}.png`, fullPage: true, animations: 'disabled' })

  beforeAll(async () => {
    ws = await createWorkspace('Fragmentation group')
    const proton = await uploadSample(ws.analyst.client, ws.id, 'toy-hessian.sheafset')
    if (proton.status !== 201) throw new Error(`sample upload answered ${proton.status}`)
    ;({ context, close } = await launchBrowser())
  })
  afterAll(async () => { await close?.() })

  it('uploads the fragmentation sample through the form; the library says what each set holds and filters by it', async () => {
    const page = await openAs(context, ws.analyst, '/sets')
    await page.locator('[data-set="toy-hessian"]').waitFor()
    await page.getByRole('button', { name: 'Upload a set file' }).click()
    await page.locator('input[type="file"]').setInputFiles(`${samplesDir}sets/toy-ff-piplus.sheafset`)
    await page.getByRole('button', { name: 'Upload set' }).click()
    await page.locator('[data-set="toy-ff-pi+"]').waitFor()
    expect(await page.locator('[data-set="toy-ff-pi+"] [data-holds]').textContent()).toBe('fragmentation into π⁺')
    expect(await page.locator('[data-set="toy-hessian"] [data-holds]').textContent()).toBe('parton densities in the proton')
    expect(await page.locator('[data-set="toy-ff-pi+"]').textContent()).toContain('z 0.01 – 0.95')
    await shot(page, 'library')

    await page.getByLabel('Holds').selectOption('fragmentation:pi+')
    await expect.poll(() => page.locator('tr[data-set]').count()).toBe(1)
    expect(await page.locator('tr[data-set]').getAttribute('data-set')).toBe('toy-ff-pi+')
    await page.getByLabel('Holds').selectOption('proton')
    await expect.poll(() => page.locator('tr[data-set]').getAttribute('data-set')).toBe('toy-hessian')
    await shot(page, 'library-filtered')

    const api = await ws.viewer.client.get(`/api/workspaces/${ws.id}/sets`)
    const byName = Object.fromEntries(api.body.sets.map((s: { name: string, density: unknown }) => [s.name, s.density]))
    expect(byName).toEqual({ 'toy-ff-pi+': { type: 'fragmentation', hadron: 'pi+' }, 'toy-hessian': { type: 'parton' } })
  })

  it('shows z·D(z, Q²) with bands, "u → π⁺" labels, log and linear z, and no sum rules', async () => {
    const sets = await ws.viewer.client.get(`/api/workspaces/${ws.id}/sets`)
    const id = sets.body.sets.find((s: { name: string }) => s.name === 'toy-ff-pi+').id
    const page = await openAs(context, ws.viewer, `/sets/${id}`)
    await page.locator('.js-plotly-plot').first().waitFor()
    expect(await page.getByRole('heading', { name: 'Fragmentation functions' }).isVisible()).toBe(true)
    expect(await page.getByRole('heading', { name: 'Sum rules' }).count()).toBe(0)
    expect(await page.getByText('fragmentation into π⁺').first().isVisible()).toBe(true)
    expect(await page.getByLabel('u → π⁺').isChecked()).toBe(true)
    // The antiquark's symbol as the parton table writes it (a u with a combining macron).
    expect(await page.getByLabel(`${partonName(-2)} → π⁺`).isChecked()).toBe(true)
    await expect.poll(async () => (await plotOf(page)).names.join('|')).toContain('u → π⁺')
    const log = await plotOf(page)
    expect(log.xType).toBe('log')
    expect(log.xTitle).toContain('momentum fraction z')
    expect(log.yTitle).toContain('z·D(z, Q²) into π⁺')
    // The band of each curve is drawn beside its central line.
    expect(log.names.filter(n => n.startsWith('d → π⁺')).length).toBeGreaterThanOrEqual(1)
    await shot(page, 'set-log-z')

    await page.getByLabel('log z').uncheck()
    await expect.poll(async () => (await plotOf(page)).xType).toBe('linear')
    await shot(page, 'set-linear-z')

    // A ratio is offered only to sets of the same density: here, none.
    const options = await page.getByLabel('Ratio to').locator('option').allTextContents()
    expect(options).toEqual(['none'])
  })
})
