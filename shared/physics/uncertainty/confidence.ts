/**
 * Confidence levels and Gaussian quantiles: how far out a band at a given CL reaches, and the
 * factor that rescales a band from one CL to another.
 */
import jStat from 'jstat'

/**
 * The CL, in percent, that the trade writes as "68%" and means one Gaussian standard deviation:
 * 100·erf(1/√2) = 68.2689492…% (common practice). `sigmaMultiple(68)` is exactly 1 for this reason.
 * @example sigmaMultiple(ONE_SIGMA_CL_PERCENT) // 1
 */
export const ONE_SIGMA_CL_PERCENT = 68

/**
 * Two-sided Gaussian quantile z for a central confidence level: P(|Z| ≤ z) = CL for Z standard
 * normal, i.e. z = Φ⁻¹((1 + CL/100)/2).
 *
 * Unit: `clPercent` in percent; result in standard deviations (dimensionless).
 * Domain: 0 < clPercent < 100. The value 68 is read as the one-sigma level (68.27%) and returns
 * exactly 1 (see ONE_SIGMA_CL_PERCENT); any other value is taken literally.
 * Method: jstat's normal.inv (inverse complementary error function); relative accuracy ~1e-15
 * (checked in the tests against printed tables).
 * @throws RangeError outside the domain.
 * @example sigmaMultiple(90) // 1.6448536269514724
 * @example sigmaMultiple(95) // 1.9599639845400545
 */
export function sigmaMultiple(clPercent: number): number {
  assertCl(clPercent, 'confidence level')
  if (clPercent === ONE_SIGMA_CL_PERCENT) return 1
  return jStat.normal.inv(0.5 + clPercent / 200, 0, 1)
}

/**
 * Factor that turns a Gaussian band at `clFrom` into one at `clTo`: z(clTo)/z(clFrom), with z from
 * `sigmaMultiple`. Multiply half-widths (ΔX) by it, covariances by its square.
 *
 * Unit: CLs in percent; result dimensionless. Domain: both in (0, 100).
 * Method: ratio of two jstat quantiles; assumes the quantity is Gaussian-distributed, which is
 * how sets published at 90% CL are brought to 68% (common practice).
 * @throws RangeError outside the domain.
 * @example clScaleFactor(90, 68) // 0.6079568319117691 = 1/1.6448536…
 */
export function clScaleFactor(clFrom: number, clTo: number): number {
  assertCl(clFrom, 'confidence level of the set (clFrom)')
  assertCl(clTo, 'requested confidence level (clTo)')
  if (clFrom === clTo) return 1
  return sigmaMultiple(clTo) / sigmaMultiple(clFrom)
}

/**
 * The central probability content, as a fraction, that a band at `clPercent` covers: CL/100,
 * except that 68 is read as one Gaussian standard deviation, erf(1/√2) = 0.682689492… (the
 * convention of ONE_SIGMA_CL_PERCENT; see shared/physics/README.md, "Confidence levels"). A
 * replica set's percentile interval at 68 % therefore runs from the 15.87th to the 84.13th
 * percentile, and at 90 % from the 5th to the 95th.
 *
 * Unit: `clPercent` in percent; result dimensionless in (0, 1).
 * Method: 2Φ(1) − 1 with jstat's normal CDF for 68; exact division otherwise.
 * @throws RangeError outside (0, 100).
 * @example coverageFraction(90) // 0.9
 * @example coverageFraction(68) // 0.6826894921370859
 */
export function coverageFraction(clPercent: number): number {
  assertCl(clPercent, 'confidence level')
  if (clPercent === ONE_SIGMA_CL_PERCENT) return 2 * jStat.normal.cdf(1, 0, 1) - 1
  return clPercent / 100
}

/**
 * The lower and upper percentiles (in percent) of the central interval at `clPercent`:
 * 50 ∓ 50·coverageFraction(clPercent).
 * @example centralPercentiles(90) // [5, 95]
 * @example centralPercentiles(68) // [15.865525…, 84.134474…]
 */
export function centralPercentiles(clPercent: number): [number, number] {
  const c = coverageFraction(clPercent)
  return [50 * (1 - c), 50 * (1 + c)]
}

function assertCl(clPercent: number, what: string): void {
  if (!Number.isFinite(clPercent) || clPercent <= 0 || clPercent >= 100) {
    throw new RangeError(`The ${what} must be a percentage strictly between 0 and 100 (e.g. 68 or 90); got ${clPercent}.`)
  }
}
