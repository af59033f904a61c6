/**
 * Compensated (Neumaier) summation, used for every sum over members in `uncertainty/`.
 */

/**
 * Running sum with Neumaier's improvement of Kahan compensation (A. Neumaier, Z. Angew. Math.
 * Mech. 54 (1974) 39): the rounding error of each addition is collected separately, so the
 * error bound is about 2ε·Σ|x_i| independent of the number of terms, and it stays correct when
 * an addend is larger than the running sum (where plain Kahan fails).
 *
 * Unit: that of the addends.
 * @example const s = new NeumaierSum(); s.add(1e100); s.add(1); s.add(-1e100); s.value // 1
 */
export class NeumaierSum {
  private sum = 0
  private compensation = 0

  /** Adds one term. */
  add(x: number): void {
    const t = this.sum + x
    if (Math.abs(this.sum) >= Math.abs(x)) this.compensation += (this.sum - t) + x
    else this.compensation += (x - t) + this.sum
    this.sum = t
  }

  /** The compensated total so far. */
  get value(): number {
    return this.sum + this.compensation
  }
}

/**
 * Σ x_i by Neumaier summation (see NeumaierSum). Empty input sums to 0.
 * @example neumaierSum([1e100, 1, -1e100]) // 1 (plain summation gives 0)
 */
export function neumaierSum(values: ArrayLike<number>): number {
  const s = new NeumaierSum()
  for (let i = 0; i < values.length; i++) s.add(values[i]!)
  return s.value
}
