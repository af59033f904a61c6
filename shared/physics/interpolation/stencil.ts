import type { GridAxes, PreparedAxes } from './axes'
import { preparedAxesOf } from './axes'

/** What to do with a point outside the grid: throw (default) or freeze it at the nearest edge. */
export type OutsidePolicy = 'error' | 'freeze'

/** Options shared by the interpolation functions. */
export interface InterpolationOptions {
  /** 'error' (default): RangeError for a point outside the grid; 'freeze': use the edge value. */
  outside?: OutsidePolicy
}

/**
 * The factorised interpolation stencil of one point: up to 4 x nodes × up to 4 Q² nodes.
 * The value of a member at the point is Σ_i Σ_j xWeights[i] q2Weights[j] v(xStart + i, q2Start + j).
 */
export interface Stencil {
  xStart: number
  xCount: number
  /** Lagrange weights in ln x, length 4 (entries beyond xCount are 0). */
  xWeights: Float64Array
  q2Start: number
  q2Count: number
  /** Lagrange weights in ln Q², length 4 (entries beyond q2Count are 0). */
  q2Weights: Float64Array
  /** True when the point lay outside the grid and was frozen at the edge. */
  outside: boolean
}

/**
 * Relative slack (in x and in Q²) within which a point just beyond an edge counts as on it:
 * quadrature points at a bin edge can land a few ulps outside through rounding.
 */
export const EDGE_SLACK = 1e-12

/**
 * Lagrange weights of the `count` nodes t[start … start+count−1] for the point t:
 * w_i = Π_{j≠i} (t − t_j)/(t_i − t_j). Written into `out` (length ≥ count), which is returned.
 * Exact (w = δ) when t is a node. Domain: distinct nodes.
 * @example lagrangeWeights([0, 1, 2, 3], 0, 4, 1.5, new Float64Array(4)) // [−1/16, 9/16, 9/16, −1/16]
 */
export function lagrangeWeights(t: ArrayLike<number>, start: number, count: number, point: number, out: Float64Array): Float64Array {
  for (let i = 0; i < count; i++) {
    const ti = t[start + i]!
    let w = 1
    for (let j = 0; j < count; j++) {
      if (j === i) continue
      const tj = t[start + j]!
      w *= (point - tj) / (ti - tj)
    }
    out[i] = w
  }
  for (let i = count; i < out.length; i++) out[i] = 0
  return out
}

/** Index k in [lo, hi − 1] with t[k] ≤ point ≤ t[k+1] (point already clamped into [t[lo], t[hi]]). */
function bracket(t: Float64Array, lo: number, hi: number, point: number): number {
  let a = lo
  let b = hi
  while (b - a > 1) {
    const mid = (a + b) >> 1
    if (t[mid]! <= point) a = mid
    else b = mid
  }
  return a
}

/** First node of a stencil of `count` nodes around bracket k inside [lo, hi]. */
function stencilStart(k: number, lo: number, hi: number, count: number): number {
  const start = k - Math.floor((count - 1) / 2)
  return Math.max(lo, Math.min(start, hi - count + 1))
}

function describe(x: number, q2: number): string {
  return `(x = ${x}, Q² = ${q2} GeV²)`
}

/**
 * Interpolation stencil of the point (x, Q²) on prepared axes: 4-point Lagrange interpolation
 * in ln x times 4-point Lagrange in ln Q² (bicubic on non-uniform nodes), the stencil centred on
 * the bracketing interval and shifted inwards at the edges. Q² is interpolated inside one
 * sub-grid only: a point exactly at a repeated threshold node belongs to the sub-grid above it.
 * A sub-grid with fewer than 4 nodes uses all of them (lower order).
 *
 * Units: x dimensionless, q2GeV2 in GeV². Domain: x in [x₀, x_last], Q² in [Q²₀, Q²_last]
 * (with a relative slack of 1e-12); outside it a RangeError, or with `outside: 'freeze'` the
 * point is moved to the nearest edge and `outside` is set.
 *
 * Accuracy (measured in tests/unit/physics/interpolation): cubic polynomials in (ln x, ln Q²)
 * are reproduced to rounding; on 60 x nodes (40 log-spaced in [1e-5, 0.1), 20 linear in
 * [0.1, 0.95]) × 24 Q² nodes log-spaced in [2, 1e4] GeV², for x·f = x^−0.2 (1 − x)³ (1 + 0.3 ln Q²)
 * the largest relative error is 1.4e-5 for x ≤ 0.1, 9e-5 for x ≤ 0.5, 3.2e-4 for x ≤ 0.8 and
 * 2e-3 for x ≤ 0.9 (where (1 − x)³ vanishes); the error falls as h⁴ with the node spacing h.
 * @example interpolationStencil(prepareAxes(grid), 0.01, 100).xCount // 4
 */
export function interpolationStencil(axes: PreparedAxes, x: number, q2GeV2: number, options: InterpolationOptions = {}): Stencil {
  const { lnX, lnQ2, nx, runs } = axes
  if (!Number.isFinite(x) || !Number.isFinite(q2GeV2) || !(x > 0) || !(q2GeV2 > 0)) {
    throw new RangeError(`cannot interpolate at ${describe(x, q2GeV2)}: x and Q² must be positive finite numbers`)
  }
  const xLo = axes.x[0]!
  const xHi = axes.x[nx - 1]!
  const qLo = axes.q2[0]!
  const qHi = axes.q2[axes.nq - 1]!
  let outside = false
  let xc = x
  let qc = q2GeV2
  if (x < xLo || x > xHi) {
    const slack = x < xLo ? (xLo - x) / xLo : (x - xHi) / xHi
    if (slack > EDGE_SLACK) {
      if (options.outside !== 'freeze') {
        throw new RangeError(`x = ${x} at Q² = ${q2GeV2} GeV² is outside the grid's x range [${xLo}, ${xHi}]`)
      }
      outside = true
    }
    xc = x < xLo ? xLo : xHi
  }
  if (q2GeV2 < qLo || q2GeV2 > qHi) {
    const slack = q2GeV2 < qLo ? (qLo - q2GeV2) / qLo : (q2GeV2 - qHi) / qHi
    if (slack > EDGE_SLACK) {
      if (options.outside !== 'freeze') {
        throw new RangeError(`Q² = ${q2GeV2} GeV² at x = ${x} is outside the grid's Q² range [${qLo}, ${qHi}] GeV²`)
      }
      outside = true
    }
    qc = q2GeV2 < qLo ? qLo : qHi
  }
  const tx = xc === xLo ? lnX[0]! : xc === xHi ? lnX[nx - 1]! : Math.log(xc)
  const tq = Math.log(qc)

  const xCount = Math.min(4, nx)
  let xStart = 0
  if (nx > 1) xStart = stencilStart(bracket(lnX, 0, nx - 1, tx), 0, nx - 1, xCount)
  const xWeights = lagrangeWeights(lnX, xStart, xCount, tx, new Float64Array(4))

  // The sub-grid: the last run whose first node is ≤ Q² (so a threshold value goes upwards).
  let run = runs[0]!
  for (let r = runs.length - 1; r >= 0; r--) {
    if (axes.q2[runs[r]![0]]! <= qc) {
      run = runs[r]!
      break
    }
  }
  const [lo, hi] = run
  const q2Count = Math.min(4, hi - lo + 1)
  let q2Start = lo
  if (hi > lo) q2Start = stencilStart(bracket(lnQ2, lo, hi, Math.min(Math.max(tq, lnQ2[lo]!), lnQ2[hi]!)), lo, hi, q2Count)
  const q2Weights = lagrangeWeights(lnQ2, q2Start, q2Count, tq, new Float64Array(4))
  return { xStart, xCount, xWeights, q2Start, q2Count, q2Weights, outside }
}

/** Flattened interpolation weights of one point. */
export interface PointWeights {
  /** Node indices iq·nx + ix into the (Q², x) node plane; multiply by nf and add a flavour slot for `values`. */
  nodes: Int32Array
  /** Weight of each node; Σ weights = 1 up to rounding. */
  weights: Float64Array
  outside: boolean
}

/**
 * The interpolation of (x, Q²) as at most 16 (node, weight) pairs: x·f(x, Q²) =
 * Σ_k weights[k] · values[nodes[k]·nf + slot]. This is what a precomputed evaluation plan stores.
 * Same method, domain, options and accuracy as {@link interpolationStencil}.
 * @example interpolationWeights(grid, 0.01, 100).nodes.length // 16 on a grid with ≥ 4 × 4 nodes
 */
export function interpolationWeights(axes: GridAxes | PreparedAxes, x: number, q2GeV2: number, options: InterpolationOptions = {}): PointWeights {
  const prepared = 'lnX' in axes ? axes : preparedAxesOf(axes)
  const s = interpolationStencil(prepared, x, q2GeV2, options)
  const n = s.xCount * s.q2Count
  const nodes = new Int32Array(n)
  const weights = new Float64Array(n)
  let k = 0
  for (let j = 0; j < s.q2Count; j++) {
    for (let i = 0; i < s.xCount; i++) {
      nodes[k] = (s.q2Start + j) * prepared.nx + s.xStart + i
      weights[k] = s.q2Weights[j]! * s.xWeights[i]!
      k++
    }
  }
  return { nodes, weights, outside: s.outside }
}
