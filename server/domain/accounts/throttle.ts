import type { Redis } from 'ioredis'

export interface ThrottleRule {
  /** Key prefix in Redis, e.g. 'throttle:signin:account'. */
  prefix: string
  /** Failures allowed inside the window before the key is locked. */
  limit: number
  /** Window length and lock length, seconds. */
  windowSeconds: number
}

export interface ThrottleState { blocked: boolean, retryAfterSeconds: number }

/**
 * Fixed-window failure counter in Redis: `fail` counts, `check` says whether the key is locked
 * (count ≥ limit) and for how long, `reset` clears after a success. No Nitro imports, so the
 * unit tests run it against ioredis-mock.
 */
export function createThrottle(redis: Redis, rule: ThrottleRule) {
  const key = (id: string) => `${rule.prefix}:${id.toLowerCase()}`

  async function check(id: string): Promise<ThrottleState> {
    const [count, ttl] = await Promise.all([redis.get(key(id)), redis.ttl(key(id))])
    const blocked = Number(count ?? 0) >= rule.limit
    return { blocked, retryAfterSeconds: blocked ? Math.max(1, ttl) : 0 }
  }

  async function fail(id: string): Promise<ThrottleState> {
    const k = key(id)
    const count = await redis.incr(k)
    if (count === 1) await redis.expire(k, rule.windowSeconds)
    const blocked = count >= rule.limit
    return { blocked, retryAfterSeconds: blocked ? Math.max(1, await redis.ttl(k)) : 0 }
  }

  async function reset(id: string): Promise<void> {
    await redis.del(key(id))
  }

  return { check, fail, reset, rule }
}

export type Throttle = ReturnType<typeof createThrottle>
