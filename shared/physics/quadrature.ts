/**
 * Gauss–Legendre quadrature of stated order.
 *
 * An n-point rule integrates polynomials of degree ≤ 2n − 1 exactly (Abramowitz & Stegun,
 * "Handbook of Mathematical Functions", §25.4.29). Nodes are the roots of the Legendre
 * polynomial P_n, found by Newton's method on the three-term recurrence
 * (k+1) P_{k+1} = (2k+1) t P_k − k P_{k−1}, started from the Tricomi estimate
 * cos(π (i − ¼)/(n + ½)) and iterated until the step is below 1e-15; weights are
 * w_i = 2 / ((1 − t_i²) P_n′(t_i)²).
 */

/** Nodes and weights of a quadrature rule on an interval. */
export interface QuadratureRule {
  /** Abscissae, increasing. */
  nodes: Float64Array
  /** Weights, same length as `nodes`. */
  weights: Float64Array
}

/** Largest order accepted; far beyond any bin integration the engine needs. */
export const MAX_GAUSS_LEGENDRE_ORDER = 512

const cache = new Map<number, QuadratureRule>()

/**
 * The n-point Gauss–Legendre rule on [−1, 1] (dimensionless), nodes increasing.
 * Domain: integer n in [1, 512], else RangeError. Nodes are accurate to ~1e-15 and the weights
 * sum to 2 within 1e-14 (tested up to n = 200). Results are cached and returned as fresh copies.
 * @example gaussLegendre(2).nodes // [−1/√3, 1/√3]
 */
export function gaussLegendre(n: number): QuadratureRule {
  if (!Number.isInteger(n) || n < 1 || n > MAX_GAUSS_LEGENDRE_ORDER) {
    throw new RangeError(`Gauss–Legendre order must be an integer from 1 to ${MAX_GAUSS_LEGENDRE_ORDER}; got ${n}`)
  }
  let rule = cache.get(n)
  if (rule === undefined) {
    rule = computeRule(n)
    cache.set(n, rule)
  }
  return { nodes: rule.nodes.slice(), weights: rule.weights.slice() }
}

/** P_n(t) and P_n′(t) by the three-term recurrence (|t| < 1). */
function legendre(n: number, t: number): { p: number, dp: number } {
  let p0 = 1
  let p1 = t
  for (let k = 1; k < n; k++) {
    const p2 = ((2 * k + 1) * t * p1 - k * p0) / (k + 1)
    p0 = p1
    p1 = p2
  }
  return { p: p1, dp: n * (t * p1 - p0) / (t * t - 1) }
}

function computeRule(n: number): QuadratureRule {
  const nodes = new Float64Array(n)
  const weights = new Float64Array(n)
  const half = Math.floor((n + 1) / 2)
  for (let i = 0; i < half; i++) {
    // Roots come in ± pairs; find the positive one (largest first), mirror it.
    let t = Math.cos(Math.PI * (i + 0.75) / (n + 0.5))
    for (let iteration = 0; iteration < 100; iteration++) {
      const { p, dp } = legendre(n, t)
      const step = p / dp
      t -= step
      if (Math.abs(step) <= 1e-15) break
    }
    if (n % 2 === 1 && i === half - 1) t = 0
    const { dp } = legendre(n, t)
    const w = 2 / ((1 - t * t) * dp * dp)
    nodes[n - 1 - i] = t
    nodes[i] = t === 0 ? 0 : -t
    weights[n - 1 - i] = w
    weights[i] = w
  }
  return { nodes, weights }
}

/**
 * The n-point Gauss–Legendre rule mapped onto [a, b] (any unit; weights carry the unit of b − a).
 * Domain: finite a < b, n as in {@link gaussLegendre}; else RangeError.
 * @example gaussLegendreOn(3, 0, 2).weights // sums to 2
 */
export function gaussLegendreOn(n: number, a: number, b: number): QuadratureRule {
  if (!Number.isFinite(a) || !Number.isFinite(b) || !(a < b)) {
    throw new RangeError(`integration range must be finite with lower < upper; got [${a}, ${b}]`)
  }
  const base = gaussLegendre(n)
  const half = 0.5 * (b - a)
  const mid = 0.5 * (a + b)
  const nodes = new Float64Array(n)
  const weights = new Float64Array(n)
  for (let i = 0; i < n; i++) {
    nodes[i] = mid + half * base.nodes[i]!
    weights[i] = half * base.weights[i]!
  }
  return { nodes, weights }
}

/**
 * ∫_a^b f(t) dt by the n-point Gauss–Legendre rule (unit: unit of f times unit of t).
 * Exact for polynomials of degree ≤ 2n − 1; for smooth f the error falls faster than any power
 * of 1/n. Domain as in {@link gaussLegendreOn}.
 * @example integrateGaussLegendre(t => t ** 3, 0, 1, 2) // 0.25 (exact: degree 3 ≤ 2·2 − 1)
 */
export function integrateGaussLegendre(f: (t: number) => number, a: number, b: number, n: number): number {
  const { nodes, weights } = gaussLegendreOn(n, a, b)
  let sum = 0
  for (let i = 0; i < n; i++) sum += weights[i]! * f(nodes[i]!)
  return sum
}
