// The supervisor's restart pauses (scripts/supervise.ts): doubling from 1 s, capped at 30 s.
import { describe, expect, it } from 'vitest'
import { restartDelayMs, sheafProcesses } from '../../../scripts/supervise'

describe('restartDelayMs', () => {
  it.each([[1, 1000], [2, 2000], [3, 4000], [5, 16_000], [6, 30_000], [50, 30_000]])('restart %i waits %i ms', (n, ms) => {
    expect(restartDelayMs(n)).toBe(ms)
  })
})

describe('sheafProcesses', () => {
  it('gives the Outbox key to the app only', () => {
    const [app, worker] = sheafProcesses({ SHEAF_OUTBOX_KEY: 'k', PORT: '4000', DATABASE_URL: 'postgres://x' })
    expect(app!.env).toMatchObject({ SHEAF_OUTBOX_KEY: 'k', PORT: '4000', DATABASE_URL: 'postgres://x' })
    expect(worker!.env.SHEAF_OUTBOX_KEY).toBeUndefined()
    expect(worker!.env.DATABASE_URL).toBe('postgres://x')
  })
  it('runs one of them when asked', () => {
    expect(sheafProcesses({ SHEAF_SUPERVISE_ONLY: 'worker' }).map(p => p.name)).toEqual(['worker'])
  })
})
