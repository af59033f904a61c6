import { describe, expect, it } from 'vitest'
import { eigenvectorModel, evaluateModel, profile, profiledMembers, profiledSet } from '../../../../shared/physics/impact'
import { memberValuesFromRows } from '../../../../shared/physics/uncertainty'
import { readFileSync } from 'node:fs'
import { parseSetFile } from '../../../../shared/physics/sets'
import { expectClose } from '../close'
import { DATA, DATA_COVARIANCE, hessianParameterMembers, posterior, predict } from './gaussian-toy'

const T = 1.6448536269514722
const measurement = { values: DATA, covariance: { size: 4, values: Float64Array.from(DATA_COVARIANCE.to1DArray()) } }

function toyProfile() {
  const parameters = hessianParameterMembers(T)
  const study = memberValuesFromRows(parameters.map(predict))
  return { parameters, result: profile(study, measurement, { kind: 'hessian-pairs', tolerance: T, clPercent: 90 }) }
}

describe('Hessian profiling', () => {
  // Check: on a linear model with a Gaussian prior, profiling is the Bayesian update. The
  // closed-form posterior is C. M. Bishop, "Pattern Recognition and Machine Learning" (2006),
  // §2.3.3: Σ_post = (Σ⁻¹ + AᵀC⁻¹A)⁻¹, μ_post = Σ_post AᵀC⁻¹(D − c). The profiled set's central
  // member is μ_post, and its pairs, at Δχ² = T², give Σ_post = Σ_j δp_j δp_jᵀ / T² with
  // δp_j = ½(p_j⁺ − p_j⁻) (H. Paukkunen and P. Zurita, arXiv:1402.6623).
  it('equals the closed-form Gaussian posterior on a linear toy, to 1e-10', () => {
    const { parameters, result } = toyProfile()
    const members = profiledMembers(parameters, 'hessian-pairs', result)
    const { mean, covariance } = posterior()
    expectClose(members[0]!, mean, 1e-10, 1e-12)
    const cov = [[0, 0, 0], [0, 0, 0], [0, 0, 0]]
    for (let j = 0; j < 3; j++) {
      const plus = members[2 * j + 1]!
      const minus = members[2 * j + 2]!
      for (let a = 0; a < 3; a++) for (let b = 0; b < 3; b++) cov[a]![b] = cov[a]![b]! + 0.25 * (plus[a]! - minus[a]!) * (plus[b]! - minus[b]!) / (T * T)
    }
    for (let a = 0; a < 3; a++) expectClose(cov[a]!, covariance[a]!, 1e-10, 1e-12)
    // The prediction after is c + A μ_post.
    expectClose(result.predictionAfter, predict(mean), 1e-10)
  })

  it('reports χ² before and after, the penalty being the prior term μᵀΣ⁻¹μ', () => {
    const { result } = toyProfile()
    const { mean } = posterior()
    // Before: z = 0, the prediction is c; χ² = (D − c)ᵀC⁻¹(D − c), computed here with an explicit
    // inverse (an independent path from the engine's Cholesky).
    const r0 = DATA.map((d, i) => d - predict([0, 0, 0])[i]!)
    const rAfter = DATA.map((d, i) => d - predict(mean)[i]!)
    const quad = (r: number[]) => {
      const inv = invert4(DATA_COVARIANCE.to2DArray())
      return r.reduce((s, ri, i) => s + ri * r.reduce((t, rj, j) => t + inv[i]![j]! * rj, 0), 0)
    }
    expectClose(result.chi2Before, quad(r0), 1e-12)
    expectClose(result.chi2After.data, quad(rAfter), 1e-10)
    expect(result.chi2After.total).toBeLessThan(result.chi2Before)
    expectClose(result.chi2After.total, result.chi2After.data + result.chi2After.penalty, 1e-14)
    expect(result.iterations).toBe(0)
    expect(result.shifts).toHaveLength(3)
    // The band shrinks in every bin (data add information).
    for (let b = 0; b < 4; b++) expect(result.bandAfter.plus[b]!).toBeLessThan(result.bandBefore.plus[b]!)
  })

  it('leaves the set as it was when the data carry no information (huge errors)', () => {
    const parameters = hessianParameterMembers(1)
    const study = memberValuesFromRows(parameters.map(predict))
    const loose = { values: DATA, stat: [1e8, 1e8, 1e8, 1e8] }
    const result = profile(study, loose, { kind: 'hessian-pairs', tolerance: 1 })
    for (const z of result.shifts) expect(Math.abs(z)).toBeLessThan(1e-12)
    expectClose(result.bandAfter.plus, result.bandBefore.plus, 1e-9)
  })

  it('with asymmetric pairs, minimises the quadratic model: zero gradient at the shift', () => {
    // One eigenvector, V(z) = 10 + 2z + ½z² (members V⁺ = 12.5, V⁻ = 8.5, arXiv:1806.07950's
    // quadratic form), one point D = 13 ± 0.5, T = 1. χ²(z) = (3 − 2z − ½z²)²/0.25 + z²;
    // dχ²/dz = −8(3 − 2z − ½z²)(2 + z) + 2z vanishes at the minimum (calculus).
    const m = memberValuesFromRows([[10], [12.5], [8.5]])
    const result = profile(m, { values: [13], stat: [0.5] }, { kind: 'hessian-pairs', tolerance: 1, asymmetric: true })
    const z = result.shifts[0]!
    expect(Math.abs(-8 * (3 - 2 * z - 0.5 * z * z) * (2 + z) + 2 * z)).toBeLessThan(1e-8)
    expect(result.iterations).toBeGreaterThan(0)
    expectClose(result.predictionAfter[0]!, 10 + 2 * z + 0.5 * z * z, 1e-14)
    // The linear model would stop at (AᵀC⁻¹A + T²)z = AᵀC⁻¹r: (16 + 1)z = 4·2·3 → z = 24/17.
    const linear = profile(m, { values: [13], stat: [0.5] }, { kind: 'hessian-pairs', tolerance: 1 })
    expectClose(linear.shifts[0]!, 24 / 17, 1e-13)
    expect(Math.abs(z - 24 / 17)).toBeGreaterThan(1e-3)
  })

  it('models members exactly at z = ±1 (pairs, asymmetric) and z = e_k (one-sided)', () => {
    const members = [[10, 1], [12.5, 2], [8.5, 0.5], [10.2, 1.1], [9.9, 0.8]]
    const model = eigenvectorModel(members, 'hessian-pairs', true)
    expectClose(evaluateModel(model, [1, 0]), members[1]!, 1e-15)
    expectClose(evaluateModel(model, [-1, 0]), members[2]!, 1e-15)
    expectClose(evaluateModel(model, [0, -1]), members[4]!, 1e-15)
    const oneSided = eigenvectorModel(members, 'hessian-one-sided')
    expectClose(evaluateModel(oneSided, [0, 0, 1, 0]), members[3]!, 1e-15)
  })

  it('builds a profiled set file on the parent\'s grid with provenance', () => {
    const parent = parseSetFile(readFileSync('samples/sets/toy-hessian.sheafset'))
    const rows = parent.members.map(m => [m[10]!, m[200]!])
    const result = profile(memberValuesFromRows(rows), { values: [rows[0]![0]! * 1.05, rows[0]![1]!], stat: [0.01 * rows[0]![0]!, 0.02 * Math.abs(rows[0]![1]!) + 1e-3] }, { kind: 'hessian-pairs', tolerance: 1 })
    const set = profiledSet(parent, result, { name: 'toy-profiled', provenance: 'Profiled with test data.' })
    expect(set.header.kind).toBe('hessian-pairs')
    expect(set.header.memberCount).toBe(set.members.length)
    expect(set.header.provenance).toContain(`Parent set: ${parent.header.name}`)
    // The profiled set's central member at the two sampled grid values is the profiled prediction.
    expectClose([set.members[0]![10]!, set.members[0]![200]!], result.predictionAfter, 1e-12)
  })

  it.each([
    [{ kind: 'hessian-pairs' as const, tolerance: 0 }, /tolerance T must be a finite number > 0; got 0/],
    [{ kind: 'hessian-one-sided' as const, tolerance: 1, asymmetric: true }, /Asymmetric \(quadratic\) profiling needs eigenvector pairs/]
  ])('refuses %j', (options, message) => {
    const m = memberValuesFromRows([[10], [12.5], [8.5]])
    expect(() => profile(m, { values: [13], stat: [0.5] }, options)).toThrow(message)
  })

  it('refuses data of another length', () => {
    const m = memberValuesFromRows([[10, 1], [12.5, 1], [8.5, 1]])
    expect(() => profile(m, { values: [13], stat: [0.5] }, { kind: 'hessian-pairs', tolerance: 1 })).toThrow(/2 bins but the measurement has 1 points/)
  })
})

/** Inverse of a small matrix by Gauss–Jordan elimination (textbook; Burden and Faires §6.1). */
function invert4(m: number[][]): number[][] {
  const n = m.length
  const a = m.map((row, i) => [...row, ...Array.from({ length: n }, (_, j) => (i === j ? 1 : 0))])
  for (let c = 0; c < n; c++) {
    let p = c
    for (let r = c + 1; r < n; r++) if (Math.abs(a[r]![c]!) > Math.abs(a[p]![c]!)) p = r;
    [a[c], a[p]] = [a[p]!, a[c]!]
    const pivot = a[c]![c]!
    for (let j = 0; j < 2 * n; j++) a[c]![j] = a[c]![j]! / pivot
    for (let r = 0; r < n; r++) {
      if (r === c) continue
      const f = a[r]![c]!
      for (let j = 0; j < 2 * n; j++) a[r]![j] = a[r]![j]! - f * a[c]![j]!
    }
  }
  return a.map(row => row.slice(n))
}
