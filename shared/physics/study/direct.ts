import type { GridAxes } from '../interpolation/axes'
import { preparedAxesOf } from '../interpolation/axes'
import { interpolateFlavours } from '../interpolation/member'
import { combineByMember } from '../kernels/ratios'
import type { KernelContext } from '../kernels/registry'
import type { MemberGrid } from '../types'
import type { DensitySource } from './expand'
import { expandStudy } from './expand'
import type { PlanOptions } from './plan'
import { StudyReachError } from './plan'
import type { StudySpec } from './spec'

/** Axes and members of a set, as in ErrorSet. */
export interface SetMembers extends GridAxes {
  members: readonly Float64Array[]
}

/** Options of {@link evaluateDirect}: as for plans, with the second set's members. */
export interface DirectOptions extends KernelContext {
  second?: SetMembers
  outside?: PlanOptions['outside']
}

/**
 * Evaluates a study by direct interpolation at every quadrature point for every member — the
 * reference the precomputed plan is checked and benchmarked against. Same result layout,
 * pairing and composites as {@link evaluatePlan}; same reach policy (StudyReachError, or frozen
 * edge values with `outside: 'freeze'`). Cost: one full (ln x, ln Q²) interpolation of all
 * flavours per point, beam and member.
 * @example evaluateDirect(spec, set)[0] // central member, bin 1
 */
export function evaluateDirect(spec: StudySpec, set: SetMembers, options: DirectOptions = {}): Float64Array {
  const outside = options.outside ?? 'error'
  const second = options.second
  const expanded = expandStudy(spec, { main: set, second }, options)
  const fatal = expanded.issues.filter(i => i.kind === 'kinematics' || outside === 'error')
  if (fatal.length > 0) throw new StudyReachError(fatal)
  const nBins = expanded.nBins
  const setOf = (source: DensitySource): SetMembers => {
    if (source === 'main') return set
    if (!second) throw new RangeError('this study needs the second set\'s members')
    return second
  }
  const values = expanded.parts.map((part) => {
    const s1 = setOf(part.source1)
    const s2 = setOf(part.source2)
    const n1 = s1.members.length
    const n2 = s2.members.length
    if (n1 === 0 || n2 === 0) throw new RangeError('no members to evaluate: give at least the central member')
    if (s1 !== s2 && n1 !== n2 && n1 !== 1 && n2 !== 1) throw new RangeError(`cannot pair ${n1} members with ${n2} members: give equal counts or a single member on one side`)
    const count = s1 === s2 ? n1 : Math.max(n1, n2)
    const slots1 = preparedAxesOf(s1).flavourSlot
    const slots2 = preparedAxesOf(s2).flavourSlot
    const out = new Float64Array(count * nBins)
    for (let k = 0; k < count; k++) {
      const g1: MemberGrid = { x: s1.x, q2: s1.q2, flavours: s1.flavours, values: s1.members[n1 === 1 ? 0 : k]! }
      const g2: MemberGrid = s1 === s2 ? g1 : { x: s2.x, q2: s2.q2, flavours: s2.flavours, values: s2.members[n2 === 1 ? 0 : k]! }
      part.bins.forEach((bin, b) => {
        let total = 0
        bin.terms.forEach((term, i) => {
          let sum = 0
          if (term.kind === 'linear') {
            const f = interpolateFlavours(g1, term.x, term.mu2GeV2, { outside })
            for (const [pdg, w] of term.weights) {
              const slot = slots1.get(pdg)
              if (slot !== undefined) sum += w * f[slot]!
            }
          } else {
            const f1 = interpolateFlavours(g1, term.x1, term.mu2GeV2, { outside })
            const f2 = interpolateFlavours(g2, term.x2, term.mu2GeV2, { outside })
            for (const { a, b: bb, w } of term.pairs) {
              const sa = slots1.get(a)
              const sb = slots2.get(bb)
              if (sa !== undefined && sb !== undefined) sum += w * f1[sa]! * f2[sb]!
            }
          }
          total += bin.weights[i]! * term.factor * sum
        })
        out[k * nBins + b] = total
      })
    }
    return out
  })
  if (expanded.op === undefined) return values[0]!
  return combineByMember(values[0]!, values[1]!, nBins, expanded.op)
}
