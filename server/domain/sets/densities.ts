// What the set page plots and reads out: x·f(x, Q²) of chosen flavours with the set's band at one
// Q², the ratio to another set, and the sum-rule integrals with their spread. Every number comes
// from the engine (interpolation stencils, x integrals, prescriptions); this file only arranges
// members into member-value matrices. No Nitro imports.
import { preparedAxesOf } from '../../../shared/physics/interpolation/axes'
import { applyStencil } from '../../../shared/physics/interpolation/member'
import { interpolationStencil, type Stencil } from '../../../shared/physics/interpolation/stencil'
import { integrateX } from '../../../shared/physics/evolution/sum-rules'
import type { ErrorSet, Pdg } from '../../../shared/physics/types'
import type { Prescription } from '../../../shared/physics/uncertainty/bands'
import { bandToJson, type BandJson } from '../../../shared/physics/uncertainty/band'
import { bandsFromValues, memberSourceOf } from '../results/bands'

/** A flavour to plot: a PDG code, or a valence combination (u − ū, d − d̄). */
export type FlavourChoice = Pdg | 'uv' | 'dv'

const COMBINATIONS: Record<'uv' | 'dv', Array<[Pdg, number]>> = { uv: [[2, 1], [-2, -1]], dv: [[1, 1], [-1, -1]] }
const terms = (f: FlavourChoice): Array<[Pdg, number]> => (typeof f === 'number' ? [[f, 1]] : COMBINATIONS[f])

/** `count` x values evenly spaced in ln x over [lo, hi]. */
export function logSpacedX(lo: number, hi: number, count: number): Float64Array {
  const a = Math.log(lo)
  const b = Math.log(hi)
  return Float64Array.from({ length: count }, (_, i) => Math.exp(a + ((b - a) * i) / (count - 1)))
}

/** `count` x values evenly spaced in x over [lo, hi]. */
export function linearSpacedX(lo: number, hi: number, count: number): Float64Array {
  return Float64Array.from({ length: count }, (_, i) => (i === count - 1 ? hi : lo + ((hi - lo) * i) / (count - 1)))
}

/** Values of choice `f` at the stencils for every member: members × points, member-major. */
function memberMatrix(set: ErrorSet, stencils: Stencil[], f: FlavourChoice): Float64Array {
  const axes = preparedAxesOf(set)
  const n = stencils.length
  const out = new Float64Array(set.members.length * n)
  set.members.forEach((member, m) => {
    for (const [pdg, w] of terms(f)) {
      const slot = axes.flavourSlot.get(pdg)
      if (slot === undefined) continue // a flavour the set does not carry is zero
      for (let k = 0; k < n; k++) out[m * n + k]! += w * applyStencil(axes, member, stencils[k]!, slot)
    }
  })
  return out
}

export interface DensityRequest {
  q2GeV2: number
  flavours: FlavourChoice[]
  x: Float64Array
  prescription: Prescription
  clPercent: number
}

/**
 * x·f of each chosen flavour at `x` and `q2GeV2`: the band of `set` (prescription and CL as
 * asked), and with `reference` the same band divided point by point by the reference set's
 * central member (both sets' members vary independently, so the reference's own spread is not
 * in the ratio band). RangeError when a point is outside a grid.
 */
export function densityBands(set: ErrorSet, request: DensityRequest, reference?: ErrorSet) {
  const stencils = Array.from(request.x, x => interpolationStencil(preparedAxesOf(set), x, request.q2GeV2))
  const refStencils = reference ? Array.from(request.x, x => interpolationStencil(preparedAxesOf(reference), x, request.q2GeV2)) : null
  const source = memberSourceOf(set.header)
  const carried = new Set(set.flavours)
  // A flavour asked for twice is computed once (the query schema drops repeats too).
  return [...new Set(request.flavours)].map((f) => {
    const values = memberMatrix(set, stencils, f)
    const band = bandsFromValues({ members: set.members.length, bins: request.x.length, values }, source, request.prescription, request.clPercent)
    let ratio: BandJson | null = null
    const json = bandToJson(band)
    if (reference && refStencils) {
      const refCentral = memberMatrix({ ...reference, members: [reference.members[0]!] }, refStencils, f)
      const div = (a: Float64Array, i: number) => (refCentral[i] !== 0 ? a[i]! / Math.abs(refCentral[i]!) : Number.NaN)
      ratio = {
        central: Array.from(band.central, (_, i) => div(band.central, i)),
        plus: Array.from(band.plus, (_, i) => div(band.plus, i)),
        minus: Array.from(band.minus, (_, i) => div(band.minus, i)),
        relPlus: json.relPlus,
        relMinus: json.relMinus
      }
    }
    return { flavour: f, carried: terms(f).some(([p]) => carried.has(p)), band: json, ratio }
  })
}

/**
 * The sum-rule integrals of every member at `q2GeV2` on the set's own x nodes (integrateX of the
 * engine, with its small-x tail estimate), each with the set's band: momentum ∫₀¹ x Σ f dx
 * (expected 1), ∫(u − ū) dx (2), ∫(d − d̄) dx (1), ∫(s − s̄) dx (0) for a proton (see shared/physics/README.md, sum rules).
 */
export function sumRuleBands(set: ErrorSet, q2GeV2: number, prescription: Prescription, clPercent: number) {
  const axes = preparedAxesOf(set)
  const stencils = Array.from(set.x, x => interpolationStencil(axes, x, q2GeV2))
  const all = set.flavours.filter(f => f !== 22)
  const rules: Array<{ id: string, label: string, expected: number, flavours: Array<[Pdg, number]>, p: 0 | 1 }> = [
    { id: 'momentum', label: '∫ x Σ f dx (quarks, antiquarks, gluon)', expected: 1, flavours: all.map(f => [f, 1]), p: 1 },
    { id: 'uValence', label: '∫ (u − ū) dx', expected: 2, flavours: [[2, 1], [-2, -1]], p: 0 },
    { id: 'dValence', label: '∫ (d − d̄) dx', expected: 1, flavours: [[1, 1], [-1, -1]], p: 0 },
    { id: 'sValence', label: '∫ (s − s̄) dx', expected: 0, flavours: [[3, 1], [-3, -1]], p: 0 }
  ]
  const source = memberSourceOf(set.header)
  const nx = set.x.length
  return rules.map((rule) => {
    const head = { id: rule.id, label: rule.label, expected: rule.expected }
    const perMember = new Float64Array(set.members.length)
    try {
      set.members.forEach((member, m) => {
        const column = new Float64Array(nx)
        for (const [pdg, w] of rule.flavours) {
          const slot = axes.flavourSlot.get(pdg)
          if (slot === undefined) continue
          for (let k = 0; k < nx; k++) column[k]! += w * applyStencil(axes, member, stencils[k]!, slot)
        }
        perMember[m] = integrateX(set.x, column, rule.p)
      })
    } catch (err) {
      // One rule the set cannot satisfy (a divergent small-x tail) does not hide the others.
      if (!(err instanceof RangeError)) throw err
      return { ...head, central: null, plus: null, minus: null, error: err.message }
    }
    const band = bandsFromValues({ members: set.members.length, bins: 1, values: perMember }, source, prescription, clPercent)
    return { ...head, central: band.central[0]!, plus: band.plus[0]!, minus: band.minus[0]!, error: null }
  })
}
