/**
 * Sum rules of a nucleus from a bound-proton grid (see shared/physics/README.md, "Nuclear
 * families"): the per-nucleon densities (Z/A) f^{p/A} + ((A − Z)/A) f^{n/A}, the bound neutron by
 * isospin, formed with the same composition the kernels use (kernels/hadrons.ts), then
 * integrated like any grid (sum-rules.ts). Per bound nucleon ∫(u − ū) = (2Z + N)/A,
 * ∫(d − d̄) = (Z + 2N)/A, ∫(s − s̄) = 0 and ∫ x Σ f = 1; for the whole nucleus the baryon number
 * A·∫(u_v + d_v + s_v)/3 = A and the charge A·∫(⅔u_v − ⅓d_v − ⅓s_v) = Z.
 */
import { composition } from '../kernels/hadrons'
import { EVOLVED_FLAVOURS, N_SLOTS, slotOf } from '../input/flavours'
import type { Nucleus } from '../input/mass-number'
import type { MemberGrid } from '../types'
import { gridSumRules, type GridSumRules } from './sum-rules'

/** The sum-rule integrals of a nucleus at one Q² node, with what they should be. */
export interface NucleusSumRules {
  q2GeV2: number
  /** Integrals of the per-nucleon densities. */
  perNucleon: GridSumRules
  /** What each per-nucleon integral should be. */
  expected: GridSumRules
  /** A·∫(u_v + d_v + s_v)/3 (should be A). */
  baryonNumber: number
  /** A·∫(⅔u_v − ⅓d_v − ⅓s_v) (should be Z). */
  charge: number
  /** Largest |integral − expected| over the six checks (the nucleus totals divided by A). */
  worst: number
}

/**
 * The per-nucleon grid of nucleus (Z, A) from a bound-proton grid of the 13 evolved flavours.
 * @example perNucleonGrid(boundProton, { z: 6, a: 12 }) // ½(p + n) of carbon's bound nucleons
 */
export function perNucleonGrid(grid: MemberGrid, nucleus: Nucleus): MemberGrid {
  const target = { type: 'nucleus' as const, z: nucleus.z, a: nucleus.a }
  const mix = EVOLVED_FLAVOURS.map(pdg => composition(target, pdg).map(([p, c]) => [slotOf(p), c] as const))
  const values = new Float64Array(grid.values.length)
  const points = values.length / N_SLOTS
  for (let i = 0; i < points; i++) {
    for (let s = 0; s < N_SLOTS; s++) {
      let v = 0
      for (const [from, c] of mix[s]!) v += c * grid.values[i * N_SLOTS + from]!
      values[i * N_SLOTS + s] = v
    }
  }
  return { ...grid, values }
}

/**
 * The sum rules of nucleus (Z, A) at Q² node `iq` of a bound-proton member grid.
 * @throws RangeError as gridSumRules, or for an invalid nucleus.
 * @example nucleusSumRules(grid, { z: 26, a: 56 }, 0).charge // ≈ 26
 */
export function nucleusSumRules(grid: MemberGrid, nucleus: Nucleus, iq: number): NucleusSumRules {
  const { z: zz, a } = nucleus
  const n = a - zz
  const perNucleon = gridSumRules(perNucleonGrid(grid, nucleus), iq)
  const expected: GridSumRules = { momentum: 1, uValence: (2 * zz + n) / a, dValence: (zz + 2 * n) / a, sValence: 0 }
  const baryonNumber = (a * (perNucleon.uValence + perNucleon.dValence + perNucleon.sValence)) / 3
  const charge = a * ((2 / 3) * perNucleon.uValence - (1 / 3) * perNucleon.dValence - (1 / 3) * perNucleon.sValence)
  const worst = Math.max(
    Math.abs(perNucleon.momentum - expected.momentum), Math.abs(perNucleon.uValence - expected.uValence),
    Math.abs(perNucleon.dValence - expected.dValence), Math.abs(perNucleon.sValence),
    Math.abs(baryonNumber - a) / a, Math.abs(charge - zz) / a
  )
  return { q2GeV2: grid.q2[iq]!, perNucleon, expected, baryonNumber, charge, worst }
}
