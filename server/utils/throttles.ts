import type { H3Event } from 'h3'
import { createThrottle, type Throttle } from '../domain/accounts/throttle'

// Five failures per account or thirty per address within 15 minutes lock that key for the rest
// of the window (common practice; the numbers are ours).
export const SIGNIN_RULES = {
  account: { prefix: 'throttle:signin:account', limit: 5, windowSeconds: 900 },
  address: { prefix: 'throttle:signin:address', limit: 30, windowSeconds: 900 }
} as const

let throttles: { account: Throttle, address: Throttle } | undefined
const useThrottles = () => (throttles ??= {
  account: createThrottle(useRedis(), SIGNIN_RULES.account),
  address: createThrottle(useRedis(), SIGNIN_RULES.address)
})

export const clientAddress = (event: H3Event) =>
  getRequestIP(event, { xForwardedFor: useSettings().trustProxy }) ?? 'unknown'

function tooMany(event: H3Event, seconds: number): never {
  setResponseHeader(event, 'Retry-After', seconds)
  throw createError({
    statusCode: 429,
    statusMessage: `Too many failed sign-ins; try again in ${Math.ceil(seconds / 60)} min`,
    data: { retryAfterSeconds: seconds }
  })
}

/** 429 with Retry-After when the account or the client address is locked. */
export async function assertSigninAllowed(event: H3Event, email: string) {
  const t = useThrottles()
  const [a, b] = await Promise.all([t.account.check(email), t.address.check(clientAddress(event))])
  if (a.blocked || b.blocked) tooMany(event, Math.max(a.retryAfterSeconds, b.retryAfterSeconds))
}

/** Count a failure on both keys. */
export async function recordSigninFailure(event: H3Event, email: string) {
  const t = useThrottles()
  await Promise.all([t.account.fail(email), t.address.fail(clientAddress(event))])
}

export async function clearSigninFailures(email: string) {
  await useThrottles().account.reset(email)
}

// At most five mails per address per hour from the self-service forms (our number).
let mailThrottle: Throttle | undefined
/** False when `email` already received too many self-service mails this hour; else counts this one. */
export async function mayMail(email: string) {
  mailThrottle ??= createThrottle(useRedis(), { prefix: 'throttle:mail', limit: 5, windowSeconds: 3600 })
  if ((await mailThrottle.check(email)).blocked) return false
  await mailThrottle.fail(email)
  return true
}
