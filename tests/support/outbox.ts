import { and, arrayContains, desc, gt } from 'drizzle-orm'
import { tables, testDB } from './db'
import { testEnv } from './env'
import { ApiClient } from './http'

/** The newest message to `to` (received after `since`), polling the mail_outbox table up to 10 s. */
export async function waitForMail(to: string, subject?: RegExp, since = new Date(0)) {
  const deadline = Date.now() + 10_000
  while (Date.now() < deadline) {
    const rows = await testDB().select().from(tables.mailOutbox)
      .where(and(arrayContains(tables.mailOutbox.mailTo, [to.toLowerCase()]), gt(tables.mailOutbox.receivedAt, since)))
      .orderBy(desc(tables.mailOutbox.receivedAt))
    const hit = rows.find(r => !subject || subject.test(r.subject))
    if (hit) return hit
    await new Promise(r => setTimeout(r, 100))
  }
  throw new Error(`no mail to ${to}${subject ? ` matching ${subject}` : ''} within 10 s`)
}

/** The first link in a message body whose path starts with `pathPrefix`. */
export function linkIn(text: string, pathPrefix: string): URL {
  const hit = (text.match(/https?:\/\/\S+/g) ?? []).map(s => new URL(s)).find(u => u.pathname.startsWith(pathPrefix))
  if (!hit) throw new Error(`no ${pathPrefix} link in:\n${text}`)
  return hit
}

/** The operator's Outbox key: scripts/test.sh exports it, and the test app reads the same variable. */
export function outboxKey(): string {
  const key = process.env.SHEAF_OUTBOX_KEY
  if (!key) throw new Error('SHEAF_OUTBOX_KEY is not set: run the tests with `npm test` (bash scripts/test.sh [vitest args])')
  return key
}

/** GET /api/outbox with the operator's key (header x-outbox-key), through `client` (anonymous by default). */
export function readOutbox(client = new ApiClient(), key = outboxKey()) {
  return client.request<{ everything: boolean, messages: OutboxEntry[] }>('GET', '/api/outbox', undefined, { 'x-outbox-key': key })
}

/** The Outbox page with the key in its address, as `npm start` prints it. */
export const outboxPageUrl = () => `${testEnv().appUrl}/outbox?key=${encodeURIComponent(outboxKey())}`

export interface OutboxEntry { id: string, from: string, to: string[], subject: string, text: string, links: string[], receivedAt: string }
