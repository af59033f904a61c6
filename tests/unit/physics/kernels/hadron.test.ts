import { describe, expect, it } from 'vitest'
import {
  combineByMember, d2SigmaDMDyDrellYan, dSigmaDyHiggs, dSigmaDyVectorBoson, evaluateTerm, integrateOverRapidity,
  luminosityTerm, vectorBosonTerm
} from '../../../../shared/physics/kernels'
import type { XfFunction } from '../../../../shared/physics/kernels'
import { expectClose } from '../close'

// Formulas: Ellis–Stirling–Webber, "QCD and Collider Physics", ch. 9 (Drell–Yan, W/Z narrow
// width), gg → H in the heavy-top limit and parton luminosities as stated in
// shared/physics/README.md, "Kernels". Toy densities are constants or powers chosen so each number can be worked by
// hand; the arithmetic is in the comments.

const flat = (c: number): XfFunction => pdg => (Math.abs(pdg) >= 1 && Math.abs(pdg) <= 5 ? c : 0)

describe('Drell–Yan γ*', () => {
  it('hand-worked d²σ/dM dy at M = 10 GeV, y = 0, √s = 1 TeV with every x·q = x·q̄ = 0.5', () => {
    // 8πα²/(9M³) = 8π (1/137.035999)² / 9000 = 1.487034e-7 GeV⁻³; × (ħc)² = 57.90298 pb/GeV
    // Σ_q e_q² [x₁q x₂q̄ + x₁q̄ x₂q] = (4/9 + 1/9 + 1/9 + 4/9 + 1/9) · 2 · 0.25 = 11/18
    // d²σ/dM dy = 57.90298 · 11/18 = 35.38516 pb/GeV
    expect(d2SigmaDMDyDrellYan(flat(0.5), 10, 0, { sqrtSGeV: 1000 })).toBeCloseTo(35.38516, 4)
  })

  it('is symmetric in y for pp and refuses points beyond the kinematic limit', () => {
    const xf: XfFunction = (pdg, x) => (pdg > 0 ? 0.6 * (1 - x) ** 3 : 0.2 * (1 - x) ** 7) * (pdg === 2 ? 2 : 1)
    expect(d2SigmaDMDyDrellYan(xf, 30, 1.3, { sqrtSGeV: 7000 })).toBeCloseTo(d2SigmaDMDyDrellYan(xf, 30, -1.3, { sqrtSGeV: 7000 }), 12)
    expect(() => d2SigmaDMDyDrellYan(xf, 100, 5, { sqrtSGeV: 1000 })).toThrow('kinematic limit')
  })
})

describe('W and Z production (narrow width)', () => {
  it('hand-worked dσ/dy(W⁺) at y = 0 with every x·q = 0.5 and a diagonal CKM', () => {
    // √2 π G_F/3 = 1.480961 · 1.1663788e-5 = 1.727361e-5 GeV⁻²; × (ħc)² = 6725.989 pb
    // pairs u d̄, d̄ u, c s̄, s̄ c each 0.5 · 0.5: Σ = 1; dσ/dy = 6725.989 pb
    expect(dSigmaDyVectorBoson(flat(0.5), 'W+', 0, { sqrtSGeV: 13000, ckm: 'diagonal' })).toBeCloseTo(6725.989, 2)
    // With PDG CKM the rows u and c sum to 1.0000014 and 0.9999990: the same to 1e-5.
    expectClose(dSigmaDyVectorBoson(flat(0.5), 'W+', 0, { sqrtSGeV: 13000 }), 6725.989, 1e-5)
  })

  it('hand-worked dσ/dy(Z) at y = 0 with every x·q = 0.5', () => {
    // g_V² + g_A²: up (½ − 4/3 · 0.23153)² + ¼ = 0.2865931, down (−½ + 2/3 · 0.23153)² + ¼ = 0.3694716
    // Σ = 2 · 0.25 · (2 · 0.2865931 + 3 · 0.3694716) = 0.8408006; × 6725.989 pb = 5655.216 pb
    expect(dSigmaDyVectorBoson(flat(0.5), 'Z', 0, { sqrtSGeV: 13000 })).toBeCloseTo(5655.216, 2)
  })

  it('x₁ = x₂ = M/√s at y = 0 and μ_F² = M²', () => {
    const t = vectorBosonTerm('Z', 0, { sqrtSGeV: 13000 })
    expect(t.x1).toBeCloseTo(91.188 / 13000, 15)
    expect(t.mu2GeV2).toBeCloseTo(91.188 ** 2, 9)
  })

  it('charge conjugation: W⁺ in p p̄ at y equals W⁻ at −y', () => {
    const table: Record<number, number> = { 2: 0.7, 1: 0.35, [-2]: 0.1, [-1]: 0.14, 3: 0.05, [-3]: 0.05 }
    const xf: XfFunction = pdg => table[pdg] ?? 0
    const opts = { sqrtSGeV: 1960, beam2: { type: 'antiproton' as const } }
    expect(dSigmaDyVectorBoson(xf, 'W+', 0.8, opts)).toBeCloseTo(dSigmaDyVectorBoson(xf, 'W-', -0.8, opts), 10)
  })
})

describe('gg → H (heavy-top limit)', () => {
  it('hand-worked dσ/dy at y = 0 with x·g = 2 and α_s(M_H) = 0.112', () => {
    // σ₀ = G_F α_s²/(288√2 π) = 1.1663788e-5 · 0.012544 / 1279.6 = 1.143453e-10 GeV⁻²
    // dσ/dy = σ₀ · 2 · 2 · (ħc)² = 0.178095 pb
    const xf: XfFunction = pdg => (pdg === 21 ? 2 : 0)
    expect(dSigmaDyHiggs(xf, 0, { sqrtSGeV: 13000, alphas: () => 0.112 })).toBeCloseTo(0.178095, 5)
  })

  it('asks the α_s function for μ_R² = M_H² and refuses a bad value', () => {
    const asked: number[] = []
    dSigmaDyHiggs(() => 1, 0, { sqrtSGeV: 13000, alphas: (q2) => { asked.push(q2); return 0.11 } })
    expect(asked[0]).toBeCloseTo(125.2 ** 2, 9)
    expect(() => dSigmaDyHiggs(() => 1, 0, { sqrtSGeV: 13000, alphas: () => Number.NaN })).toThrow('α_s(M_H²)')
  })
})

describe('parton luminosities', () => {
  it('gg with x·g = A x^p: dL/dτ = A² τ^{p−1} ln(1/τ) (g(x)g(τ/x) is then constant in x)', () => {
    const A = 1.3
    const p = 0.3
    const xf: XfFunction = (pdg, x) => (pdg === 21 ? A * x ** p : 0)
    const sqrtS = 13000
    const m = 500
    const tau = (m / sqrtS) ** 2
    const Y = 0.5 * Math.log(1 / tau)
    const value = integrateOverRapidity(y => luminosityTerm('gg', m, y, { sqrtSGeV: sqrtS }), -Y, Y, 16, xf)
    expect(value / (A * A * tau ** (p - 1) * Math.log(1 / tau)) - 1).toBeCloseTo(0, 12)
  })

  it.each([
    // qq̄ summed over d, u, s, c, b with every x·f = c: (1/τ) · 5 flavours · 2 orderings · c² · 2Y
    ['qqbar', 10],
    // qg over the 10 quarks and antiquarks × 2 orderings: 20 c c_g · 2Y/τ (c_g = c here)
    ['qg', 20]
  ])('%s with flat densities counts its channels: %i per unit c² · 2Y/τ', (channel, count) => {
    const c = 0.4
    const xf: XfFunction = pdg => (pdg === 21 || (Math.abs(pdg) >= 1 && Math.abs(pdg) <= 5) ? c : 0)
    const tau = (200 / 8000) ** 2
    const Y = 0.5 * Math.log(1 / tau)
    const value = integrateOverRapidity(y => luminosityTerm(channel as 'qg', 200, y, { sqrtSGeV: 8000 }), -Y, Y, 8, xf)
    expect(value).toBeCloseTo((count as number) * c * c * 2 * Y / tau, 6)
  })
})

describe('ratios and asymmetries member by member', () => {
  it('combine each member with its partner, not the bands', () => {
    // members × bins = 2 × 2: W⁺ = [[3, 4], [3.3, 4.4]], W⁻ = [[2, 2], [1.9, 2.1]]
    const wp = Float64Array.of(3, 4, 3.3, 4.4)
    const wm = Float64Array.of(2, 2, 1.9, 2.1)
    const ratio = combineByMember(wp, wm, 2, 'ratio')
    const asym = combineByMember(wp, wm, 2, 'asymmetry')
    ;[1.5, 2, 3.3 / 1.9, 4.4 / 2.1].forEach((v, i) => expect(ratio[i]).toBeCloseTo(v, 15))
    ;[0.2, 1 / 3, 1.4 / 5.2, 2.3 / 6.5].forEach((v, i) => expect(asym[i]).toBeCloseTo(v, 15))
  })

  it('broadcast a single member (a fixed baseline) and refuse mismatched counts or a zero denominator', () => {
    expect(Array.from(combineByMember(Float64Array.of(2, 4, 6, 8), Float64Array.of(2, 4), 2, 'ratio'))).toEqual([1, 1, 3, 2])
    expect(() => combineByMember(Float64Array.of(1, 2, 3, 4, 5, 6), Float64Array.of(1, 2, 3, 4), 2, 'ratio')).toThrow('3 members with 2')
    expect(() => combineByMember(Float64Array.of(1), Float64Array.of(0), 1, 'ratio')).toThrow('member 0, bin 1')
  })

  it('evaluateTerm of a bilinear term with two different beams uses xf2 for beam 2', () => {
    const t = vectorBosonTerm('W+', 0, { sqrtSGeV: 13000, ckm: 'diagonal' })
    const one: XfFunction = pdg => (pdg === 2 ? 1 : 0)
    const two: XfFunction = pdg => (pdg === -1 ? 1 : 0)
    // Only u (beam 1) × d̄ (beam 2) survives: factor · 1.
    expect(evaluateTerm(t, one, two)).toBeCloseTo(t.factor, 6)
  })
})
