// The demo scenario of set updates in the browser: the demo (seeded as npm start seeds it) has the
// high-mass Drell–Yan study with its invented pseudo-measurement; the demo analyst reweights the
// replica set and profiles the Hessian set from the study page, both saved sets appear in the
// library with their provenance and before/after view, and the sensitivity map shows. The
// figures it reads (N_eff, χ² before/after, shifts) are printed and written to
// tests/artifacts/impact-demo.json as engine output on invented demo data, not checked numbers.
import { execFileSync } from 'node:child_process'
import { writeFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { eq } from 'drizzle-orm'
import type { BrowserContext, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEMO_USERS } from '../../../scripts/seed/01-demo-users'
import { ApiClient } from '../../support/http'
import { artifactsDir, launchBrowser } from '../../support/browser'
import { tables as t, testDB } from '../../support/db'
import { openAs } from '../workflow/fixtures'

const root = fileURLToPath(new URL('../../..', import.meta.url))
const STUDY = 'KHM-13 · High-mass Drell–Yan background'

describe('updating the demo sets by the pseudo-measurement', () => {
  let context: BrowserContext
  let close: () => Promise<void>
  let studyId: string
  const analyst = DEMO_USERS.find(u => u.role === 'analyst')!
  const user = { id: '', email: analyst.email, name: analyst.name, password: analyst.password, client: new ApiClient() }
  const shot = (page: Page, name: string) => page.screenshot({ path: `${artifactsDir}impact-${name}.png`, fullPage: true, animations: 'disabled' })
  const figures: Record<string, unknown> = {}

  beforeAll(async () => {
    execFileSync(`${root}node_modules/.bin/tsx`, ['scripts/seed.ts'], { cwd: root, env: process.env, encoding: 'utf8' })
    const [study] = await testDB().select({ id: t.studies.id }).from(t.studies).where(eq(t.studies.name, STUDY))
    studyId = study!.id
    ;({ context, close } = await launchBrowser())
  }, 600_000)
  afterAll(async () => {
    writeFileSync(`${artifactsDir}impact-demo.json`, JSON.stringify(figures, null, 2))
    await close?.()
  })

  async function update(page: Page, setLabel: RegExp, button: string) {
    const card = page.getByTestId('impact-updates')
    const select = card.getByLabel('Set to update')
    const option = await select.locator('option').filter({ hasText: setLabel }).first().getAttribute('value')
    await select.selectOption(option!)
    await card.getByRole('button', { name: button }).click()
    await expect.poll(async () => (await testDB().select({ state: t.impactUpdates.state }).from(t.impactUpdates).where(eq(t.impactUpdates.parentSetId, option!))).map(r => r.state).join(), { timeout: 120_000, interval: 500 }).toMatch(/done|failed/)
    const [row] = await testDB().select().from(t.impactUpdates).where(eq(t.impactUpdates.parentSetId, option!))
    expect(row!.state, row!.error ?? '').toBe('done')
    return row!
  }

  it('reweights Brindle-MC-1 and profiles Quillon-22 from the study page', async () => {
    const page = await openAs(context, user as never, `/studies/${studyId}`)
    const card = page.getByTestId('impact-updates')
    await card.waitFor()
    const rw = await update(page, /replicas: reweight/, 'Reweight and save the set')
    await expect.poll(() => card.getByTestId('n-eff').textContent(), { timeout: 20_000 }).toContain(rw.summary!.reweight!.effectiveReplicas.toFixed(1))
    await card.getByTestId('impact-update-detail').locator('.main-svg').first().waitFor()
    await shot(page, 'study-reweighted')
    const pf = await update(page, /Hessian: profile/, 'Profile and save the set')
    await card.getByRole('button', { name: `${pf.request.name} ${pf.request.version}` }).click()
    await expect.poll(() => card.getByTestId('chi2').textContent(), { timeout: 20_000 }).toContain('→')
    await expect.poll(() => card.getByTestId('shrinkage').locator('tbody tr').count()).toBe(15)
    await shot(page, 'study-profiled')
    const sensitivity = page.getByTestId('impact-sensitivity')
    await sensitivity.locator('.main-svg').first().waitFor({ timeout: 60_000 })
    await sensitivity.scrollIntoViewIfNeeded()
    await shot(page, 'study-sensitivity')

    for (const row of [rw, pf]) {
      const s = row.summary!
      figures[row.method] = {
        parent: `${s.parent.name} ${s.parent.version}`, saved: `${row.request.name} ${row.request.version}`, points: s.points,
        chi2Before: s.chi2Before, chi2After: s.chi2After,
        ...(s.reweight ? { replicas: s.reweight.replicas, effectiveReplicas: s.reweight.effectiveReplicas, warning: s.reweight.warning, mostProbableAlpha: s.reweight.profile.mostProbableAlpha } : {}),
        ...(s.profile ? { tolerance: s.profile.tolerance, penalty: s.profile.penalty, shifts: s.profile.shifts } : {}),
        shrinkageFirstLast: [0, s.points - 1].map(b => (s.after.plus[b]! + s.after.minus[b]!) / (s.before.plus[b]! + s.before.minus[b]!))
      }
    }
    console.log(`[impact demo] ${JSON.stringify(figures)}`)

    // The saved sets in the library, each with its provenance and before/after view.
    for (const row of [rw, pf]) {
      await page.goto(`${new URL(page.url()).origin}/sets/${row.setId}`)
      const origin = page.getByTestId('impact-set-origin')
      await origin.waitFor({ timeout: 20_000 })
      expect(await origin.textContent()).toContain(row.summary!.parent.name)
      expect(await origin.textContent()).toContain(row.summary!.measurement.name)
      await page.getByText(`Parent set: ${row.summary!.parent.name} ${row.summary!.parent.version}`).waitFor()
      await origin.locator('.main-svg').first().waitFor()
      await shot(page, `set-${row.method}`)
    }
  }, 600_000)
})
