import type { MemberGrid, Pdg } from '../types'

/** The node axes of a grid (everything but the values). */
export type GridAxes = Pick<MemberGrid, 'x' | 'q2' | 'flavours'>

/**
 * Grid axes prepared for interpolation: logarithms of the nodes, the Q² sub-grids between
 * repeated threshold nodes, and a PDG → slot map. Build with {@link prepareAxes}.
 */
export interface PreparedAxes {
  x: Float64Array
  q2: Float64Array
  flavours: readonly Pdg[]
  nx: number
  nq: number
  nf: number
  /** ln x of each x node. */
  lnX: Float64Array
  /** ln(Q²/GeV²) of each Q² node. */
  lnQ2: Float64Array
  /**
   * Q² sub-grids as [first, last] node indices (inclusive), in order; consecutive runs share
   * a threshold value (last node of one run equals the first node of the next).
   */
  runs: ReadonlyArray<readonly [number, number]>
  /** Slot of each PDG code in `flavours`. */
  flavourSlot: ReadonlyMap<Pdg, number>
}

/**
 * Checks the axes and precomputes what interpolation needs.
 * Domain: x strictly increasing in (0, 1); Q² > 0 and increasing except that a value may be
 * repeated once (a heavy-flavour threshold, see types.ts); flavours unique; at least one node
 * on each axis. Violations throw a RangeError naming the node. The set parser checks the
 * stricter file rules (thresholds at declared masses, ≥ 2 nodes per sub-grid).
 * @example prepareAxes({ x, q2, flavours: [21] }).runs // [[0, q2.length − 1]] without thresholds
 */
export function prepareAxes(axes: GridAxes): PreparedAxes {
  const { x, q2, flavours } = axes
  const nx = x.length
  const nq = q2.length
  if (nx < 1 || nq < 1 || flavours.length < 1) {
    throw new RangeError(`a grid needs at least one x node, one Q² node and one flavour; got ${nx}, ${nq}, ${flavours.length}`)
  }
  const lnX = new Float64Array(nx)
  for (let i = 0; i < nx; i++) {
    const v = x[i]!
    if (!(v > 0 && v < 1)) throw new RangeError(`x node ${i} is ${v}; x nodes must lie in (0, 1)`)
    if (i > 0 && !(v > x[i - 1]!)) throw new RangeError(`x node ${i} (${v}) does not exceed x node ${i - 1} (${x[i - 1]}); x nodes must increase strictly`)
    lnX[i] = Math.log(v)
  }
  const lnQ2 = new Float64Array(nq)
  const runs: Array<[number, number]> = []
  let runStart = 0
  for (let i = 0; i < nq; i++) {
    const v = q2[i]!
    if (!(v > 0) || !Number.isFinite(v)) throw new RangeError(`Q² node ${i} is ${v} GeV²; Q² nodes must be positive and finite`)
    lnQ2[i] = Math.log(v)
    if (i === 0) continue
    const prev = q2[i - 1]!
    if (v === prev) {
      if (i >= 2 && q2[i - 2] === v) throw new RangeError(`Q² node ${i} (${v} GeV²) repeats a value three times; a threshold may appear only twice`)
      runs.push([runStart, i - 1])
      runStart = i
    } else if (!(v > prev)) {
      throw new RangeError(`Q² node ${i} (${v} GeV²) is below Q² node ${i - 1} (${prev} GeV²); Q² nodes must increase`)
    }
  }
  runs.push([runStart, nq - 1])
  const flavourSlot = new Map<Pdg, number>()
  flavours.forEach((pdg, slot) => {
    if (flavourSlot.has(pdg)) throw new RangeError(`flavour ${pdg} appears twice in the grid's flavour list`)
    flavourSlot.set(pdg, slot)
  })
  return { x, q2, flavours, nx, nq, nf: flavours.length, lnX, lnQ2, runs, flavourSlot }
}

const preparedCache = new WeakMap<Float64Array, WeakMap<Float64Array, PreparedAxes>>()

/**
 * {@link prepareAxes} memoised on the identity of the x and Q² arrays (the engine never
 * mutates inputs; callers must not mutate node arrays after first use either).
 */
export function preparedAxesOf(axes: GridAxes): PreparedAxes {
  let byQ2 = preparedCache.get(axes.x)
  if (byQ2 === undefined) {
    byQ2 = new WeakMap()
    preparedCache.set(axes.x, byQ2)
  }
  const hit = byQ2.get(axes.q2)
  if (hit !== undefined && hit.flavours.length === axes.flavours.length && hit.flavours.every((f, i) => f === axes.flavours[i])) return hit
  const prepared = prepareAxes(axes)
  byQ2.set(axes.q2, prepared)
  return prepared
}
