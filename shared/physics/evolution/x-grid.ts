/**
 * x nodes of evolution grids: log-spaced at small x and denser towards x → 1, or given by the
 * caller.
 */

/** A request for x nodes: counts and range, or explicit nodes. */
export type XGridSpec =
  | { count: number, min: number, max: number }
  | { nodes: ArrayLike<number> }

/** Default x grid: 100 nodes from 1e-6 to 0.99. */
export const DEFAULT_X_GRID = { count: 100, min: 1e-6, max: 0.99 } as const

/**
 * `count` nodes from `min` to `max`, uniform in u = ln x − ln(1 − x): log-spaced for x ≪ 1
 * (Δ ln x ≈ Δu) and log-spaced in 1 − x as x → 1 (Δ ln(1 − x) ≈ −Δu), which keeps the relative
 * interpolation error of (1 − x)^b shapes uniform.
 * @throws RangeError unless 0 < min < max < 1 and count is an integer in 8..2000.
 * @example xNodes({ count: 100, min: 1e-6, max: 0.99 })[0] // 1e-6
 */
export function xNodes(spec: XGridSpec = DEFAULT_X_GRID): Float64Array {
  if ('nodes' in spec) return checkedXNodes(spec.nodes)
  const { count, min, max } = spec
  if (!Number.isInteger(count) || count < 8 || count > 2000) {
    throw new RangeError(`the x grid needs an integer node count in 8..2000; got ${count}`)
  }
  if (!(min > 0 && min < max && max < 1)) {
    throw new RangeError(`the x range needs 0 < min < max < 1; got min = ${min}, max = ${max}`)
  }
  const u0 = Math.log(min) - Math.log1p(-min)
  const u1 = Math.log(max) - Math.log1p(-max)
  const out = new Float64Array(count)
  for (let i = 0; i < count; i++) {
    const u = u0 + ((u1 - u0) * i) / (count - 1)
    out[i] = 1 / (1 + Math.exp(-u))
  }
  out[0] = min
  out[count - 1] = max
  return out
}

/**
 * Caller-given x nodes, checked: at least 8, finite, strictly increasing, inside (0, 1).
 * @throws RangeError naming the first bad node.
 * @example checkedXNodes([1e-4, 1e-3, …])
 */
export function checkedXNodes(nodes: ArrayLike<number>): Float64Array {
  if (nodes.length < 8) throw new RangeError(`an x grid needs at least 8 nodes; got ${nodes.length}`)
  const out = Float64Array.from(nodes as ArrayLike<number>)
  for (let i = 0; i < out.length; i++) {
    const x = out[i]!
    if (!(x > 0 && x < 1)) throw new RangeError(`x node ${i} is ${x}; nodes must lie in (0, 1)`)
    if (i > 0 && !(x > out[i - 1]!)) throw new RangeError(`x nodes must increase strictly; node ${i} (${x}) ≤ node ${i - 1} (${out[i - 1]})`)
  }
  return out
}
