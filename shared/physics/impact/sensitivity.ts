/**
 * Sensitivity maps: which bins of a study are correlated with which flavour's density at which x
 * (see shared/physics/README.md, section 21.5).
 */
import { interpolateMany } from '../interpolation'
import type { ErrorSet, Pdg, SetKind } from '../types'
import { clScaleFactor, deviationRows, experimentalCovariance, withoutMembers, type Measurement, type MemberValues } from '../uncertainty'
import { assertMemberValues } from '../uncertainty/matrix'

/**
 * x·f(x, Q²) of one flavour for every member of a set, at the points x_p and one Q², as a
 * member-value matrix (members × points) that pairs with a study's member values.
 *
 * Unit: dimensionless (x·f); Q² in GeV². Domain: points inside the set's grid (RangeError
 * otherwise, naming the point), any PDG code (a flavour the set does not carry is 0).
 * Method: the engine's bicubic interpolation (interpolateMany).
 * @throws RangeError for a point outside the grid or an empty x list.
 * @example densityValues(set, 21, 100, [1e-3, 0.01, 0.1]) // gluon x·g per member and x
 */
export function densityValues(set: ErrorSet, flavour: Pdg, q2GeV2: number, xs: ArrayLike<number>): MemberValues {
  if (xs.length === 0) throw new RangeError('No x values given for the densities.')
  const q2s = new Float64Array(xs.length).fill(q2GeV2)
  const values = new Float64Array(set.members.length * xs.length)
  set.members.forEach((member, m) => {
    const grid = { x: set.x, q2: set.q2, flavours: set.flavours, values: member }
    values.set(interpolateMany(grid, flavour, xs, q2s).values, m * xs.length)
  })
  return { members: set.members.length, bins: xs.length, values }
}

/** Result of {@link correlationMap}. */
export interface CorrelationMap {
  bins: number
  points: number
  /** cos φ[b·points + p] between bin b and point p, in [−1, 1]; NaN where either has no PDF spread. */
  cosPhi: Float64Array
}

/**
 * cos φ between every bin of a study and every density point, over the members of one set:
 * Hessian pairs cos φ = Σ_k d_k^X d_k^Y / (√Σ_k (d_k^X)² √Σ_k (d_k^Y)²) with d_k = ½(V_k⁺ − V_k⁻)
 * (J. Pumplin et al., hep-ph/0101032; P. M. Nadolsky et al., arXiv:0802.0007), one-sided
 * d_k = V_k − V₀, replicas the sample (Pearson) correlation over replicas 1..N.
 *
 * Unit: dimensionless. Domain: two member-value matrices of the same set (same members and
 * kind; α_s members set aside by `alphasMembers`). Method: deviationRows of each, then the cross
 * products; O(K·B·P).
 * @throws RangeError when the member counts differ or do not fit the kind.
 * @example correlationMap(study, densityValues(set, 2, 100, xs), 'hessian-pairs').cosPhi
 */
export function correlationMap(observables: MemberValues, densities: MemberValues, kind: SetKind, alphasMembers?: readonly [number, number]): CorrelationMap {
  assertMemberValues(observables, 2, 'study\'s member-value matrix')
  assertMemberValues(densities, 2, 'density member-value matrix')
  if (observables.members !== densities.members) {
    throw new RangeError(`The study has values for ${observables.members} members but the densities for ${densities.members}: both must come from the same set.`)
  }
  const strip = (m: MemberValues) => (alphasMembers === undefined ? m : withoutMembers(m, alphasMembers))
  const dx = deviationRows(strip(observables), kind)
  const dy = deviationRows(strip(densities), kind)
  const k = dx.members
  const bins = dx.bins
  const points = dy.bins
  const norm = (d: MemberValues) => {
    const out = new Float64Array(d.bins)
    for (let c = 0; c < d.bins; c++) {
      let s = 0
      for (let r = 0; r < k; r++) s += d.values[r * d.bins + c]! ** 2
      out[c] = Math.sqrt(s)
    }
    return out
  }
  const nx = norm(dx)
  const ny = norm(dy)
  const cosPhi = new Float64Array(bins * points)
  for (let b = 0; b < bins; b++) {
    for (let p = 0; p < points; p++) {
      let s = 0
      for (let r = 0; r < k; r++) s += dx.values[r * bins + b]! * dy.values[r * points + p]!
      const d = nx[b]! * ny[p]!
      cosPhi[b * points + p] = d === 0 ? Number.NaN : Math.min(1, Math.max(-1, s / d))
    }
  }
  return { bins, points, cosPhi }
}

/**
 * The PDF uncertainty of every bin at 68% CL, √C_bb of the set's covariance: ½√Σ(V⁺ − V⁻)² for
 * pairs, √Σ(V_k − V₀)² one-sided, the sample standard deviation for replicas, rescaled from the
 * set's CL.
 *
 * Unit: that of the observable. Domain: as deviationRows.
 * @example predictionErrors(m, 'hessian-pairs', 90)
 */
export function predictionErrors(observables: MemberValues, kind: SetKind, clPercent = 68, alphasMembers?: readonly [number, number]): Float64Array {
  const d = deviationRows(alphasMembers === undefined ? observables : withoutMembers(observables, alphasMembers), kind)
  const factor = clScaleFactor(clPercent, 68)
  const out = new Float64Array(d.bins)
  for (let b = 0; b < d.bins; b++) {
    let s = 0
    for (let r = 0; r < d.members; r++) s += d.values[r * d.bins + b]! ** 2
    out[b] = Math.sqrt(s) * factor
  }
  return out
}

/**
 * Sensitivity S[b, p] = cos φ[b, p] · ΔX_b/δD_b of B.-T. Wang et al., arXiv:1803.02777 (from
 * memory): the correlation scaled by the ratio of the prediction's PDF uncertainty ΔX_b (68% CL)
 * to the data's total error δD_b = √C_bb of the experimental covariance. |S| well above 1 marks a
 * bin whose data can constrain that density at that x.
 *
 * Unit: dimensionless. Domain: a map of as many bins as the measurement has points, one ΔX per
 * bin. NaN where cos φ is NaN.
 * @throws RangeError on a size mismatch.
 * @example sensitivityMap(map, predictionErrors(m, 'replicas'), measurement)
 */
export function sensitivityMap(map: CorrelationMap, predictionError: ArrayLike<number>, measurement: Measurement): Float64Array {
  const c = experimentalCovariance(measurement)
  if (c.size !== map.bins || predictionError.length !== map.bins) {
    throw new RangeError(`The map has ${map.bins} bins, the prediction errors ${predictionError.length} and the measurement ${c.size} points: they must match.`)
  }
  const out = new Float64Array(map.cosPhi.length)
  for (let b = 0; b < map.bins; b++) {
    const ratio = predictionError[b]! / Math.sqrt(c.values[b * c.size + b]!)
    for (let p = 0; p < map.points; p++) out[b * map.points + p] = map.cosPhi[b * map.points + p]! * ratio
  }
  return out
}
