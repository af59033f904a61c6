// Runs on two sets (server/domain/studies/run.ts prepareRun/computeRun, the same segment and
// combine code the worker runs, inline and without a database): paired members for one family's
// sets, apart variation for a fragmentation second set or on request. Hand-worked cases use sets
// whose members are the toy central member times a constant c_k: every linear observable of
// member k is then c_k times that of the central member, so a ratio of two such sets is a ratio
// of the constants, whatever the kernel's own numbers are.
import { describe, expect, it } from 'vitest'
import { computeRun, evaluateRows, prepareRun } from '../../../server/domain/studies/run'
import { closePool } from '../../../server/domain/studies/pool'
import { runVariation, variationProblem } from '../../../server/domain/studies/check'
import { toyErrorSet, toyQ2Nodes, toyXNodes } from '../../../shared/physics/sets/toy'
import { buildPlan, evaluatePlan } from '../../../shared/physics/study/plan'
import { parseStudySpec } from '../../../shared/physics/study/spec'
import { computeBands } from '../../../shared/physics/uncertainty'
import type { ErrorSet, SetHeader } from '../../../shared/physics/types'
import { expectClose } from '../physics/close'

const grid = {
  x: toyXNodes(30, 1e-5, 0.95),
  q2: toyQ2Nodes({ q2MinGeV2: 2, q2MaxGeV2: 1e4, count: 12, thresholdsGeV2: [1.5 ** 2, 4.75 ** 2] }),
  scheme: { type: 'variable' as const, nf: 5 as const, massesGeV: { charm: 1.5, bottom: 4.75, top: 173 } }
}
const base = toyErrorSet({ kind: 'hessian-pairs', errorMembers: 1, ...grid })

/** A Hessian set (central + one pair) whose member k is the toy central member × c[k]. */
function scaledSet(c: number[], header: Partial<SetHeader> = {}): ErrorSet {
  const central = base.members[0]!
  return {
    ...base,
    header: { ...base.header, memberCount: c.length, ...header },
    members: c.map(f => central.map(v => v * f))
  }
}

// F₂ on the second set's "nucleus" Z = 1, A = 1 (a proton) over F₂ on the main set's proton:
// the ratio of the second set to the first, bin by bin.
const spec = (extra: Record<string, unknown> = {}) => parseStudySpec({
  kernel: 'nuclear-ratio',
  options: { base: 'dis-nc-f2', nucleus: { z: 1, a: 1 } },
  bins: [{ x: 0.001, q2: 10 }, { x: 0.05, q2: 30 }, { x: 0.3, q2: 100 }],
  ...extra
})
const FRAGMENTATION = { density: { type: 'fragmentation' as const, hadron: 'pi+' as const }, family: 'toy-ff', name: 'toy-ff-pi+' }

describe('which variation a run takes', () => {
  const a = scaledSet([1, 1.1, 0.95])
  it.each([
    ['one family, same layout', scaledSet([2, 2.4, 1.9]), false, 'paired'],
    ['another family', scaledSet([2, 2.4, 1.9], { family: 'other' }), false, 'central'],
    ['another family, varySecondSet', scaledSet([2, 2.4, 1.9], { family: 'other' }), true, 'apart'],
    ['a fragmentation set', scaledSet([2, 2.4, 1.9], FRAGMENTATION), false, 'apart'],
    ['one family, another member count', scaledSet([2, 2.4, 1.9, 2.1, 1.95], { family: base.header.family }), false, 'central']
  ])('%s → %s', (_what, second, vary, expected) => {
    expect(runVariation({ varySecondSet: vary }, a, second).variation).toBe(expected)
  })

  it('counts both sets\' members in an apart run', () => {
    expect(runVariation({}, a, scaledSet([2, 2.4, 1.9, 2.1, 1.95], FRAGMENTATION)).rows).toBe(3 + 5 - 1)
  })

  it('refuses varySecondSet without a second set, located at the field', () => {
    const problem = variationProblem({ varySecondSet: true }, null)
    expect(problem?.statusCode).toBe(400)
    expect(problem?.message).toMatch(/varySecondSet: the study has no second set/)
    expect((problem?.data as { issues: Array<{ path: string[] }> }).issues[0]!.path).toEqual(['varySecondSet'])
    expect(variationProblem({ varySecondSet: true }, scaledSet([1, 1, 1]))).toBeNull()
  })
})

describe('paired runs', () => {
  it('two identical sets give a ratio of exactly 1 with a zero band', async () => {
    const c = [1, 1.1, 0.95]
    const run = await computeRun(await prepareRun(spec(), scaledSet(c), scaledSet(c)), 68)
    expect(run.members).toBe(3)
    expect(Array.from(run.values)).toEqual(Array(9).fill(1))
    for (const b of run.bands) {
      expect(b.central).toEqual([1, 1, 1])
      expect(b.plus).toEqual([0, 0, 0])
      expect(b.minus).toEqual([0, 0, 0])
    }
  })

  // Hand-worked (hessian-symmetric, ½|X⁺ − X⁻|, README 13.1): main c = (1, 1.1, 0.95), second
  // c = (2, 2.4, 1.9). Paired: R = (2, 2.4/1.1, 1.9/0.95) = (2, 2.181818…, 2), band
  // ½|2.181818… − 2| = 0.0909090… Varied one at a time: main alone R = (2, 2/1.1, 2/0.95) =
  // (2, 1.818182, 2.105263), band ½|1.818182 − 2.105263| = 0.1435407; second alone
  // R = (2, 2.4, 1.9), band 0.25; in quadrature √(0.1435407² + 0.25²) = 0.2882777.
  it('pairs member k with member k: the band differs from the quadrature of the two bands', async () => {
    const run = await computeRun(await prepareRun(spec(), scaledSet([1, 1.1, 0.95]), scaledSet([2, 2.4, 1.9])), 68)
    const symmetric = run.bands.find(b => b.prescription === 'hessian-symmetric')!
    expectClose(symmetric.central, [2, 2, 2], 1e-12)
    expectClose(symmetric.plus, Array(3).fill(0.5 * (2.4 / 1.1 - 2)), 1e-12)
    const quadrature = Math.hypot(0.5 * (2 / 0.95 - 2 / 1.1), 0.5 * (2.4 - 1.9))
    expectClose(quadrature, 0.2882777, 1e-6)
    for (const p of symmetric.plus) expect(Math.abs(p - quadrature)).toBeGreaterThan(0.15)
    expect(symmetric.apart).toBeUndefined()
  })
})

describe('apart runs', () => {
  // Same hand-worked sets, the second one marked as fragmentation functions (so it varies apart).
  const main = scaledSet([1, 1.1, 0.95])
  const second = scaledSet([2, 2.4, 1.9], FRAGMENTATION)

  it('stores the set\'s members, then the second set\'s members with the first at its central member', async () => {
    const run = await computeRun(await prepareRun(spec(), main, second), 68)
    expect(run.members).toBe(5)
    // Rows: R = c₂/c₁ with (c₁, c₂) = (1, 2), (1.1, 2), (0.95, 2), (1, 2.4), (1, 1.9).
    const expected = [2, 2 / 1.1, 2 / 0.95, 2.4, 1.9].flatMap(r => [r, r, r])
    expectClose(run.values, expected, 1e-12)
  })

  it('combines the two parts in quadrature (hand-worked)', async () => {
    const run = await computeRun(await prepareRun(spec(), main, second), 68)
    const b = run.bands.find(x => x.prescription === 'hessian-symmetric')!
    expectClose(b.apart!.set.plus, Array(3).fill(0.5 * (2 / 0.95 - 2 / 1.1)), 1e-12)
    expectClose(b.apart!.second.plus, Array(3).fill(0.25), 1e-12)
    expectClose(b.plus, Array(3).fill(0.2882777), 1e-6)
    expectClose(b.apart!.combined.plus, b.plus, 0)
    expect(b.apart!.second.name).toBe('toy-ff-pi+ 1')
  })

  it('each part alone equals that set varied alone through the engine\'s plan', async () => {
    const realistic = toyErrorSet({ kind: 'hessian-pairs', errorMembers: 3, ...grid })
    const other = { ...toyErrorSet({ kind: 'hessian-pairs', errorMembers: 2, amplitude: 0.05, ...grid }), header: { ...realistic.header, ...FRAGMENTATION, memberCount: 5 } }
    const s = spec()
    const run = await computeRun(await prepareRun(s, realistic, other), 90)
    const plan = buildPlan(s, realistic, { second: other })
    const alone1 = evaluatePlan(plan, realistic.members, [other.members[0]!])
    const alone2 = evaluatePlan(plan, [realistic.members[0]!], other.members)
    for (const stored of run.bands) {
      const band1 = computeBands({ members: 7, bins: 3, values: alone1 }, { kind: 'hessian-pairs', prescription: stored.prescription, clFrom: 68, clTo: 90 })
      const band2 = computeBands({ members: 5, bins: 3, values: alone2 }, { kind: 'hessian-pairs', prescription: stored.apart!.second.prescription, clFrom: 68, clTo: 90 })
      expectClose(stored.apart!.set.plus, band1.plus, 1e-12)
      expectClose(stored.apart!.set.minus, band1.minus, 1e-12)
      expectClose(stored.apart!.second.plus, band2.plus, 1e-12)
      expectClose(stored.apart!.second.minus, band2.minus, 1e-12)
      expectClose(stored.plus, Array.from(band1.plus, (p, i) => Math.hypot(p, band2.plus[i]!)), 1e-12)
    }
  })

  it('a second set of another family varies apart when the study asks for it', async () => {
    const other = scaledSet([2, 2.4, 1.9], { family: 'other' })
    const held = await computeRun(await prepareRun(spec(), main, other), 68)
    const varied = await computeRun(await prepareRun(spec({ varySecondSet: true }), main, other), 68)
    expect(held.members).toBe(3)
    expect(varied.members).toBe(5)
    expectClose(varied.bands[0]!.apart!.set.plus, held.bands[0]!.plus, 1e-14)
  })
})

describe('the chunk and pool paths', () => {
  const main = toyErrorSet({ kind: 'hessian-pairs', errorMembers: 3, ...grid })
  const paired = toyErrorSet({ kind: 'hessian-pairs', errorMembers: 3, amplitude: 0.05, ...grid })
  const apart = { ...toyErrorSet({ kind: 'hessian-pairs', errorMembers: 2, amplitude: 0.05, ...grid }), header: { ...main.header, ...FRAGMENTATION, memberCount: 5 } }

  it.each([['paired', paired, 7], ['apart', apart, 11]] as const)('%s: chunks of rows put together equal the whole run', async (_what, second, rows) => {
    const p = await prepareRun(spec(), main, second)
    expect(p.members).toBe(rows)
    const whole = await evaluateRows(p, 0, rows)
    // Chunks that cut across the boundary between the two sets' rows (row 7 in the apart run).
    const cuts = [0, 2, 6, 8, rows].filter(c => c <= rows)
    const pieces = await Promise.all(cuts.slice(1).map((c, i) => evaluateRows(p, cuts[i]!, c)))
    expect(Array.from(pieces.flatMap(x => Array.from(x)))).toEqual(Array.from(whole))
  })

  it.each([['paired', paired], ['apart', apart]] as const)('%s: the pool gives the inline numbers', async (_what, second) => {
    process.env.SHEAF_EVAL_THREADS = '1'
    try {
      const p = await prepareRun(spec(), main, second)
      const inline = await computeRun(p, 68)
      const pooled = await computeRun(p, 68, true)
      expect(Array.from(pooled.values)).toEqual(Array.from(inline.values))
      expect(pooled.bands).toEqual(inline.bands)
    } finally {
      await closePool()
      delete process.env.SHEAF_EVAL_THREADS
    }
  }, 120_000)
})
