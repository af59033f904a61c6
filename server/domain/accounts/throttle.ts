import type { Redis } from 'ioredis'

export interface ThrottleRule {
  /** Key prefix in Redis, e.g. 'throttle:signin:account'. */
  prefix: string
  /** Attempts allowed inside the window; the next one is refused until the window ends. */
  limit: number
  /** Window length (and so the longest lock), seconds. */
  windowSeconds: number
}

/** One counter: a rule and what it counts for (an e-mail, a client address, or both). */
export interface ThrottleKey { rule: ThrottleRule, id: string }

export interface AttemptVerdict {
  allowed: boolean
  /** Seconds until every full counter has expired; 0 when allowed. */
  retryAfterSeconds: number
}

export const throttleKey = (k: ThrottleKey) => `${k.rule.prefix}:${k.id.toLowerCase()}`

// One atomic step for all counters of an attempt. If any counter has reached its limit, nothing
// is counted and the script answers the longest time left on a full counter (at least 1 s);
// otherwise every counter goes up by one, a new counter gets its window as expiry (and so does
// a counter found without one), and the script answers 0.
// KEYS: the counters; ARGV: limit and window seconds of each, in pairs.
const TAKE = `
local wait = 0
for i, key in ipairs(KEYS) do
  if tonumber(redis.call('GET', key) or '0') >= tonumber(ARGV[2 * i - 1]) then
    local left = redis.call('TTL', key)
    if left < 0 then
      left = tonumber(ARGV[2 * i])
      redis.call('EXPIRE', key, left)
    end
    if left < 1 then left = 1 end
    if left > wait then wait = left end
  end
end
if wait > 0 then return wait end
for i, key in ipairs(KEYS) do
  redis.call('INCR', key)
  if redis.call('TTL', key) < 0 then redis.call('EXPIRE', key, ARGV[2 * i]) end
end
return 0
`

// After a success: delete the first ARGV[1] counters outright and take this attempt back from
// the others (never below zero, never creating a counter, keeping its expiry).
const GIVE_BACK = `
local clear = tonumber(ARGV[1])
for i, key in ipairs(KEYS) do
  if i <= clear then
    redis.call('DEL', key)
  elseif tonumber(redis.call('GET', key) or '0') > 0 then
    redis.call('DECR', key)
  end
end
return 0
`

/**
 * Count one attempt against every counter in `keys` before the guarded work runs, atomically:
 * concurrent attempts cannot all read a count below the limit, so at most `limit` attempts per
 * counter and window get through. A refused attempt counts nowhere. Fixed windows: the expiry
 * is set by the first attempt of a window.
 */
export async function takeAttempt(redis: Redis, keys: ThrottleKey[]): Promise<AttemptVerdict> {
  const args = keys.flatMap(k => [k.rule.limit, k.rule.windowSeconds])
  const wait = Number(await redis.eval(TAKE, keys.length, ...keys.map(throttleKey), ...args))
  return { allowed: wait === 0, retryAfterSeconds: wait }
}

/**
 * After the guarded work succeeded: delete the counters in `clear` and take the attempt back
 * from those in `keep` (a success is not a failure, but it must not wipe other failures).
 */
export async function giveBackAttempt(redis: Redis, clear: ThrottleKey[], keep: ThrottleKey[] = []): Promise<void> {
  const keys = [...clear, ...keep]
  if (!keys.length) return
  await redis.eval(GIVE_BACK, keys.length, ...keys.map(throttleKey), clear.length)
}
