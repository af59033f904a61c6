import { describe, expect, it } from 'vitest'
import { benchMain } from '../../../scripts/cli/bench'

async function bench(argv: string[]) {
  let stdout = ''
  let stderr = ''
  const code = await benchMain(argv, { stdout: t => { stdout += t }, stderr: t => { stderr += t } })
  return { code, stdout, stderr }
}

describe('bench', () => {
  it('measures (a), (b), (c) at a reduced size and says how the replicas and the direct time were made', async () => {
    const run = await bench(['--replicas', '3', '--direct-members', '2'])
    expect(run.stderr).toBe('')
    expect(run.code).toBe(0)
    const lines = run.stdout.trimEnd().split('\n')
    expect(lines.find(l => l.startsWith('Replicas: 3 (+ member 0) from samples/fits/brindle-mc-1.json'))).toMatch(/Hessian eigenvector pairs at T = 1 LO-evolved by the engine/)
    expect(lines.find(l => l.startsWith('(a) precomputed plan: build '))).toMatch(/target < 2 s: (PASS|MISS)$/)
    expect(lines.find(l => l.startsWith('(b) direct interpolation: 2 members in '))).toMatch(/scaled linearly to 4 members: .*\(timed on a subset of 2 members\)$/)
    expect(lines.find(l => l.includes('ratio (b)/(a) = '))).toMatch(/target ≥ 10: (PASS|MISS)$/)
    expect(lines.find(l => l.startsWith('(c) LO evolution of one member, 100 x × 40 Q² nodes'))).toBeDefined()
    // The plan and direct interpolation compute the same numbers (study/plan.ts: ~1e-14).
    const diff = Number(/largest relative difference (\S+)/.exec(run.stdout)![1])
    expect(diff).toBeLessThan(1e-12)
  }, 60_000)

  it('refuses a bad option value with exit 2', async () => {
    const run = await bench(['--replicas', 'many'])
    expect(run.code).toBe(2)
    expect(run.stderr).toBe("bench: --replicas must be a whole number ≥ 2, got 'many'\n")
  })
})
