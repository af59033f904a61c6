import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BrowserContext, Page } from 'playwright-core'
import { artifactsDir, launchBrowser } from '../support/browser'
import { testEnv } from '../support/env'
import { uniqueEmail } from '../support/users'

describe('a new physicist signs up in the browser', () => {
  let context: BrowserContext
  let close: () => Promise<void>
  let page: Page
  const app = testEnv().appUrl
  const email = uniqueEmail('browser')
  const password = 'drell-yan-pairs-9'

  beforeAll(async () => {
    ({ context, close } = await launchBrowser())
    page = await context.newPage()
  })
  afterAll(async () => { await close?.() })

  it('signs up, follows the link from the Outbox, signs in and sees the dashboard', async () => {
    await page.goto(`${app}/`)
    await page.waitForURL(/\/signin\?next=/)
    await page.getByRole('link', { name: 'Create an account' }).click()
    await page.waitForURL(/\/signup/)
    await page.getByLabel('Name').fill('Noor Haddad-Lindqvist')
    await page.getByLabel('E-mail').fill(email)
    await page.getByLabel('Password').fill('short')
    await page.getByRole('button', { name: 'Create account' }).click()
    await expect.poll(() => page.getByText('Use at least 10 characters').isVisible()).toBe(true)
    await page.screenshot({ path: `${artifactsDir}signup-field-error.png`, fullPage: true })

    await page.getByLabel('Password').fill(password)
    await page.getByRole('button', { name: 'Create account' }).click()
    await page.getByText('We sent a confirmation link').waitFor()
    await page.getByRole('link', { name: 'Outbox' }).click()
    await page.waitForURL(/\/outbox/)
    const message = page.locator(`[data-outbox-to="${email}"]`).first()
    await message.waitFor()
    await page.screenshot({ path: `${artifactsDir}outbox.png`, fullPage: true })
    await message.getByRole('link', { name: /\/verify\?token=/ }).click()
    await page.waitForURL(/\/verify\?token=/)
    await page.getByText('is confirmed').waitFor()

    await page.getByRole('link', { name: 'Go to sign in' }).click()
    await page.getByLabel('E-mail').fill(email)
    await page.getByLabel('Password').fill(password)
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.getByRole('heading', { name: 'Welcome to Sheaf' }).waitFor()

    await page.getByLabel('Workspace name').fill('Kestrel test beam group')
    await page.getByRole('button', { name: 'Create workspace' }).click()
    await page.getByRole('heading', { name: 'Kestrel test beam group' }).waitFor()
    for (const empty of ['No studies yet', 'No error sets yet', 'No jobs yet']) {
      expect(await page.getByText(empty).isVisible(), empty).toBe(true)
    }
    for (const nav of ['Studies', 'Error sets', 'Jobs', 'Members']) {
      expect(await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: nav }).isVisible()).toBe(true)
    }
    await page.screenshot({ path: `${artifactsDir}dashboard.png`, fullPage: true })
  })

  it('runs the demo job and watches it finish on the Jobs page', async () => {
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Jobs' }).click()
    await page.getByLabel('Numbers to square').fill('2, 3, 4')
    await page.getByRole('button', { name: 'Queue the job' }).click()
    await page.locator('[data-job-state="succeeded"]').first().waitFor({ timeout: 20_000 })
    expect(await page.getByText('"sum":29').isVisible()).toBe(true)
    await page.screenshot({ path: `${artifactsDir}jobs.png`, fullPage: true })
  })

  it('shows the members page with the owner and the invite form', async () => {
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Members' }).click()
    await page.getByRole('heading', { name: 'Invite a colleague' }).waitFor()
    expect(await page.locator(`[data-member="${email}"]`).isVisible()).toBe(true)
    await page.screenshot({ path: `${artifactsDir}members.png`, fullPage: true })
  })

  it('signs out back to the sign-in page', async () => {
    await page.getByRole('button', { name: 'Sign out' }).click()
    await page.waitForURL(/\/signin/)
    await page.screenshot({ path: `${artifactsDir}signin.png`, fullPage: true })
  })
})
