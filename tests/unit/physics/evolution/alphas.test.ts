import { describe, expect, it } from 'vitest'
import {
  activeFlavours, alphasOneLoop, betaZero, evolutionTime, flavourThresholdsGeV2, makeAlphas
} from '~/shared/physics/alphas'
import { MZ_GEV } from '~/shared/physics/constants'
import type { FlavourScheme } from '~/shared/physics/types'
import { expectClose } from '../close'

const masses = { charm: 1.4, bottom: 4.75, top: 172.5 }
const vfns: FlavourScheme = { type: 'variable', nf: 6, massesGeV: masses }
const fixed = (nf: 3 | 4 | 5 | 6): FlavourScheme => ({ type: 'fixed', nf, massesGeV: masses })

// Ellis–Stirling–Webber ch. 2; see shared/physics/README.md, "Running coupling"
describe('one-loop α_s (1/α_s(μ²) = 1/α_s(μ₀²) + (β₀/4π) ln(μ²/μ₀²), β₀ = 11 − 2n_f/3)', () => {
  it.each([
    // β₀ = 11 − 2n_f/3, Ellis–Stirling–Webber ch. 2
    [3, 9], [4, 25 / 3], [5, 23 / 3], [6, 7]
  ])('β₀(n_f = %i) = %f', (nf, expected) => {
    expectClose(betaZero(nf), expected, 1e-15)
  })

  it.each([
    // Hand-worked: n_f = 4, β₀/4π = (25/3)/(4π) = 0.6631456; ln(10⁴/2) = 8.5171932;
    // 1/α = 1/0.35 + 0.6631456 × 8.5171932 = 2.8571429 + 5.6481541 = 8.5052970 → α = 0.1175740.
    ['FFN n_f = 4, 0.35 at 2 GeV² → 10⁴ GeV²', 1e4, { value: 0.35, scaleGeV2: 2 }, fixed(4), 0.1175740],
    // Hand-worked, variable scheme from α_s(M_Z) = 0.118 (M_Z = 91.188 GeV) down to m_b² = 22.5625:
    // n_f = 5, β₀/4π = (23/3)/(4π) = 0.6100939; ln(8315.25/22.5625) = 5.9095574;
    // 1/α = 8.4745763 − 0.6100939 × 5.9095574 = 8.4745763 − 3.6053850 = 4.8691913 → α = 0.2053729.
    ['VFNS 0.118 at M_Z → m_b²', 4.75 ** 2, { value: 0.118, scaleGeV2: MZ_GEV ** 2 }, vfns, 0.2053729],
    // … then with n_f = 4 from m_b² to m_c² = 1.96: ln(22.5625/1.96) = 2.4433448;
    // 1/α = 4.8691913 − 0.6631456 × 2.4433448 = 4.8691913 − 1.6202926 = 3.2488987 → α = 0.3077967.
    ['VFNS 0.118 at M_Z → m_c²', 1.4 ** 2, { value: 0.118, scaleGeV2: MZ_GEV ** 2 }, vfns, 0.3077967],
    // … and upwards with n_f = 5 to m_t² then n_f = 6 (β₀/4π = 7/(4π) = 0.5570423) to 10⁶ GeV²:
    // 1/α(m_t²) = 8.4745763 + 0.6100939 × ln(29756.25/8315.25) = 8.4745763 + 0.6100939 × 1.2750 = 9.2524…,
    // 1/α(10⁶) = 9.2524 + 0.5570423 × ln(10⁶/29756.25) = 9.2524 + 0.5570423 × 3.5147 = 11.2103 → α = 0.0892040.
    ['VFNS 0.118 at M_Z → 10⁶ GeV²', 1e6, { value: 0.118, scaleGeV2: MZ_GEV ** 2 }, vfns, 0.0892040]
  ])('%s', (_label, q2, ref, scheme, expected) => {
    expectClose(alphasOneLoop(q2, ref, scheme), expected, 2e-7)
  })

  it('returns the reference value at the reference scale', () => {
    expectClose(alphasOneLoop(MZ_GEV ** 2, { value: 0.118, scaleGeV2: MZ_GEV ** 2 }, vfns), 0.118, 1e-15)
  })

  it.each(flavourThresholdsGeV2(vfns).map(t => [t]))('is continuous across the threshold μ² = %f GeV² while its slope changes', (t) => {
    const as = makeAlphas({ value: 0.118, scaleGeV2: MZ_GEV ** 2 }, vfns)
    // Across ±1e-7 in μ² the smooth running moves α_s by ~4e-8; a jump from the wrong n_f on one
    // side would be of order (β₀(n_f) − β₀(n_f+1)) ln(m_h²/μ_ref²)/4π ≈ 1e-2.
    const eps = 1e-7
    expectClose(as(t * (1 - eps)), as(t * (1 + eps)), 1e-6)
    // d(1/α)/d ln μ² = β₀/4π jumps by (2/3)/(4π) at each threshold (one more flavour).
    const h = 1e-4
    const slopeBelow = (1 / as(t) - 1 / as(t * Math.exp(-h))) / h
    const slopeAbove = (1 / as(t * Math.exp(h)) - 1 / as(t)) / h
    expectClose(slopeBelow - slopeAbove, 2 / 3 / (4 * Math.PI), 1e-6)
  })

  it.each([
    [1.0, 3], [1.96, 4], [10, 4], [22.5625, 5], [1e4, 5], [29756.25, 6], [1e8, 6]
  ])('counts the active flavours at μ² = %f GeV²: %i (variable scheme, heavy quark active from m_h²)', (q2, nf) => {
    expect(activeFlavours(q2, vfns)).toBe(nf)
  })

  it('keeps n_f fixed in a fixed scheme and caps the variable scheme at its nf', () => {
    expect(activeFlavours(1e8, fixed(4))).toBe(4)
    expect(activeFlavours(1e8, { ...vfns, nf: 5 })).toBe(5)
  })

  it('evolution time s = (2/β₀) ln(α₁/α₂): 0.35 → 0.1175740 with n_f = 4 gives 0.2618077', () => {
    // (2/(25/3)) × ln(0.35/0.1175740) = 0.24 × 1.0908653 = 0.2618077 (hand-worked)
    expectClose(evolutionTime(2, 1e4, { value: 0.35, scaleGeV2: 2 }, fixed(4)), 0.2618077, 1e-6)
  })

  it.each([
    ['μ² ≤ 0', () => alphasOneLoop(0, { value: 0.118, scaleGeV2: 8315 }, vfns), /finite μ² > 0/],
    ['below the Landau pole', () => alphasOneLoop(0.01, { value: 0.35, scaleGeV2: 2 }, fixed(3)), /Landau pole/],
    ['a reference α_s of 0', () => alphasOneLoop(10, { value: 0, scaleGeV2: 2 }, vfns), /reference α_s/],
    ['unordered masses', () => alphasOneLoop(10, { value: 0.3, scaleGeV2: 2 }, { ...vfns, massesGeV: { charm: 5, bottom: 4, top: 170 } }), /ordered/],
    ['a threshold inside an evolution-time range', () => evolutionTime(2, 100, { value: 0.35, scaleGeV2: 2 }, vfns), /fixed n_f/]
  ])('refuses %s with a RangeError', (_label, f, message) => {
    expect(f).toThrow(RangeError)
    expect(f).toThrow(message)
  })
})
