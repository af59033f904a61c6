/**
 * Q² nodes of evolution grids, with each heavy-quark threshold inside the range present twice
 * (the value just below, then just above the threshold; see MemberGrid in types.ts) so that
 * interpolation never crosses it.
 */
import { checkScheme, flavourThresholdsGeV2, strictlyBetween } from '../alphas'
import type { FlavourScheme } from '../types'

/** A request for Q² nodes: a count and an upper end, or explicit nodes (GeV²). */
export type Q2GridSpec =
  | { count: number, maxGeV2: number, minGeV2?: number }
  | { nodesGeV2: ArrayLike<number> }

/** Default Q² grid: 40 distinct values from μ₀² to 1e8 GeV². */
export const DEFAULT_Q2_GRID = { count: 40, maxGeV2: 1e8 } as const

/** Where the below/above pair of each interior threshold sits in a Q² node array. */
export interface ThresholdPair {
  q2GeV2: number
  /** Index of the "just below" node; index + 1 is "just above". */
  index: number
}

/**
 * Q² nodes (GeV²) from `minGeV2` (default μ₀²) to `maxGeV2`.
 *
 * Counted form: `count` distinct values uniform in ln Q² inside each range between the ends and
 * the interior thresholds (nodes shared out in proportion to each range's ln-length, at least the
 * two ends of each); every interior threshold then appears twice, so the array has
 * `count + (number of interior thresholds)` entries.
 * Explicit form: the nodes as given (strictly increasing, ≥ μ₀²), with each interior threshold
 * inserted (or doubled) as a below/above pair. A threshold at the first or last node is not
 * doubled (no sub-grid lies beyond it); the evolution still switches the heavy quark on there
 * when it goes on to higher nodes (xspace.ts).
 * @param startGeV2 μ₀², the evolution's starting scale; no node may lie below it.
 * @throws RangeError for bad counts, a range below μ₀², or unordered nodes.
 * @example q2Nodes({ count: 40, maxGeV2: 1e8 }, 2, vfns) // 42 entries when m_b², m_t² lie inside
 */
export function q2Nodes(spec: Q2GridSpec, startGeV2: number, scheme: FlavourScheme): Float64Array {
  checkScheme(scheme)
  if (!(startGeV2 > 0) || !Number.isFinite(startGeV2)) {
    throw new RangeError(`the starting scale μ₀² must be a finite number of GeV² > 0; got ${startGeV2}`)
  }
  const thresholds = flavourThresholdsGeV2(scheme)
  let distinct: number[]
  if ('nodesGeV2' in spec) {
    distinct = Array.from(spec.nodesGeV2 as ArrayLike<number>)
    if (distinct.length < 1) throw new RangeError('the Q² grid needs at least one node')
    distinct.forEach((q, i) => {
      if (!Number.isFinite(q) || q <= 0) throw new RangeError(`Q² node ${i} is ${q}; nodes must be finite and > 0 GeV²`)
      if (q < startGeV2) throw new RangeError(`Q² node ${i} = ${q} GeV² lies below the starting scale μ₀² = ${startGeV2} GeV² (backward evolution is not supported)`)
      if (i > 0 && q < distinct[i - 1]!) throw new RangeError(`Q² nodes must increase; node ${i} (${q}) < node ${i - 1} (${distinct[i - 1]})`)
      if (i > 0 && q === distinct[i - 1]! && !thresholds.includes(q)) throw new RangeError(`Q² node ${i} repeats ${q} GeV², which is not a heavy-quark threshold`)
    })
    distinct = distinct.filter((q, i) => i === 0 || q !== distinct[i - 1])
  } else {
    const { count, maxGeV2 } = spec
    const minGeV2 = spec.minGeV2 ?? startGeV2
    if (!(minGeV2 >= startGeV2)) throw new RangeError(`the Q² grid starts at ${minGeV2} GeV², below the starting scale μ₀² = ${startGeV2} GeV²`)
    if (!(maxGeV2 > minGeV2) || !Number.isFinite(maxGeV2)) throw new RangeError(`the Q² range needs max > min; got min = ${minGeV2}, max = ${maxGeV2} GeV²`)
    const inner = thresholds.filter(t => strictlyBetween(t, minGeV2, maxGeV2))
    if (!Number.isInteger(count) || count < 2 + inner.length || count > 2000) {
      throw new RangeError(`the Q² grid needs an integer count in ${2 + inner.length}..2000 (both ends and each interior threshold); got ${count}`)
    }
    const edges = [minGeV2, ...inner, maxGeV2]
    const logLen = edges.slice(1).map((e, i) => Math.log(e / edges[i]!))
    const total = logLen.reduce((s, v) => s + v, 0)
    // Interior (non-edge) nodes per range, by largest remainder.
    const free = count - edges.length
    const exact = logLen.map(l => (free * l) / total)
    const alloc = exact.map(Math.floor)
    let left = free - alloc.reduce((s, v) => s + v, 0)
    const order = exact.map((e, i) => [e - Math.floor(e), i] as const).sort((a, b) => b[0] - a[0])
    for (const [, i] of order) { if (left-- <= 0) break; alloc[i]!++ }
    distinct = [minGeV2]
    edges.slice(1).forEach((hi, r) => {
      const lo = edges[r]!
      const m = alloc[r]! + 1
      for (let k = 1; k < m; k++) distinct.push(lo * Math.exp((Math.log(hi / lo) * k) / m))
      distinct.push(hi)
    })
  }
  const lo = distinct[0]!
  const hi = distinct[distinct.length - 1]!
  const out: number[] = []
  const inner = thresholds.filter(t => strictlyBetween(t, lo, hi))
  for (const q of distinct) {
    while (inner.length > 0 && inner[0]! < q) { const t = inner.shift()!; out.push(t, t) }
    if (inner.length > 0 && inner[0] === q) { inner.shift(); out.push(q, q); continue }
    out.push(q)
  }
  return Float64Array.from(out)
}

/**
 * The below/above pairs of equal neighbouring nodes in a Q² node array.
 * @example thresholdPairs(Float64Array.of(2, 20.25, 20.25, 100)) // [{ q2GeV2: 20.25, index: 1 }]
 */
export function thresholdPairs(q2: ArrayLike<number>): ThresholdPair[] {
  const pairs: ThresholdPair[] = []
  for (let i = 1; i < q2.length; i++) if (q2[i] === q2[i - 1]) pairs.push({ q2GeV2: q2[i]!, index: i - 1 })
  return pairs
}
