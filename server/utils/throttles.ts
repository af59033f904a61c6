import type { H3Event } from 'h3'
import { giveBackAttempt, takeAttempt, type ThrottleKey, type ThrottleRule } from '../domain/accounts/throttle'

// Sign-in attempts are counted before the password is checked, in 15-minute fixed windows
// (our numbers):
// - pair: 5 per account from one client address. The 6th is refused for that address only, so
//   the owner signing in from another address is not locked out by someone guessing.
// - address: 30 per client address across all accounts (one address spraying many accounts).
// - account: 100 per account from all addresses together, a ceiling against guessing spread
//   over many addresses (at least 20 addresses at the pair limit); reaching it refuses
//   everyone for the rest of the window.
// A right password clears the pair's count and takes the attempt back from the other two.
export const SIGNIN_RULES = {
  pair: { prefix: 'throttle:signin:pair', limit: 5, windowSeconds: 900 },
  address: { prefix: 'throttle:signin:address', limit: 30, windowSeconds: 900 },
  account: { prefix: 'throttle:signin:account', limit: 100, windowSeconds: 900 }
} as const satisfies Record<string, ThrottleRule>

// At most five mails per e-mail address per hour from the self-service forms (our number).
export const MAIL_RULE: ThrottleRule = { prefix: 'throttle:mail', limit: 5, windowSeconds: 3600 }

/** The client's address (from X-Forwarded-For only when SHEAF_TRUST_PROXY=1). */
export function clientAddress(event: H3Event): string {
  return getRequestIP(event, { xForwardedFor: useSettings().trustProxy }) ?? 'unknown'
}

function signinKeys(event: H3Event, email: string) {
  const address = clientAddress(event)
  return {
    // The address comes first: it cannot contain '|', so the id is unambiguous.
    pair: { rule: SIGNIN_RULES.pair, id: `${address}|${email}` },
    address: { rule: SIGNIN_RULES.address, id: address },
    account: { rule: SIGNIN_RULES.account, id: email }
  } satisfies Record<string, ThrottleKey>
}

const waitText = (seconds: number) => (seconds < 60 ? `${seconds} s` : `${Math.ceil(seconds / 60)} min`)

/**
 * Count this sign-in attempt on the pair, address and account counters before the password is
 * checked; 429 with Retry-After (and the wait in the message) when one of them is full, in which
 * case nothing is counted and the password must not be checked.
 */
export async function countSigninAttempt(event: H3Event, email: string): Promise<void> {
  const { pair, address, account } = signinKeys(event, email)
  const verdict = await takeAttempt(useRedis(), [pair, address, account])
  if (verdict.allowed) return
  const seconds = verdict.retryAfterSeconds
  setResponseHeader(event, 'Retry-After', seconds)
  throw createError({
    statusCode: 429,
    statusMessage: `Too many sign-in attempts; try again in ${waitText(seconds)}`,
    data: { retryAfterSeconds: seconds }
  })
}

/** The password was right: clear the pair's count, take the attempt back from the others. */
export async function signinSucceeded(event: H3Event, email: string): Promise<void> {
  const { pair, address, account } = signinKeys(event, email)
  await giveBackAttempt(useRedis(), [pair], [address, account])
}

/** After a password reset: clear the account's count and this address's count for it. */
export async function clearSigninFailures(event: H3Event, email: string): Promise<void> {
  const { pair, account } = signinKeys(event, email)
  await giveBackAttempt(useRedis(), [pair, account])
}

/** False when `email` already received too many self-service mails this hour; else counts this one. */
export async function mayMail(email: string): Promise<boolean> {
  return (await takeAttempt(useRedis(), [{ rule: MAIL_RULE, id: email }])).allowed
}

// API tokens (our numbers): 600 requests per token per minute, and 30 refused tokens per client
// address per 15 minutes (a wrong, revoked or expired secret), after which that address gets
// 429 for every Bearer request until the window ends — guessing a 256-bit secret is hopeless
// anyway, the limit keeps the database from serving the attempts.
export const TOKEN_RULES = {
  use: { prefix: 'throttle:token:use', limit: 600, windowSeconds: 60 },
  refused: { prefix: 'throttle:token:refused', limit: 30, windowSeconds: 900 }
} as const satisfies Record<string, ThrottleRule>

function tooMany(event: H3Event, seconds: number, what: string): never {
  setResponseHeader(event, 'Retry-After', seconds)
  throw createError({
    statusCode: 429,
    statusMessage: `Too many ${what}; try again in ${waitText(seconds)}`,
    data: { retryAfterSeconds: seconds }
  })
}

/** Before a Bearer secret is looked up: 429 when this address had too many refused tokens. */
export async function countTokenLookup(event: H3Event): Promise<void> {
  const key = { rule: TOKEN_RULES.refused, id: clientAddress(event) }
  const verdict = await takeAttempt(useRedis(), [key])
  if (!verdict.allowed) tooMany(event, verdict.retryAfterSeconds, 'refused API tokens from this address')
}

/** The secret was good: take the lookup back from the address's refusals, count the token's use. */
export async function countTokenUse(event: H3Event, tokenId: string): Promise<void> {
  await giveBackAttempt(useRedis(), [], [{ rule: TOKEN_RULES.refused, id: clientAddress(event) }])
  const verdict = await takeAttempt(useRedis(), [{ rule: TOKEN_RULES.use, id: tokenId }])
  if (!verdict.allowed) tooMany(event, verdict.retryAfterSeconds, 'requests with this API token')
}
