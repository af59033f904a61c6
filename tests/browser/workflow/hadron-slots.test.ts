import { eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BrowserContext, Page } from 'playwright-core'
import { artifactsDir, launchBrowser } from '../../support/browser'
import { testDB, tables as t } from '../../support/db'
import { createWorkspace } from '../../support/users'
import { openAs, uploadSample } from './fixtures'

// The new-study form offers in each set slot only the sets that hold what the observable reads
// there: parton densities or fragmentation functions. The TOY replica sample stands in for a
// fragmentation set: its stored header is marked as one, as the upload of a set file that says
// its density records it (its numbers are parton densities, TOY data).
describe('the study form and fragmentation functions', () => {
  let context: BrowserContext
  let close: () => Promise<void>
  const shot = (page: Page, name: string) => page.screenshot({ path: `${artifactsDir}hadron-${name}.png`, fullPage: true, animations: 'disabled' })
  const mainSlot = (page: Page) => page.locator('[data-slot="main"]')

  beforeAll(async () => {
    ({ context, close } = await launchBrowser())
  })
  afterAll(async () => { await close?.() })

  it('offers parton sets as main sets and fragmentation sets as the second set of a multiplicity, and fragmentation sets alone for e⁺e⁻', async () => {
    const ws = await createWorkspace('Fragmentation desk')
    const [pdf, ff] = await Promise.all(['toy-hessian.sheafset', 'toy-replicas.sheafset'].map(f => uploadSample(ws.analyst.client, ws.id, f)))
    const db = testDB()
    const [row] = await db.select({ header: t.errorSets.header }).from(t.errorSets).where(eq(t.errorSets.id, ff!.body.id))
    await db.update(t.errorSets).set({ header: { ...row!.header, density: { type: 'fragmentation', hadron: 'pi+' } } }).where(eq(t.errorSets.id, ff!.body.id))

    const page = await openAs(context, ws.analyst, '/studies')
    const errors: string[] = []
    page.on('console', m => { if (m.type() === 'error') errors.push(m.text()) })
    await page.getByRole('button', { name: 'New study' }).click()
    await page.locator('#kernel-picker').selectOption('sidis-multiplicity')
    await expect.poll(() => mainSlot(page).locator('legend').textContent()).toContain('parton densities')
    await expect.poll(() => mainSlot(page).locator('label').allTextContents()).toEqual([expect.stringContaining('toy-hessian')])
    const second = page.getByLabel('Second set — fragmentation functions')
    await expect.poll(() => second.locator('option').allTextContents()).toEqual(['choose a set', expect.stringMatching(/^toy-replicas .* · fragmentation functions into π⁺$/)])
    expect(await page.locator('[data-kernel-variables]').textContent()).toMatch(/x .*z .*Q²/)
    await page.getByLabel('Study name').fill('π⁺ multiplicity')
    await mainSlot(page).getByLabel(/toy-hessian/).check()
    await shot(page, 'form-multiplicity')
    await page.getByRole('button', { name: 'Create the study' }).click()
    await page.waitForURL(/\/studies\/[0-9a-f-]{36}/)
    const id = page.url().split('/').pop()!
    const study = (await ws.analyst.client.get(`/api/workspaces/${ws.id}/studies/${id}`)).body
    expect(study).toMatchObject({ setIds: [pdf!.body.id], secondSetId: ff!.body.id, spec: { kernel: 'sidis-multiplicity' } })
    await shot(page, 'study-multiplicity')

    const again = await openAs(context, ws.analyst, '/studies')
    await again.getByRole('button', { name: 'New study' }).click()
    await again.locator('#kernel-picker').selectOption('epem-hadron')
    await expect.poll(() => mainSlot(again).locator('legend').textContent()).toContain('fragmentation functions')
    await expect.poll(() => mainSlot(again).locator('label').allTextContents()).toEqual([expect.stringContaining('toy-replicas')])
    expect(await again.locator('[data-slot="second"]').count()).toBe(0)
    await shot(again, 'form-annihilation')
    expect(errors.filter(e => /Content Security Policy/.test(e))).toEqual([])
  })
})
