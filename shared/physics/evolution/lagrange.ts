/**
 * Piecewise Lagrange interpolation in ℓ = ln x on an x grid closed by a node at x = 1 (ℓ = 0)
 * where every momentum density vanishes. It is the representation x-space evolution works in:
 * on the interval [ℓ_j, ℓ_{j+1}] a density is the degree-d polynomial through the d + 1 nodes
 * around that interval.
 */

/**
 * First node of the stencil used on interval j (between nodes j and j + 1) of a grid of
 * `total` nodes (including the closing node at x = 1): the d + 1 nodes centred on the interval,
 * shifted inwards at the ends.
 * @example stencilStart(10, 101, 5) // 8 (nodes 8..13)
 */
export function stencilStart(j: number, total: number, degree: number): number {
  const k0 = j - Math.floor((degree - 1) / 2)
  return Math.max(0, Math.min(k0, total - 1 - degree))
}

/**
 * The ℓ = ln x of the nodes followed by ℓ = 0 for the closing node x = 1.
 * @example closedLogNodes(Float64Array.of(0.1, 0.5)) // [ln 0.1, ln 0.5, 0]
 */
export function closedLogNodes(x: ArrayLike<number>): Float64Array {
  const ell = new Float64Array(x.length + 1)
  for (let i = 0; i < x.length; i++) ell[i] = Math.log(x[i]!)
  ell[x.length] = 0
  return ell
}

/**
 * Values at ℓ of the d + 1 Lagrange basis polynomials on nodes ell[k0..k0+d], written to `out`
 * (out[m] is the basis polynomial of node k0 + m).
 * @example lagrangeBasis(ell, 3, 5, t, out) // out[m] = Π_{n≠m} (t − ℓ_n)/(ℓ_m − ℓ_n)
 */
export function lagrangeBasis(ell: Float64Array, k0: number, degree: number, t: number, out: Float64Array): void {
  for (let m = 0; m <= degree; m++) {
    const lm = ell[k0 + m]!
    let v = 1
    for (let n = 0; n <= degree; n++) {
      if (n === m) continue
      const ln = ell[k0 + n]!
      v *= (t - ln) / (lm - ln)
    }
    out[m] = v
  }
}

/**
 * x·f at arbitrary x from its node values, with the same piecewise Lagrange representation the
 * evolution uses (value 0 at x = 1).
 * @param x nodes (without the closing node), ascending in (0, 1).
 * @param values x·f at the nodes.
 * @param at points in [x[0], 1].
 * @throws RangeError for a point outside [x[0], 1].
 * @example interpolateLogX(grid.x, column, [0.3]) // x·f(0.3)
 */
export function interpolateLogX(x: ArrayLike<number>, values: ArrayLike<number>, at: ArrayLike<number>, degree = 7): Float64Array {
  const ell = closedLogNodes(x)
  const total = ell.length
  const basis = new Float64Array(degree + 1)
  const out = new Float64Array(at.length)
  for (let p = 0; p < at.length; p++) {
    const xv = at[p]!
    if (!(xv >= x[0]! && xv <= 1)) throw new RangeError(`x = ${xv} lies outside the grid [${x[0]}, 1]`)
    const t = Math.log(xv)
    let j = 0
    while (j < total - 2 && ell[j + 1]! < t) j++
    const k0 = stencilStart(j, total, degree)
    lagrangeBasis(ell, k0, degree, t, basis)
    let v = 0
    for (let m = 0; m <= degree; m++) {
      const k = k0 + m
      if (k < x.length) v += basis[m]! * values[k]!
    }
    out[p] = v
  }
  return out
}
