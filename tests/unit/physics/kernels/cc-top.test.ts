import { describe, expect, it } from 'vitest'
import { ccStructureFunction, kernelDefinition } from '../../../../shared/physics/kernels'
import type { KernelDefinition, XfFunction } from '../../../../shared/physics/kernels'
import { evaluateTerm } from '../../../../shared/physics/kernels/terms'
import type { FlavourScheme } from '../../../../shared/physics/types'

// Charged-current DIS treats heavy flavours like neutral-current DIS and Drell–Yan: every quark
// the set carries is a massless parton (PDG 2024 review "Structure functions", quark-parton
// model; shared/physics/README.md, "DIS charged current"). A six-flavour set above m_t² carries
// t and t̄, so they are struck (ν t̄ → ℓ⁻ b̄, ν̄ t → ℓ⁺ b) and b → t production opens.
// Toy constant densities with a top; each value worked by hand beside it (CKM diagonal).
const toy: Record<number, number> = { 2: 0.3, [-2]: 0.1, 1: 0.2, [-1]: 0.12, 3: 0.05, [-3]: 0.05, 4: 0.02, [-4]: 0.02, 5: 0.01, [-5]: 0.01, 6: 0.004, [-6]: 0.004, 21: 1 }
const xf: XfFunction = pdg => toy[pdg] ?? 0
const six: FlavourScheme = { type: 'variable', nf: 6, massesGeV: { charm: 1.51, bottom: 4.92, top: 172.5 } }
const five: FlavourScheme = { ...six, nf: 5 }

function viaRegistry(id: string, options: Record<string, unknown>, scheme: FlavourScheme, q2: number): number {
  const def = kernelDefinition(id) as KernelDefinition
  return evaluateTerm(def.prepare(options, { scheme })({ x: 0.1, q2 }), xf)
}

describe('charged-current DIS with a top density', () => {
  it('t̄ is struck by a neutrino and t by an antineutrino wherever the set has them', () => {
    // F₂^{νp} = 2x(d + s + ū + c̄ + t̄) = 2 (0.2 + 0.05 + 0.1 + 0.02 + 0.004) = 0.748 (b has no
    // partner without top production in the diagonal CKM)
    expect(ccStructureFunction(xf, 'F2', 0.1, 1e5, { beam: 'neutrino', ckm: 'diagonal' })).toBeCloseTo(0.748, 14)
    // F₂^{ν̄p} = 2x(u + c + t + d̄ + s̄) = 2 (0.3 + 0.02 + 0.004 + 0.12 + 0.05) = 0.988
    expect(ccStructureFunction(xf, 'F2', 0.1, 1e5, { beam: 'antineutrino', ckm: 'diagonal' })).toBeCloseTo(0.988, 14)
  })

  it('above m_t² of a six-flavour set b → t opens; below it, or with five flavours, it stays shut', () => {
    // Q² = 10⁵ GeV² > m_t² = 29756 GeV², six flavours: + 2x b = 0.02 → F₂^{νp} = 0.768
    expect(viaRegistry('dis-cc-f2', { beam: 'neutrino', ckm: 'diagonal' }, six, 1e5)).toBeCloseTo(0.768, 14)
    // ν̄: + 2x b̄ = 0.02 → 1.008
    expect(viaRegistry('dis-cc-f2', { beam: 'antineutrino', ckm: 'diagonal' }, six, 1e5)).toBeCloseTo(1.008, 14)
    // Q² = 10⁴ GeV² < m_t²: no top production (a real set has no top density there either)
    expect(viaRegistry('dis-cc-f2', { beam: 'neutrino', ckm: 'diagonal' }, six, 1e4)).toBeCloseTo(0.748, 14)
    // five flavours: shut at any Q²
    expect(viaRegistry('dis-cc-f2', { beam: 'neutrino', ckm: 'diagonal' }, five, 1e5)).toBeCloseTo(0.748, 14)
  })

  it('with PDG CKM magnitudes, top production adds 2x Σ_j |V_tj|² d_j', () => {
    // |V_td| 0.00858, |V_ts| 0.04111, |V_tb| 0.999118 (PDG 2024 "CKM quark-mixing matrix", from
    // memory): 2 (0.2 · 7.3616e-5 + 0.05 · 1.69003e-3 + 0.01 · 0.998237) = 2 · 0.0100816 = 0.0201632
    const open = viaRegistry('dis-cc-f2', { beam: 'neutrino' }, six, 1e5)
    const shut = viaRegistry('dis-cc-f2', { beam: 'neutrino' }, six, 1e4)
    expect(open - shut).toBeCloseTo(0.0201632, 6)
  })
})
