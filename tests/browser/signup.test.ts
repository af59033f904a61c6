import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BrowserContext, Page } from 'playwright-core'
import { artifactsDir, launchBrowser } from '../support/browser'
import { testEnv } from '../support/env'
import { outboxPageUrl } from '../support/outbox'
import { createUser, createWorkspace, uniqueEmail } from '../support/users'
import { hydrated, openAs } from './workflow/fixtures'

// Accounts in the browser: signing up through the Outbox link, the members page and signing
// out. Each test makes its own user (and workspace) and opens its own page.
describe('accounts in the browser', () => {
  let context: BrowserContext
  let close: () => Promise<void>
  const app = testEnv().appUrl
  const shot = (page: Page, name: string) => page.screenshot({ path: `${artifactsDir}${name}.png`, fullPage: true, animations: 'disabled' })
  const nav = (page: Page, name: string) => page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name })

  beforeAll(async () => {
    ({ context, close } = await launchBrowser())
  })
  afterAll(async () => { await close?.() })

  it('signs up, follows the link from the Outbox, signs in and sees the dashboard', async () => {
    const email = uniqueEmail('browser')
    const password = 'drell-yan-pairs-9'
    const page = await context.newPage() // first: a persistent context keeps at least one page open
    await Promise.all(context.pages().filter(p => p !== page).map(p => p.close()))
    await context.clearCookies()
    await page.goto(`${app}/`)
    await page.waitForURL(/\/signin\?next=/)
    await hydrated(page)
    await page.getByRole('link', { name: 'Create an account' }).click()
    await page.waitForURL(/\/signup/)
    await page.getByLabel('Name').fill('Noor Haddad-Lindqvist')
    await page.getByLabel('E-mail').fill(email)
    await page.getByLabel('Password').fill('short')
    await page.getByRole('button', { name: 'Create account' }).click()
    await page.getByText('Use at least 10 characters').waitFor()
    await shot(page, 'signup-field-error')

    await page.getByLabel('Password').fill(password)
    await page.getByRole('button', { name: 'Create account' }).click()
    await page.getByText('We sent a confirmation link').waitFor()
    await page.goto(outboxPageUrl()) // the operator's Outbox link, with its key, as npm start prints it
    await page.waitForURL(url => url.pathname === '/outbox' && !url.searchParams.has('key'))
    const message = page.locator(`[data-outbox-to="${email}"]`).first()
    await message.waitFor()
    await shot(page, 'outbox')
    await message.getByRole('link', { name: /\/verify\?token=/ }).click()
    await page.waitForURL(/\/verify\?token=/)
    await page.getByText('is confirmed').waitFor()

    await page.getByRole('link', { name: 'Go to sign in' }).click()
    await page.waitForURL(/\/signin/)
    await page.getByLabel('E-mail').fill(email)
    await page.getByLabel('Password').fill(password)
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.getByRole('heading', { name: 'Welcome to Sheaf' }).waitFor()

    await page.getByLabel('Workspace name').fill('Kestrel test beam group')
    await page.getByRole('button', { name: 'Create workspace' }).click()
    await page.getByRole('heading', { name: 'Kestrel test beam group' }).waitFor()
    for (const empty of ['No studies yet', 'No error sets yet', 'No jobs yet']) {
      expect(await page.getByText(empty, { exact: true }).isVisible(), empty).toBe(true)
    }
    for (const name of ['Studies', 'Error sets', 'Jobs', 'Members']) {
      expect(await nav(page, name).isVisible(), name).toBe(true)
    }
    await shot(page, 'dashboard')
  })

  it('shows the members page with the owner and the invite form', async () => {
    const ws = await createWorkspace('Lapwing detector group')
    const page = await openAs(context, ws.owner, '/members')
    await page.getByRole('heading', { name: 'Invite a colleague' }).waitFor()
    for (const user of [ws.owner, ws.analyst, ws.viewer]) {
      expect(await page.locator(`[data-member="${user.email}"]`).isVisible(), user.email).toBe(true)
    }
    expect(await page.locator(`[data-member="${ws.outsider.email}"]`).count()).toBe(0)
    await shot(page, 'members')
  })

  it('signs out back to the sign-in page, and the session is gone', async () => {
    const user = await createUser({ tag: 'signout' })
    const page = await openAs(context, user, '/')
    await page.getByRole('heading', { name: 'Welcome to Sheaf' }).waitFor()
    expect((await page.request.get(`${app}/api/auth/me`)).status()).toBe(200)
    await page.getByRole('button', { name: 'Sign out' }).click()
    await page.waitForURL(/\/signin/)
    await shot(page, 'signin')
    expect((await page.request.get(`${app}/api/auth/me`)).status()).toBe(401)
    await page.goto(`${app}/`)
    await page.waitForURL(/\/signin\?next=/)
    expect(new URL(page.url()).pathname).toBe('/signin')
  })
})
