// Who may read the local mail fake's Outbox. It holds every account's verification, reset and
// invitation links, so the whole of it is for the operator of the machine only: whoever shows
// the key that `npm start` made (SHEAF_OUTBOX_KEY, header x-outbox-key). A signed-in user without
// the key reads only the mail addressed to them; anyone else gets 401 saying how to get access.
import { createHash, timingSafeEqual } from 'node:crypto'
import type { H3Event } from 'h3'
import type { SessionUser } from './guards'

export const OUTBOX_KEY_HEADER = 'x-outbox-key'

export type OutboxReader = { all: true } | { all: false, email: string }

const digest = (text: string) => createHash('sha256').update(text, 'utf8').digest()

/** Constant time: both keys are hashed to 32 bytes first, so neither length nor content shows in the timing. */
export function sameKey(given: string, expected: string): boolean {
  return timingSafeEqual(digest(given), digest(expected))
}

/** The operator (everything) or the signed-in user (their own mail); 401 for a wrong key or nobody. */
export function requireOutboxReader(event: H3Event): OutboxReader {
  const given = getRequestHeader(event, OUTBOX_KEY_HEADER)
  const expected = useSettings().outboxKey
  if (given !== undefined) {
    if (expected && sameKey(given, expected)) return { all: true }
    throw createError({
      statusCode: 401,
      statusMessage: 'This Outbox key is not valid: open the Outbox link that npm start printed, or the key in .data/outbox-key'
    })
  }
  const user = event.context.user as SessionUser | null | undefined
  if (user) return { all: false, email: user.email.toLowerCase() }
  throw createError({
    statusCode: 401,
    statusMessage: 'The Outbox needs its key: open the link that npm start printed (key in .data/outbox-key), or sign in to see your own mail',
    data: { keyHeader: OUTBOX_KEY_HEADER, keyFile: '.data/outbox-key' }
  })
}
