import { describe, expect, it } from 'vitest'
import { makeAlphas } from '../../../../shared/physics/alphas'
import { f2NeutralCurrent, integrateOverRapidity, kernelLabel, rapidityReach, vectorBosonTerm } from '../../../../shared/physics/kernels'
import { toyErrorSet, toyQ2Nodes, toyXNodes, toyXf } from '../../../../shared/physics/sets'
import {
  StudyReachError, buildPlan, checkReach, evaluateDirect, evaluatePlan, parseStudySpec, scaleVariation
} from '../../../../shared/physics/study'
import type { StudySpecInput } from '../../../../shared/physics/study'
import type { ErrorSet, FlavourScheme } from '../../../../shared/physics/types'

// The plan and the direct evaluator share the kernels' forms and quadrature points but compute
// them along different paths (folded sparse weights vs interpolation at every point), so their
// agreement to 1e-12 checks the plan's folding. Physics references: see the kernel tests.

const scheme: FlavourScheme = { type: 'variable', nf: 5, massesGeV: { charm: 1.51, bottom: 4.92, top: 172.5 } }
const x = toyXNodes(30, 1e-5, 0.95)
const q2 = toyQ2Nodes({ q2MinGeV2: 1, q2MaxGeV2: 1e5, count: 20, thresholdsGeV2: [1.51 ** 2, 4.92 ** 2] })
const set = toyErrorSet({ kind: 'hessian-pairs', errorMembers: 2, x, q2, scheme })
// A second set on a different grid: stands in for a nuclear set (bound-proton densities of Pb).
const nuclear: ErrorSet = (() => {
  const s = toyErrorSet({ kind: 'hessian-pairs', errorMembers: 2, x: toyXNodes(26, 1e-5, 0.9), q2: toyQ2Nodes({ q2MinGeV2: 1, q2MaxGeV2: 1e5, count: 16, thresholdsGeV2: [1.51 ** 2, 4.92 ** 2] }), scheme, amplitude: 0.05 })
  return { ...s, header: { ...s.header, target: { type: 'nucleus', z: 82, a: 208 } }, members: s.members.map(m => m.map(v => 0.9 * v)) }
})()
const alphas = makeAlphas({ value: 0.118, scaleGeV2: 91.188 ** 2 }, scheme)

function maxRelDiff(a: Float64Array, b: Float64Array): number {
  expect(a.length).toBe(b.length)
  let w = 0
  for (let i = 0; i < a.length; i++) w = Math.max(w, Math.abs(a[i]! - b[i]!) / Math.max(Math.abs(b[i]!), 1e-300))
  return w
}

const lhc = { sqrtSGeV: 13000 }
const cases: Array<[string, StudySpecInput]> = [
  ['DIS NC F₂ at points', { kernel: 'dis-nc-f2', bins: [{ x: 1e-4, q2: 3 }, { x: 0.01, q2: 2.2801 }, { x: 0.3, q2: 1e4 }] }],
  ['DIS NC d²σ on gold, x and Q² ranges', { kernel: 'dis-nc-d2sigma', options: { sqrtSGeV: 318, target: { type: 'nucleus', z: 79, a: 197 } }, bins: [{ xMin: 0.01, xMax: 0.02, q2Min: 20, q2Max: 40 }, { x: 0.1, q2Min: 3, q2Max: 30 }], quadratureOrder: 5 }],
  ['DIS CC ν̄ d²σ/dx dy, isoscalar, x range', { kernel: 'dis-cc-d2sigma', options: { beam: 'antineutrino', beamEnergyGeV: 120, target: { type: 'isoscalar' } }, bins: [{ xMin: 0.05, xMax: 0.2, y: 0.4 }, { x: 0.3, yMin: 0.2, yMax: 0.8 }] }],
  ['DIS CC xF₃ on iron', { kernel: 'dis-cc-xf3', options: { beam: 'neutrino', target: { type: 'nucleus', z: 26, a: 56 } }, bins: [{ x: 0.2, q2: 10 }] }],
  ['Drell–Yan, mass and rapidity ranges across the bottom threshold', { kernel: 'drell-yan', options: { sqrtSGeV: 8000 }, bins: [{ mMin: 4, mMax: 6, yMin: 0, yMax: 1 }, { m: 60, yMin: -2, yMax: -1.5 }, { m: 200, y: 1.2 }] }],
  ['Drell–Yan averaged over ranges', { kernel: 'drell-yan', options: { sqrtSGeV: 8000 }, bins: [{ mMin: 20, mMax: 40, yMin: 0, yMax: 1 }], rangeMode: 'average' }],
  ['W⁺ and W⁻ dσ/dy', { kernel: 'w-plus', options: lhc, bins: [{ yMin: 0, yMax: 0.5 }, { y: 2 }] }],
  ['W⁻ in p p̄', { kernel: 'w-minus', options: { sqrtSGeV: 1960, beam2: { type: 'antiproton' } }, bins: [{ yMin: -1, yMax: 1 }] }],
  ['Z and W⁺ totals', { kernel: 'z-total', options: lhc, bins: [{}] }],
  ['W⁺ total', { kernel: 'w-plus-total', options: lhc, bins: [{}] }],
  ['gg → H dσ/dy and total', { kernel: 'higgs-ggf', options: lhc, bins: [{ yMin: -0.5, yMax: 0.5 }] }],
  ['gg → H total', { kernel: 'higgs-ggf-total', options: lhc, bins: [{}] }],
  ['luminosities', { kernel: 'lumi-gg', options: lhc, bins: [{ m: 125 }, { mMin: 200, mMax: 300 }] }],
  ['qq̄ luminosity', { kernel: 'lumi-qqbar', options: lhc, bins: [{ m: 91 }] }],
  ['qg luminosity', { kernel: 'lumi-qg', options: lhc, bins: [{ m: 250 }] }],
  ['W charge asymmetry', { kernel: 'w-charge-asymmetry', options: lhc, bins: [{ yMin: 0, yMax: 1 }, { yMin: 1, yMax: 2 }] }],
  ['W⁺/W⁻ ratio', { kernel: 'w-charge-ratio', options: lhc, bins: [{ y: 0.5 }] }],
  ['ν/ν̄ cross-section ratio', { kernel: 'nu-nubar-ratio', options: { beamEnergyGeV: 100, target: { type: 'isoscalar' } }, bins: [{ x: 0.2, y: 0.5 }] }],
  ['user kernel, DIS-like', { kernel: 'user', options: { mode: 'dis', expression: 'x * (1 - y)^2 / q2', sqrtSGeV: 300, weights: [{ a: 2, w: 1 }, { a: -1, w: 0.5 }, { a: 21, w: 0.1 }] }, bins: [{ xMin: 0.01, xMax: 0.1, q2: 50 }] }],
  ['user kernel, hadronic', { kernel: 'user', options: { mode: 'hadron', expression: 'hbarc2 / m^2', sqrtSGeV: 7000, weights: [{ a: 21, b: 2, w: 1 }, { a: 2, b: 21, w: 1 }] }, bins: [{ m: 50, yMin: 0, yMax: 1 }] }],
  ['scale factor 2', { kernel: 'drell-yan', options: lhc, bins: [{ m: 30, yMin: 0, yMax: 1 }], scaleFactor: 2 }]
]

describe('evaluation plan against direct interpolation', () => {
  it.each(cases)('%s: plan = direct to 1e-12 for every member', (_name, doc) => {
    const spec = parseStudySpec(doc)
    const plan = buildPlan(spec, set, { alphas })
    const viaPlan = evaluatePlan(plan, set.members)
    const direct = evaluateDirect(spec, set, { alphas })
    expect(viaPlan.length).toBe(set.members.length * spec.bins.length)
    expect(maxRelDiff(viaPlan, direct)).toBeLessThan(1e-12)
    expect(viaPlan.every(Number.isFinite)).toBe(true)
  })

  it('pA with beam 2 from a second set on another grid, members paired and broadcast', () => {
    const spec = parseStudySpec({ kernel: 'drell-yan', options: { sqrtSGeV: 8160, beam2: { type: 'nucleus', z: 82, a: 208 } }, bins: [{ m: 15, yMin: -1, yMax: 0 }, { m: 40, y: 1.5 }] })
    const plan = buildPlan(spec, set, { second: nuclear })
    const paired = evaluatePlan(plan, set.members, nuclear.members)
    expect(maxRelDiff(paired, evaluateDirect(spec, set, { second: nuclear }))).toBeLessThan(1e-12)
    const nuclearOnly = evaluatePlan(plan, [set.members[0]!], nuclear.members)
    expect(nuclearOnly.length).toBe(nuclear.members.length * 2)
    expect(() => evaluatePlan(plan, set.members)).toThrow('second set')
    expect(() => evaluatePlan(plan, set.members.slice(0, 2), nuclear.members)).toThrow('cannot pair 2')
  })

  it('nuclear ratio σ_pA/(A σ_pp): numerator from the nuclear set, denominator from the baseline', () => {
    const spec = parseStudySpec({ kernel: 'nuclear-ratio', options: { base: 'drell-yan', nucleus: { z: 82, a: 208 }, sqrtSGeV: 8160 }, bins: [{ m: 20, yMin: 0, yMax: 1 }] })
    const plan = buildPlan(spec, set, { second: nuclear })
    const r = evaluatePlan(plan, [set.members[0]!], nuclear.members)
    expect(maxRelDiff(r, evaluateDirect(spec, { ...set, members: [set.members[0]!] }, { second: nuclear }))).toBeLessThan(1e-12)
    // Without a second set the ratio is the pure isospin effect of Pb, close to 1.
    const isospin = evaluatePlan(buildPlan(spec, set), set.members)
    expect(Math.abs(isospin[0]! - 1)).toBeLessThan(0.1)
    // The nuclear toy is the baseline × 0.9 on another grid: the ratio is near 0.9 (isospin aside).
    expect(r[0]! / isospin[0]!).toBeCloseTo(0.9, 2)
  })

  it('DIS on a nucleus reads the nuclear set for the numerator of a DIS nuclear ratio', () => {
    const spec = parseStudySpec({ kernel: 'nuclear-ratio', options: { base: 'dis-nc-f2', nucleus: { z: 82, a: 208 } }, bins: [{ x: 0.05, q2: 10 }] })
    const plan = buildPlan(spec, set, { second: nuclear })
    const r = evaluatePlan(plan, [set.members[0]!], [nuclear.members[0]!])
    const withIsospinOnly = evaluatePlan(buildPlan(spec, set), [set.members[0]!])
    expect(r[0]! / withIsospinOnly[0]!).toBeCloseTo(0.9, 2)
  })
})

describe('nuclear ratio with a DIS base: free-proton or isospin (Z·p + N·n)/A denominator', () => {
  // R = F₂^A/F₂^{denominator} per nucleon (shared/physics/README.md, "Nuclear targets and
  // isospin"; neutron from the proton by isospin, u ↔ d, ESW ch. 4).
  const doc = (denominator?: string) => ({ kernel: 'nuclear-ratio', options: { base: 'dis-nc-f2', nucleus: { z: 82, a: 208 }, ...(denominator ? { denominator } : {}) }, bins: [{ x: 0.05, q2: 10 }, { x: 0.3, q2: 100 }] })

  it('without nuclear effects the isospin denominator gives exactly 1; the proton one gives (Z F₂ᵖ + N F₂ⁿ)/(A F₂ᵖ)', () => {
    const iso = evaluatePlan(buildPlan(parseStudySpec(doc('isospin')), set), [set.members[0]!])
    expect(Array.from(iso)).toEqual([1, 1])
    const free = evaluatePlan(buildPlan(parseStudySpec(doc()), set), [set.members[0]!])
    // reference from the analytic toy at the bins' points, by the F₂ formula on proton and neutron
    const toy = (pdg: number, xx: number, qq: number) => toyXf(pdg, xx, qq, scheme)
    ;[[0.05, 10], [0.3, 100]].forEach(([xb, qb], i) => {
      const p = f2NeutralCurrent(toy, xb!, qb!, { type: 'proton' })
      const n = f2NeutralCurrent(toy, xb!, qb!, { type: 'neutron' })
      expect(Math.abs(free[i]! / ((82 * p + 126 * n) / (208 * p)) - 1)).toBeLessThan(3e-3)
    })
    // the free-proton ratio differs from 1 by the isospin effect alone, which the isospin denominator removes
    expect(Math.abs(free[1]! - 1)).toBeGreaterThan(0.01)
  })

  it('with the nuclear set (baseline × 0.9) the isospin ratio is 0.9 at both bins', () => {
    const r = evaluatePlan(buildPlan(parseStudySpec(doc('isospin')), set, { second: nuclear }), [set.members[0]!], [nuclear.members[0]!])
    for (const v of r) expect(v).toBeCloseTo(0.9, 2)
  })

  it('labels which denominator is used', () => {
    expect(kernelLabel('nuclear-ratio', doc('isospin').options)).toMatch(/\(Z·p \+ N·n\)\/A of Z = 82, A = 208 \(isospin-corrected\)/)
    expect(kernelLabel('nuclear-ratio', doc().options)).toMatch(/over a free proton/)
    expect(kernelLabel('nuclear-ratio', doc('deuteron').options)).toMatch(/over the deuteron of the main set/)
    expect(() => parseStudySpec({ ...doc(), options: { ...doc().options, denominator: 'helium' } })).toThrow(/^option denominator: /)
  })
})

describe('plans against the analytic toy (through the grid)', () => {
  it('F₂ from the plan matches F₂ of the analytic toy to the interpolation accuracy', () => {
    const spec = parseStudySpec({ kernel: 'dis-nc-f2', bins: [{ x: 1e-3, q2: 10 }, { x: 0.05, q2: 100 }, { x: 0.3, q2: 1000 }] })
    const v = evaluatePlan(buildPlan(spec, set), [set.members[0]!])
    spec.bins.forEach((b, i) => {
      const analytic = f2NeutralCurrent((pdg, xx, qq) => toyXf(pdg, xx, qq, scheme), b.x!, b.q2!)
      expect(Math.abs(v[i]! / analytic - 1)).toBeLessThan(2e-3)
    })
  })

  it('the Z total of the plan equals ∫ dσ/dy of the analytic toy over the same rapidity range', () => {
    const spec = parseStudySpec({ kernel: 'z-total', options: lhc, bins: [{}] })
    const v = evaluatePlan(buildPlan(spec, set), [set.members[0]!])
    const [lo, hi] = rapidityReach(91.188, 13000, x[0]!, x[x.length - 1]!)!
    const analytic = integrateOverRapidity(y => vectorBosonTerm('Z', y, lhc), lo, hi, 32, (pdg, xx, qq) => toyXf(pdg, xx, qq, scheme))
    expect(Math.abs(v[0]! / analytic - 1)).toBeLessThan(2e-3)
  })

  it('the total equals dσ/dy integrated over the full reachable rapidity range as an ordinary bin', () => {
    const [lo, hi] = rapidityReach(91.188, 13000, x[0]!, x[x.length - 1]!)!
    const total = evaluatePlan(buildPlan(parseStudySpec({ kernel: 'z-total', options: lhc, bins: [{}], fullRangeOrder: 48 }), set), set.members)
    const binned = evaluatePlan(buildPlan(parseStudySpec({ kernel: 'z', options: lhc, bins: [{ yMin: lo, yMax: hi }], quadratureOrder: 48 }), set), set.members)
    expect(maxRelDiff(total, binned)).toBeLessThan(1e-12)
  })
})

describe('reach', () => {
  it('lists each bin outside the grid or beyond the kinematic limit, with its number', () => {
    const spec = parseStudySpec({ kernel: 'drell-yan', options: lhc, bins: [{ m: 20, y: 0 }, { m: 1, y: 5.5 }, { m: 5000, y: 2 }, { m: 30, y: 0 }] })
    const issues = checkReach(spec, { main: set })
    expect(issues.map(i => [i.bin, i.kind])).toEqual([[2, 'grid'], [3, 'kinematics']])
    expect(issues[0]!.message).toMatch(/^bin 2: x₂ = .* is below the set's smallest x node 0.00001/)
    expect(issues[1]!.message).toContain('kinematic limit')
  })

  it('buildPlan throws a StudyReachError by default, freezes at the edges when asked', () => {
    const spec = parseStudySpec({ kernel: 'dis-nc-f2', bins: [{ x: 0.01, q2: 10 }, { x: 1e-6, q2: 10 }, { x: 0.01, q2: 1e6 }] })
    expect(() => buildPlan(spec, set)).toThrow(StudyReachError)
    try {
      buildPlan(spec, set)
    } catch (e) {
      expect((e as StudyReachError).issues.map(i => i.bin)).toEqual([2, 3])
    }
    const plan = buildPlan(spec, set, { outside: 'freeze' })
    expect(plan.outsideBins.map(i => i.bin)).toEqual([2, 3])
    const frozen = evaluatePlan(plan, [set.members[0]!])
    const edge = evaluatePlan(buildPlan(parseStudySpec({ kernel: 'dis-nc-f2', bins: [{ x: 1e-5, q2: 10 }] }), set), [set.members[0]!])
    expect(frozen[1]).toBeCloseTo(edge[0]!, 14)
    expect(maxRelDiff(frozen, evaluateDirect(spec, { ...set, members: [set.members[0]!] }, { outside: 'freeze' }))).toBeLessThan(1e-12)
  })

  it('a scale factor ½ can push μ_F² below the grid', () => {
    const spec = parseStudySpec({ kernel: 'dis-nc-f2', bins: [{ x: 0.01, q2: 2 }], scaleFactor: 0.5 })
    expect(checkReach(spec, { main: set })[0]!.message).toContain('μ_F² = 0.5 GeV²')
  })

  it('refuses members of the wrong length and the Higgs kernel without α_s', () => {
    const plan = buildPlan(parseStudySpec({ kernel: 'dis-nc-f2', bins: [{ x: 0.01, q2: 10 }] }), set)
    expect(() => evaluatePlan(plan, [new Float64Array(7)])).toThrow('member 0 has 7 values')
    expect(() => buildPlan(parseStudySpec({ kernel: 'higgs-ggf', options: lhc, bins: [{ y: 0 }] }), set)).toThrow('needs α_s')
  })
})

describe('factorisation-scale variation', () => {
  it('evaluates κ = ½, 1, 2 on the central member and reports the spread apart from the PDF band', () => {
    const spec = parseStudySpec({ kernel: 'w-plus', options: lhc, bins: [{ y: 0 }, { yMin: 1, yMax: 2 }] })
    const v = scaleVariation(spec, set, set.members[0]!)
    expect(v.kappas).toEqual([0.5, 1, 2])
    const nominal = evaluatePlan(buildPlan(spec, set), [set.members[0]!])
    expect(Array.from(v.nominal)).toEqual(Array.from(nominal))
    const half = evaluatePlan(buildPlan({ ...spec, scaleFactor: 0.5 }, set), [set.members[0]!])
    expect(v.values[0]).toBe(half[0])
    for (let b = 0; b < 2; b++) {
      expect(v.up[b]!).toBeGreaterThanOrEqual(0)
      expect(v.down[b]!).toBeGreaterThanOrEqual(0)
      expect(v.up[b]! + v.down[b]!).toBeGreaterThan(0)
    }
  })
})
