/**
 * x integrals of gridded momentum densities, for checking the momentum and valence sum rules
 * after evolution (see shared/physics/README.md, "Sum rules"):
 * ∫₀¹ x(Σ + g) dx = 1, ∫(u − ū) = 2, ∫(d − d̄) = 1, ∫(s − s̄) = 0.
 */
import { EVOLVED_FLAVOURS, N_SLOTS, quarkSlots } from '../input/flavours'
import type { MemberGrid } from '../types'
import { closedLogNodes, lagrangeBasis, stencilStart } from './lagrange'
import { gaussLegendre } from '../quadrature'

/**
 * ∫₀¹ F(x) x^{p−1} dx for momentum-density node values F = x·f: p = 1 gives the momentum
 * integral ∫ x f dx, p = 0 the number integral ∫ f dx.
 *
 * Method: on [x₀, 1] the piecewise Lagrange interpolant in ln x of the evolution (value 0 at
 * x = 1) integrated with 10-point Gauss–Legendre per interval; below x₀ a power law
 * F ∝ x^{−λ} fitted to the two smallest nodes, integrated analytically (F₀x₀^p/(p − λ)).
 * Accuracy: ~1e-7 relative on [x₀, 1] for smooth shapes on 100+ nodes; the tail estimate is good
 * to a few per cent of itself, so choose x₀ small enough that the tail is negligible.
 * @throws RangeError when the tail integral diverges (λ ≥ p) or p is not 0 or 1.
 * @example integrateX(grid.x, column, 1) // momentum fraction carried by that column
 */
export function integrateX(x: ArrayLike<number>, values: ArrayLike<number>, p: 0 | 1, degree = 7): number {
  const parts = integrateXParts(x, values, p, degree)
  return parts.grid + parts.tail
}

/**
 * The two parts of `integrateX`: `grid` = ∫ over [x₀, 1] of the interpolant, `tail` = the
 * power-law estimate of ∫ over [0, x₀] (0 when F(x₀) = 0), so that a caller can say how much of
 * an integral lies below the grid.
 * @throws RangeError as integrateX.
 * @example integrateXParts(grid.x, column, 1).tail // the estimated part below the first node
 */
export function integrateXParts(x: ArrayLike<number>, values: ArrayLike<number>, p: 0 | 1, degree = 7): { grid: number, tail: number } {
  if (p !== 0 && p !== 1) throw new RangeError(`integrateX takes p = 0 (number) or 1 (momentum); got ${p}`)
  if (values.length !== x.length) throw new RangeError(`${values.length} values for ${x.length} x nodes`)
  const ell = closedLogNodes(x)
  const total = ell.length
  const { nodes, weights } = gaussLegendre(10)
  const basis = new Float64Array(degree + 1)
  let sum = 0
  for (let j = 0; j < total - 1; j++) {
    const a = ell[j]!
    const b = ell[j + 1]!
    const half = 0.5 * (b - a)
    const mid = 0.5 * (a + b)
    const k0 = stencilStart(j, total, degree)
    for (let q = 0; q < nodes.length; q++) {
      const t = mid + half * nodes[q]!
      lagrangeBasis(ell, k0, degree, t, basis)
      let f = 0
      for (let m = 0; m <= degree; m++) {
        const k = k0 + m
        if (k < x.length) f += basis[m]! * values[k]!
      }
      sum += half * weights[q]! * f * (p === 1 ? Math.exp(t) : 1)
    }
  }
  const f0 = values[0]!
  const f1 = values[1]!
  let tail = 0
  if (f0 !== 0) {
    const x0 = x[0]!
    const lambda = f1 !== 0 && Math.sign(f1) === Math.sign(f0) ? -Math.log(f1 / f0) / Math.log(x[1]! / x0) : 0
    if (!(p - lambda > 0)) {
      throw new RangeError(`the integral below x = ${x0} diverges: x·f grows like x^${(-lambda).toFixed(3)} there`)
    }
    tail = (f0 * Math.pow(x0, p)) / (p - lambda)
  }
  return { grid: sum, tail }
}

/** Sum-rule integrals of one Q² slice of a member grid. */
export interface GridSumRules {
  /** ∫₀¹ x Σ_i f_i dx over all flavours and the gluon (1 for a proton). */
  momentum: number
  /** ∫(u − ū) dx (2 for a proton). */
  uValence: number
  /** ∫(d − d̄) dx (1 for a proton). */
  dValence: number
  /** ∫(s − s̄) dx (0). */
  sValence: number
}

/**
 * The momentum and valence integrals of a member grid at Q² node `iq` (see `integrateX`).
 * The grid must carry the 13 evolved flavours in EVOLVED_FLAVOURS order.
 * @throws RangeError for another flavour layout or iq out of range.
 * @example gridSumRules(grid, grid.q2.length - 1).momentum // ≈ 1
 */
export function gridSumRules(grid: MemberGrid, iq: number, degree = 7): GridSumRules {
  if (grid.flavours.length !== N_SLOTS || grid.flavours.some((f, i) => f !== EVOLVED_FLAVOURS[i])) {
    throw new RangeError('gridSumRules needs the 13 evolved flavours −6…−1, 1…6, 21 in that order')
  }
  if (!Number.isInteger(iq) || iq < 0 || iq >= grid.q2.length) throw new RangeError(`Q² node ${iq} is outside 0..${grid.q2.length - 1}`)
  const nx = grid.x.length
  const column = (slot: number) => {
    const c = new Float64Array(nx)
    for (let ix = 0; ix < nx; ix++) c[ix] = grid.values[(iq * nx + ix) * N_SLOTS + slot]!
    return c
  }
  const total = new Float64Array(nx)
  for (let s = 0; s < N_SLOTS; s++) column(s).forEach((v, ix) => { total[ix]! += v })
  const valence = (q: number) => {
    const { quark, anti } = quarkSlots(q)
    const a = column(quark)
    const b = column(anti)
    return integrateX(grid.x, a.map((v, i) => v - b[i]!), 0, degree)
  }
  return { momentum: integrateX(grid.x, total, 1, degree), uValence: valence(2), dValence: valence(1), sValence: valence(3) }
}
