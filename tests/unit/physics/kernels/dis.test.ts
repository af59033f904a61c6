import { describe, expect, it } from 'vitest'
import {
  ccCrossSectionTerm, ccStructureFunction, d2SigmaDxDQ2NeutralCurrent, d2SigmaDxDyChargedCurrent, f2NeutralCurrent,
  flNeutralCurrent, ncTerm, twoXF1NeutralCurrent
} from '../../../../shared/physics/kernels'
import type { Hadron, XfFunction } from '../../../../shared/physics/kernels'

// Formulas: PDG 2024 review "Structure functions" (LO parton model); see
// shared/physics/README.md, "DIS neutral current" and "DIS charged current".
// The toy densities are constants chosen for easy arithmetic; each expected value is worked by
// hand in the comment beside it.

const toy: Record<number, number> = { 2: 0.3, [-2]: 0.1, 1: 0.2, [-1]: 0.12, 3: 0.05, [-3]: 0.05, 4: 0.02, [-4]: 0.02, 5: 0.01, [-5]: 0.01, 21: 1 }
const xf: XfFunction = pdg => toy[pdg] ?? 0

describe('DIS neutral current (photon exchange)', () => {
  it.each([
    // F₂^p = 4/9 (0.3 + 0.1) + 1/9 (0.2 + 0.12) + 1/9 (0.05 + 0.05) + 4/9 (0.02 + 0.02) + 1/9 (0.01 + 0.01) = 2.20/9
    ['proton', { type: 'proton' }, 2.20 / 9],
    // neutron (u ↔ d, ū ↔ d̄): 4/9 (0.2 + 0.12) + 1/9 (0.3 + 0.1) + 1/9 (0.10) + 4/9 (0.04) + 1/9 (0.02) = 1.96/9
    ['neutron', { type: 'neutron' }, 1.96 / 9],
    // isoscalar = ½ (p + n) = 4.16/18
    ['isoscalar', { type: 'isoscalar' }, 4.16 / 18],
    // gold, Z = 79, A = 197: (79 · 2.20 + 118 · 1.96)/(197 · 9) = 405.08/1773
    ['nucleus Au (79, 197)', { type: 'nucleus', z: 79, a: 197 }, 405.08 / 1773]
  ])('F₂ of the toy on a %s', (_n, target, expected) => {
    expect(f2NeutralCurrent(xf, 0.1, 10, target as Hadron)).toBeCloseTo(expected as number, 14)
  })

  it('Callan–Gross: 2xF₁ = F₂ and F_L = 0 at LO', () => {
    expect(twoXF1NeutralCurrent(xf, 0.05, 30)).toBe(f2NeutralCurrent(xf, 0.05, 30))
    expect(flNeutralCurrent(xf, 0.05, 30)).toBe(0)
  })

  it('hand-worked d²σ/dx dQ² at x = 0.01, Q² = 100 GeV², √s = 300 GeV', () => {
    // y = Q²/(x s) = 100/(0.01 · 90000) = 0.11111; Y₊ = 1 + 0.88889² = 1.790123
    // 2πα²/(x Q⁴) = 2π (1/137.035999)² / (0.01 · 10⁴ GeV⁴) = 3.345881e-6 GeV⁻⁴
    // × Y₊ (1.790123) × F₂ (2.20/9) × (ħc)² (3.893794e8 pb GeV²) = 570.094 pb/GeV²
    expect(d2SigmaDxDQ2NeutralCurrent(xf, 0.01, 100, { sqrtSGeV: 300 })).toBeCloseTo(570.094, 2)
    expect(d2SigmaDxDQ2NeutralCurrent(xf, 0.01, 100, { sqrtSGeV: 300, unit: 'nb' })).toBeCloseTo(0.570094, 5)
  })

  it('the reduced cross-section equals F₂ at LO (F_L = 0)', () => {
    const t = ncTerm('reduced', 0.01, 100, { sqrtSGeV: 300 })
    expect(t.factor).toBe(1)
  })

  it.each([
    ['y > 1 beyond the kinematic limit', () => ncTerm('d2sigma', 1e-4, 100, { sqrtSGeV: 300 }), 'kinematic limit'],
    ['no √s for the cross-section', () => ncTerm('d2sigma', 0.01, 100), 'sqrtSGeV'],
    ['x ≥ 1', () => ncTerm('F2', 1, 100), 'x = 1'],
    ['Q² ≤ 0', () => ncTerm('F2', 0.1, 0), 'Q² = 0']
  ])('RangeError: %s', (_n, f, text) => {
    expect(f).toThrow(RangeError)
    expect(f).toThrow(text)
  })
})

describe('DIS charged current (ν, ν̄)', () => {
  it.each([
    // CKM-diagonal (PDG "Structure functions"): F₂^{νp} = 2x(d + s + ū + c̄) = 2 (0.2 + 0.05 + 0.1 + 0.02) = 0.74
    ['F2', 'neutrino', 0.74],
    // xF₃^{νp} = 2x(d + s − ū − c̄) = 2 (0.25 − 0.12) = 0.26
    ['xF3', 'neutrino', 0.26],
    // F₂^{ν̄p} = 2x(u + c + d̄ + s̄) = 2 (0.3 + 0.02 + 0.12 + 0.05) = 0.98
    ['F2', 'antineutrino', 0.98],
    // xF₃^{ν̄p} = 2x(u + c − d̄ − s̄) = 2 (0.32 − 0.17) = 0.30
    ['xF3', 'antineutrino', 0.30],
    ['2xF1', 'neutrino', 0.74]
  ])('%s of the toy proton for %s (CKM diagonal)', (structure, beam, expected) => {
    expect(ccStructureFunction(xf, structure as 'F2', 0.1, 10, { beam: beam as 'neutrino', ckm: 'diagonal' })).toBeCloseTo(expected as number, 14)
  })

  it('with PDG CKM magnitudes, F₂^{νp} keeps d and s at the unitary weight 2(|V_ud|² + |V_cd|²) and adds b', () => {
    // weights: d 2(0.97435² + 0.22487²) = 1.999850, s 2(0.22501² + 0.97349²) = 1.996626,
    // b 2(0.003732² + 0.04183²) = 0.003527, ū 2·(row u) = 2.000003, c̄ 2·(row c) = 1.999998
    // F₂ = 0.2·1.999850 + 0.05·1.996626 + 0.01·0.003527 + 0.1·2.000003 + 0.02·1.999998 = 0.739836
    expect(ccStructureFunction(xf, 'F2', 0.1, 10, { beam: 'neutrino' })).toBeCloseTo(0.739836, 5)
  })

  it('neutron by isospin: F₂^{νn} = 2x(u + s + d̄ + c̄) = 2 (0.3 + 0.05 + 0.12 + 0.02) = 0.98', () => {
    expect(ccStructureFunction(xf, 'F2', 0.1, 10, { beam: 'neutrino', ckm: 'diagonal', target: { type: 'neutron' } })).toBeCloseTo(0.98, 14)
  })

  it('a nucleus is the Z/A, (A − Z)/A mix of proton and neutron (iron, Z = 26, A = 56)', () => {
    const p = ccStructureFunction(xf, 'xF3', 0.1, 10, { beam: 'neutrino' })
    const n = ccStructureFunction(xf, 'xF3', 0.1, 10, { beam: 'neutrino', target: { type: 'neutron' } })
    const fe = ccStructureFunction(xf, 'xF3', 0.1, 10, { beam: 'neutrino', target: { type: 'nucleus', z: 26, a: 56 } })
    expect(fe).toBeCloseTo((26 * p + 30 * n) / 56, 14)
  })

  it('hand-worked d²σ/dx dy for ν p at E = 100 GeV, x = 0.2, y = 0.5 (CKM diagonal)', () => {
    // Q² = 2 M E x y = 2 · 0.938272 · 100 · 0.1 = 18.76544 GeV²; propagator (M_W²/(M_W² + Q²))² = 0.994215
    // G_F² M E/π = (1.1663788e-5)² · 0.938272 · 100/π = 4.063106e-9 GeV⁻²; × (ħc)² = 1.582089 pb; × 0.994215 = 1.572937 pb
    // bracket = F₂ (y²/2 + 1 − y − xyM/(2E)) + y(1 − y/2) xF₃ = 0.74 · 0.624531 + 0.375 · 0.26 = 0.559653
    // d²σ/dx dy = 1.572937 · 0.559653 = 0.880299 pb
    expect(d2SigmaDxDyChargedCurrent(xf, 0.2, 0.5, { beam: 'neutrino', beamEnergyGeV: 100, ckm: 'diagonal' })).toBeCloseTo(0.880299, 5)
    expect(ccCrossSectionTerm(0.2, 0.5, { beam: 'neutrino', beamEnergyGeV: 100 }).mu2GeV2).toBeCloseTo(18.76544, 4)
  })
})
