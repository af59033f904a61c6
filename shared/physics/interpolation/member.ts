import type { MemberGrid, Pdg } from '../types'
import type { PreparedAxes } from './axes'
import { preparedAxesOf } from './axes'
import type { InterpolationOptions, Stencil } from './stencil'
import { interpolationStencil } from './stencil'

function checkValues(axes: PreparedAxes, values: Float64Array): void {
  const expected = axes.nx * axes.nq * axes.nf
  if (values.length !== expected) {
    throw new RangeError(`member has ${values.length} values; the grid needs nx·nQ²·nf = ${axes.nx}·${axes.nq}·${axes.nf} = ${expected}`)
  }
}

/** Applies a stencil to flavour slot `slot` of a member's values. */
export function applyStencil(axes: PreparedAxes, values: Float64Array, s: Stencil, slot: number): number {
  const { nx, nf } = axes
  let sum = 0
  for (let j = 0; j < s.q2Count; j++) {
    const row = (s.q2Start + j) * nx + s.xStart
    let partial = 0
    for (let i = 0; i < s.xCount; i++) partial += s.xWeights[i]! * values[(row + i) * nf + slot]!
    sum += s.q2Weights[j]! * partial
  }
  return sum
}

function slotOf(axes: PreparedAxes, pdg: Pdg): number | undefined {
  return axes.flavourSlot.get(pdg)
}

/**
 * x·f(x, Q²) of one flavour of a member (dimensionless), by the bicubic (ln x, ln Q²)
 * interpolation of {@link interpolationStencil} (method, domain, accuracy there).
 * A flavour the grid does not carry is zero (e.g. the top quark of an n_f = 5 set).
 * Units: x dimensionless, q2GeV2 in GeV². RangeError outside the grid unless `outside: 'freeze'`.
 * @example interpolateXf(member, 21, 0.01, 100) // gluon momentum density x·g at x = 0.01, Q² = 100 GeV²
 */
export function interpolateXf(grid: MemberGrid, pdg: Pdg, x: number, q2GeV2: number, options: InterpolationOptions = {}): number {
  const axes = preparedAxesOf(grid)
  checkValues(axes, grid.values)
  const s = interpolationStencil(axes, x, q2GeV2, options)
  const slot = slotOf(axes, pdg)
  return slot === undefined ? 0 : applyStencil(axes, grid.values, s, slot)
}

/**
 * x·f(x, Q²) of every flavour slot of a member at one point, in the order of `grid.flavours`
 * (a new Float64Array of length nf). Same method, domain and accuracy as {@link interpolateXf}.
 * @example interpolateFlavours(member, 0.1, 10)[member.flavours.indexOf(2)] // x·u
 */
export function interpolateFlavours(grid: MemberGrid, x: number, q2GeV2: number, options: InterpolationOptions = {}): Float64Array {
  const axes = preparedAxesOf(grid)
  checkValues(axes, grid.values)
  const s = interpolationStencil(axes, x, q2GeV2, options)
  const out = new Float64Array(axes.nf)
  for (let slot = 0; slot < axes.nf; slot++) out[slot] = applyStencil(axes, grid.values, s, slot)
  return out
}

/** Result of {@link interpolateMany}. */
export interface ManyPoints {
  /** x·f at each point (frozen at the grid edge for points outside, with `outside: 'freeze'`). */
  values: Float64Array
  /** Indices of the points that lay outside the grid (always empty with `outside: 'error'`). */
  outsideIndices: number[]
}

/**
 * x·f of one flavour at many points (x_k, Q²_k), reporting which points were outside the grid.
 * xs and q2sGeV2 must have equal length. Same method and accuracy as {@link interpolateXf};
 * with the default policy the first outside point throws a RangeError naming its index.
 * @example interpolateMany(member, 2, [1e-3, 2], [10, 10], { outside: 'freeze' }).outsideIndices // [1]
 */
export function interpolateMany(grid: MemberGrid, pdg: Pdg, xs: ArrayLike<number>, q2sGeV2: ArrayLike<number>, options: InterpolationOptions = {}): ManyPoints {
  if (xs.length !== q2sGeV2.length) {
    throw new RangeError(`got ${xs.length} x values but ${q2sGeV2.length} Q² values; give one Q² per x`)
  }
  const axes = preparedAxesOf(grid)
  checkValues(axes, grid.values)
  const slot = slotOf(axes, pdg)
  const values = new Float64Array(xs.length)
  const outsideIndices: number[] = []
  for (let k = 0; k < xs.length; k++) {
    let s: Stencil
    try {
      s = interpolationStencil(axes, xs[k]!, q2sGeV2[k]!, options)
    } catch (error) {
      throw new RangeError(`point ${k}: ${(error as Error).message}`)
    }
    if (s.outside) outsideIndices.push(k)
    values[k] = slot === undefined ? 0 : applyStencil(axes, grid.values, s, slot)
  }
  return { values, outsideIndices }
}
