import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BrowserContext } from 'playwright-core'
import { artifactsDir, launchBrowser } from '../../support/browser'
import { openAs, waitForEnd, workflowFixture } from './fixtures'

// The Jobs page lists a workspace's study runs with who asked, state, times and duration, and
// follows them without a reload; the dashboard counts what is queued or running.
describe('the Jobs page', () => {
  let context: BrowserContext
  let close: () => Promise<void>

  beforeAll(async () => {
    ({ context, close } = await launchBrowser())
  })
  afterAll(async () => { await close?.() })

  it('shows a run\'s two jobs until they are done, with who, times and duration, and links to the study', async () => {
    const fx = await workflowFixture('Plover jobs group', 4)
    const run = await fx.ws.analyst.client.post(`/api/workspaces/${fx.ws.id}/studies/${fx.studyId}/run`, {})
    expect(run.status).toBe(202)
    const page = await openAs(context, fx.ws.viewer, '/jobs')
    const rows = page.locator('[data-job-kind="run"]')
    await expect.poll(() => rows.count()).toBe(2)
    // No reload: the page asks again while a job is queued or running.
    await expect.poll(() => page.locator('[data-job-kind="run"][data-job-state="done"]').count(), { timeout: 30_000 }).toBe(2)
    const states = await Promise.all(run.body.results.map((r: { id: string }) => waitForEnd(fx.ws.analyst.client, fx.ws.id, r.id)))
    expect(states).toEqual(['done', 'done'])
    for (const row of await rows.all()) {
      const text = await row.textContent()
      expect(text).toContain('Study run')
      expect(text).toContain('Proton F2 at low x')
      expect(text).toContain(fx.ws.analyst.name)
      expect(await row.locator('[data-job-duration]').textContent()).toMatch(/^\d/)
      // The times stacked in one cell; the last is when it finished, with its zone.
      expect((await row.locator('td').nth(4).textContent())?.trim()).toMatch(/^queued .*started .*finished .*\d{2}:\d{2}:\d{2} \S+$/s)
    }
    await page.screenshot({ path: `${artifactsDir}jobs.png`, fullPage: true, animations: 'disabled' })
    await rows.first().getByRole('link', { name: 'Proton F2 at low x' }).click()
    await page.waitForURL(url => url.pathname === `/studies/${fx.studyId}`)

    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Dashboard' }).click()
    await page.locator('[data-active-jobs="0"]').waitFor()
  })

  it('says so when a workspace has no jobs', async () => {
    const fx = await workflowFixture('Dotterel jobs group', 2)
    const page = await openAs(context, fx.ws.analyst, '/jobs')
    await page.getByText('No jobs yet').waitFor()
    expect(await page.locator('[data-job-id]').count()).toBe(0)
  })
})
