import jStat from 'jstat'
import { describe, expect, it } from 'vitest'
import { ccStructureFunction, f2NeutralCurrent } from '../../../../shared/physics/kernels'
import type { XfFunction } from '../../../../shared/physics/kernels'
import { integrateGaussLegendre } from '../../../../shared/physics/quadrature'

// Quark-parton-model sum rules (PDG 2024 review "Structure functions", section on sum rules;
// see shared/physics/README.md, "DIS sum rules"):
// Gross–Llewellyn Smith ∫ ½ (F₃^{νN} + F₃^{ν̄N}) dx = 3 for an isoscalar N;
// Adler ∫ dx/x (F₂^{ν̄p} − F₂^{νp}) = 2 (equivalently ∫ dx/x (F₂^{νn} − F₂^{νp}) = 2);
// Gottfried ∫ dx/x (F₂^{μp} − F₂^{μn}) = 1/3 + (2/3) ∫ (ū − d̄) dx.
// The toy densities are analytic: valence normalised with jstat's Beta function to ∫ u_v = 2,
// ∫ d_v = 1, and a d̄ − ū asymmetry whose integral is 0.05 B(0.5, 7).

const B = (a: number, b: number) => jStat.betafn(a, b)
const Au = 2 / B(0.8, 4)
const Ad = 1 / B(0.8, 5)
function toyXf(pdg: number, x: number): number {
  const ubar = 0.1 * x ** -0.1 * (1 - x) ** 7
  const dbarMinusUbar = 0.05 * x ** 0.5 * (1 - x) ** 6
  switch (pdg) {
    case 2: return Au * x ** 0.8 * (1 - x) ** 3 + ubar
    case 1: return Ad * x ** 0.8 * (1 - x) ** 4 + ubar + dbarMinusUbar
    case -2: return ubar
    case -1: return ubar + dbarMinusUbar
    case 3: case -3: return 0.05 * x ** -0.1 * (1 - x) ** 8
    case 4: case -4: return 0.02 * x ** -0.1 * (1 - x) ** 9
    case 5: case -5: return 0.01 * x ** -0.1 * (1 - x) ** 9
    case 21: return 2 * x ** -0.1 * (1 - x) ** 5
    default: return 0
  }
}
const xf: XfFunction = (pdg, x) => toyXf(pdg, x)

/** ∫_0^1 g(x) dx for g integrable like x^−0.5 at 0: x = t¹⁰, 80-point Gauss–Legendre in t. */
function integrate01(g: (x: number) => number): number {
  return integrateGaussLegendre(t => (t === 0 ? 0 : g(t ** 10) * 10 * t ** 9), 0, 1, 80)
}

describe('charged-current and neutral-current sum rules on an analytic toy', () => {
  it('Gross–Llewellyn Smith = 3 (CKM diagonal: exact)', () => {
    const gls = integrate01(x => 0.5 * (ccStructureFunction(xf, 'xF3', x, 10, { beam: 'neutrino', target: { type: 'isoscalar' }, ckm: 'diagonal' })
      + ccStructureFunction(xf, 'xF3', x, 10, { beam: 'antineutrino', target: { type: 'isoscalar' }, ckm: 'diagonal' })) / x)
    expect(gls).toBeCloseTo(3, 8)
  })

  it('Gross–Llewellyn Smith ≈ 3 with PDG CKM (off by the |V_td|² the top takes, ~1e-4)', () => {
    const gls = integrate01(x => 0.5 * (ccStructureFunction(xf, 'xF3', x, 10, { beam: 'neutrino', target: { type: 'isoscalar' } })
      + ccStructureFunction(xf, 'xF3', x, 10, { beam: 'antineutrino', target: { type: 'isoscalar' } })) / x)
    expect(Math.abs(gls - 3)).toBeLessThan(3e-4)
  })

  it.each([
    ['ν̄p − νp', () => integrate01(x => (ccStructureFunction(xf, 'F2', x, 10, { beam: 'antineutrino', ckm: 'diagonal' }) - ccStructureFunction(xf, 'F2', x, 10, { beam: 'neutrino', ckm: 'diagonal' })) / x)],
    ['νn − νp', () => integrate01(x => (ccStructureFunction(xf, 'F2', x, 10, { beam: 'neutrino', target: { type: 'neutron' }, ckm: 'diagonal' }) - ccStructureFunction(xf, 'F2', x, 10, { beam: 'neutrino', ckm: 'diagonal' })) / x)]
  ])('Adler = 2 (%s)', (_n, compute) => {
    expect(compute()).toBeCloseTo(2, 8)
  })

  it('Gottfried = 1/3 + (2/3) ∫ (ū − d̄) = 1/3 − (2/3) · 0.05 B(0.5, 7)', () => {
    const expected = 1 / 3 - (2 / 3) * 0.05 * B(0.5, 7)
    const gottfried = integrate01(x => (f2NeutralCurrent(xf, x, 10) - f2NeutralCurrent(xf, x, 10, { type: 'neutron' })) / x)
    expect(gottfried).toBeCloseTo(expected, 8)
    expect(expected).toBeLessThan(1 / 3) // a d̄ excess lowers it, as measured (common practice: NMC)
  })

  it('the toy itself has the valence numbers it claims (checks the integrator)', () => {
    expect(integrate01(x => (toyXf(2, x) - toyXf(-2, x)) / x)).toBeCloseTo(2, 9)
    expect(integrate01(x => (toyXf(1, x) - toyXf(-1, x)) / x)).toBeCloseTo(1, 9)
  })
})
