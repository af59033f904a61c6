import RedisMock from 'ioredis-mock'
import type { Redis } from 'ioredis'
import { beforeEach, describe, expect, it } from 'vitest'
import { giveBackAttempt, takeAttempt, throttleKey, type ThrottleRule } from '../../../server/domain/accounts/throttle'

// ioredis-mock runs the Lua scripts (through fengari), so the counting logic is checked here;
// tests/integration/throttle.test.ts checks the same against the real Redis and the app.
describe('attempt throttle', () => {
  let redis: Redis
  beforeEach(async () => {
    redis = new RedisMock() as unknown as Redis
    await redis.flushall()
  })
  const rule = (prefix: string, limit: number, windowSeconds = 600): ThrottleRule => ({ prefix, limit, windowSeconds })

  it('lets `limit` attempts through, then refuses with the time left in the window', async () => {
    const r = rule('t', 3)
    for (let i = 0; i < 3; i++) expect((await takeAttempt(redis, [{ rule: r, id: 'a@x.test' }])).allowed).toBe(true)
    const refused = await takeAttempt(redis, [{ rule: r, id: 'a@x.test' }])
    expect(refused.allowed).toBe(false)
    expect(refused.retryAfterSeconds).toBeGreaterThan(590)
    expect(refused.retryAfterSeconds).toBeLessThanOrEqual(600)
    // A refused attempt is not counted.
    expect(await redis.get('t:a@x.test')).toBe('3')
  })

  it('counts before anything is checked: concurrent attempts cannot overshoot the limit', async () => {
    const r = rule('t', 5)
    const verdicts = await Promise.all(Array.from({ length: 25 }, () => takeAttempt(redis, [{ rule: r, id: 'k' }])))
    expect(verdicts.filter(v => v.allowed)).toHaveLength(5)
    expect(await redis.get('t:k')).toBe('5')
  })

  it('counts on every key or on none', async () => {
    const pair = rule('pair', 2)
    const address = rule('addr', 10)
    const keys = [{ rule: pair, id: '10.0.0.1|a@x.test' }, { rule: address, id: '10.0.0.1' }]
    await takeAttempt(redis, keys)
    await takeAttempt(redis, keys)
    const refused = await takeAttempt(redis, keys)
    expect(refused.allowed).toBe(false)
    expect(await redis.get('addr:10.0.0.1')).toBe('2')
    // Another account from the same address still goes through, and counts on the address.
    expect((await takeAttempt(redis, [{ rule: pair, id: '10.0.0.1|b@x.test' }, { rule: address, id: '10.0.0.1' }])).allowed).toBe(true)
    expect(await redis.get('addr:10.0.0.1')).toBe('3')
  })

  it('keeps keys apart and ignores case', async () => {
    const r = rule('t', 1)
    await takeAttempt(redis, [{ rule: r, id: 'A@X.test' }])
    expect((await takeAttempt(redis, [{ rule: r, id: 'a@x.test' }])).allowed).toBe(false)
    expect((await takeAttempt(redis, [{ rule: r, id: 'b@x.test' }])).allowed).toBe(true)
    expect((await takeAttempt(redis, [{ rule: rule('other', 1), id: 'a@x.test' }])).allowed).toBe(true)
  })

  it('sets the window on the first attempt only (fixed window)', async () => {
    const r = rule('t', 10, 100)
    await takeAttempt(redis, [{ rule: r, id: 'k' }])
    await redis.expire('t:k', 5)
    await takeAttempt(redis, [{ rule: r, id: 'k' }])
    expect(await redis.ttl('t:k')).toBeLessThanOrEqual(5)
  })

  it('gives a counter left without expiry its window instead of locking it for ever', async () => {
    const r = rule('t', 2, 100)
    await redis.set('t:k', '7')
    const refused = await takeAttempt(redis, [{ rule: r, id: 'k' }])
    expect(refused.allowed).toBe(false)
    expect(refused.retryAfterSeconds).toBe(100)
    expect(await redis.ttl('t:k')).toBeGreaterThan(90)
    await redis.set('t:j', '0')
    await takeAttempt(redis, [{ rule: r, id: 'j' }])
    expect(await redis.ttl('t:j')).toBeGreaterThan(90)
  })

  it('after a success clears some counters and takes the attempt back from the others', async () => {
    const pair = { rule: rule('pair', 5), id: 'p' }
    const address = { rule: rule('addr', 30), id: 'a' }
    const fresh = { rule: rule('acct', 30), id: 'never-counted' }
    for (let i = 0; i < 3; i++) await takeAttempt(redis, [pair, address])
    await redis.expire(throttleKey(address), 50)
    await giveBackAttempt(redis, [pair], [address, fresh])
    expect(await redis.exists(throttleKey(pair))).toBe(0)
    expect(await redis.get(throttleKey(address))).toBe('2')
    expect(await redis.ttl(throttleKey(address))).toBeLessThanOrEqual(50)
    expect(await redis.exists(throttleKey(fresh))).toBe(0)
  })
})
