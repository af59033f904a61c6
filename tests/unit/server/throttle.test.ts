import RedisMock from 'ioredis-mock'
import type { Redis } from 'ioredis'
import { beforeEach, describe, expect, it } from 'vitest'
import { createThrottle } from '../../../server/domain/accounts/throttle'

describe('failure throttle', () => {
  let redis: Redis
  beforeEach(async () => {
    redis = new RedisMock() as unknown as Redis
    await redis.flushall()
  })

  it('locks a key once the limit of failures is reached, with a retry time', async () => {
    const t = createThrottle(redis, { prefix: 't', limit: 3, windowSeconds: 600 })
    expect(await t.check('a@x.test')).toEqual({ blocked: false, retryAfterSeconds: 0 })
    await t.fail('a@x.test')
    await t.fail('a@x.test')
    expect((await t.check('a@x.test')).blocked).toBe(false)
    const third = await t.fail('a@x.test')
    expect(third.blocked).toBe(true)
    const state = await t.check('a@x.test')
    expect(state.blocked).toBe(true)
    expect(state.retryAfterSeconds).toBeGreaterThan(590)
    expect(state.retryAfterSeconds).toBeLessThanOrEqual(600)
  })

  it('keeps keys apart, ignores case and clears on reset', async () => {
    const t = createThrottle(redis, { prefix: 't', limit: 1, windowSeconds: 60 })
    await t.fail('A@X.test')
    expect((await t.check('a@x.test')).blocked).toBe(true)
    expect((await t.check('b@x.test')).blocked).toBe(false)
    await t.reset('a@x.test')
    expect((await t.check('a@x.test')).blocked).toBe(false)
  })

  it('sets the window only on the first failure (fixed window)', async () => {
    const t = createThrottle(redis, { prefix: 't', limit: 10, windowSeconds: 100 })
    await t.fail('k')
    await redis.expire('t:k', 5)
    await t.fail('k')
    expect(await redis.ttl('t:k')).toBeLessThanOrEqual(5)
  })

  it('separates rules by prefix', async () => {
    const account = createThrottle(redis, { prefix: 'acct', limit: 1, windowSeconds: 60 })
    const address = createThrottle(redis, { prefix: 'addr', limit: 1, windowSeconds: 60 })
    await account.fail('same')
    expect((await address.check('same')).blocked).toBe(false)
  })
})
