import { describe, expect, it } from 'vitest'
import { chi2Profile, effectiveReplicas, replicaChi2, reweight, reweightingWeights, weightedMoments } from '../../../../shared/physics/impact'
import { chiSquare, memberValuesFromRows, replicaMoments, type MemberValues } from '../../../../shared/physics/uncertainty'
import { expectClose } from '../close'
import { DATA, DATA_COVARIANCE, posterior, toyReplicas } from './gaussian-toy'

const measurement = { values: DATA, covariance: { size: 4, values: Float64Array.from(DATA_COVARIANCE.to1DArray()) } }

describe('replica reweighting', () => {
  it('takes each replica\'s χ² with the full covariance, as chiSquare does', () => {
    const { predictions } = toyReplicas(5)
    const chi2 = replicaChi2(predictions, measurement)
    for (let k = 1; k <= 5; k++) {
      const row = predictions.values.subarray(k * 4, (k + 1) * 4)
      expectClose(chi2[k - 1]!, chiSquare(measurement, row).chi2, 1e-12)
    }
  })

  it('weighs by χ^{n−1}e^{−χ²/2} (arXiv:1012.0836) or e^{−χ²/2} (hep-ph/9803393), normalised to Σw = N', () => {
    // By hand, n = 3 points: (χ²)^{(n−1)/2} e^{−χ²/2} = χ² e^{−χ²/2}: 1·e^{−1/2} and 4·e^{−2}, scaled to sum 2.
    const a = Math.exp(-0.5)
    const b = 4 * Math.exp(-2)
    expectClose(reweightingWeights([1, 4], 3), [2 * a / (a + b), 2 * b / (a + b)], 1e-14)
    const c = Math.exp(-2) // e^{−χ²/2} at χ² = 4
    expectClose(reweightingWeights([1, 4], 3, 'likelihood'), [2 * a / (a + c), 2 * c / (a + c)], 1e-14)
    // χ² of thousands: no overflow, the best replica keeps its weight.
    const w = reweightingWeights([5000, 5001, 7000], 10, 'likelihood')
    expectClose(w[1]! / w[0]!, Math.exp(-0.5), 1e-12)
    expect(w[2]).toBe(0)
  })

  it('gives N_eff on hand-worked weights (arXiv:1012.0836)', () => {
    // w = (2, 1, 1, 0), N = 4: N_eff = exp{¼[2 ln(4/2) + 1·ln 4 + 1·ln 4 + 0]} = exp{¼·6 ln 2} = 2^{3/2}.
    expectClose(effectiveReplicas([2, 1, 1, 0]), 2 ** 1.5, 1e-14)
    // Equal weights w_k = 1: each term is 1·ln(N/1), so N_eff = exp{(1/N)·N ln N} = N.
    expectClose(effectiveReplicas([1, 1, 1, 1, 1]), 5, 1e-14)
    // All on one replica: w = (3, 0, 0): exp{⅓·3 ln 1} = 1.
    expectClose(effectiveReplicas([3, 0, 0]), 1, 1e-14)
  })

  // Check: importance weights e^{−χ²/2} turn prior replicas into posterior ones (W. T. Giele and
  // S. Keller, hep-ph/9803393), so the weighted mean and covariance of the parameters converge
  // to the closed-form posterior (C. M. Bishop, PRML, §2.3.3) with an error of order σ/√N_eff
  // (the standard error of an importance-sampling estimate, common practice). The χ^{n−1} factor
  // of arXiv:1012.0836 weighs by the density of χ instead of the likelihood and does not give this
  // posterior, so the check uses the likelihood weights.
  it('converges to the closed-form Gaussian posterior within a few σ/√N_eff (fixed seed)', () => {
    const { parameters, predictions } = toyReplicas(20000)
    const chi2 = replicaChi2(predictions, measurement)
    const weights = reweightingWeights(chi2, 4, 'likelihood')
    const nEff = effectiveReplicas(weights)
    expect(nEff).toBeGreaterThan(1000)
    expect(nEff).toBeLessThan(20000)
    const { mean, covariance } = posterior()
    const { mean: wMean } = weightedMoments(parameters, weights)
    const wCov = weightedCovariance(parameters, weights)
    for (let a = 0; a < 3; a++) {
      const sd = Math.sqrt(covariance[a]![a]!)
      expect(Math.abs(wMean[a]! - mean[a]!)).toBeLessThan(4 * sd / Math.sqrt(nEff))
      for (let b = 0; b < 3; b++) {
        // Standard error of a Gaussian sample covariance entry: √((Σ_aa Σ_bb + Σ_ab²)/N) (common practice).
        const se = Math.sqrt((covariance[a]![a]! * covariance[b]![b]! + covariance[a]![b]! ** 2) / nEff)
        expect(Math.abs(wCov[a]![b]! - covariance[a]![b]!)).toBeLessThan(4 * se)
      }
    }
  })

  it('reports N_eff, χ² before and after, and a warning when few replicas are left', () => {
    const { predictions } = toyReplicas(200)
    const result = reweight(predictions, measurement)
    expect(result.replicas).toBe(200)
    expect(result.form).toBe('chi2-pdf')
    expectClose(result.effectiveReplicas, effectiveReplicas(result.weights), 1e-15)
    expect(result.chi2After).toBeLessThan(result.chi2Before)
    // Before reweighting the band is the plain replica mean ± sd.
    expectClose(result.before.central, replicaMoments(predictions).mean, 1e-13)
    expect(result.warning === null).toBe(result.effectiveReplicas >= 20)
    // Data with 0.1% errors pick out very few replicas.
    const tight = reweight(predictions, { values: DATA, stat: DATA.map(d => 0.001 * d) }, { form: 'likelihood' })
    expect(tight.effectiveReplicas).toBeLessThan(10)
    expect(tight.warning).toMatch(/^Only \d+\.\d of 200 replicas are effectively left after reweighting/)
  })

  it('weighted moments with equal weights are the sample mean and 1/(N−1) variance', () => {
    const m = memberValuesFromRows([[0, 1], [1, 2], [3, 2], [2, 5]])
    const { mean, variance } = weightedMoments(m, [1, 1, 1])
    // Mean of 1, 3, 2 = 2; variance ((1)² + (1)² + 0)/2 = 1. Mean of 2, 2, 5 = 3; variance (1 + 1 + 4)/2 = 3.
    expectClose(mean, [2, 3], 1e-15)
    expectClose(variance, [1, 3], 1e-15)
  })

  it('χ² profile P(α) peaks at α = √(χ²/n) (arXiv:1012.0836, from memory) and has unit area', () => {
    // ln P = −n ln α − χ²/(2α²) + const; d/dα = 0 ⇒ α² = χ²/n (calculus). χ² = 4n ⇒ α = 2.
    const alphas = Array.from({ length: 401 }, (_, i) => 0.5 + i * 0.01)
    const profile = chi2Profile([40, 40, 40], 10, alphas)
    expectClose(profile.mostProbableAlpha, 2, 1e-12)
    let area = 0
    for (let i = 1; i < alphas.length; i++) area += 0.5 * (profile.density[i]! + profile.density[i - 1]!) * 0.01
    expectClose(area, 1, 1e-12)
    expect(() => chi2Profile([1], 1, [1, 0.5])).toThrow(/increasing numbers > 0; value 2 is 0.5/)
  })

  it.each([
    [[1, -1], /χ² of replica 2 must be a finite number ≥ 0; got -1/],
    [[], /No replicas to weigh/]
  ])('refuses bad χ² values %j', (chi2, message) => {
    expect(() => reweightingWeights(chi2, 3)).toThrow(message)
  })

  it('refuses a measurement of another length', () => {
    const { predictions } = toyReplicas(3)
    expect(() => replicaChi2(predictions, { values: [1, 2], stat: [1, 1] })).toThrow(/4 bins but the measurement has 2 points/)
  })
})

/** Weighted sample covariance (reliability weights, common practice), written out independently. */
function weightedCovariance(m: MemberValues, w: ArrayLike<number>): number[][] {
  const v1 = Array.from(w).reduce((s, x) => s + x, 0)
  const v2 = Array.from(w).reduce((s, x) => s + x * x, 0)
  const mean = [0, 1, 2].map(a => Array.from(w).reduce((s, x, k) => s + x * m.values[(k + 1) * 3 + a]!, 0) / v1)
  return [0, 1, 2].map(a => [0, 1, 2].map(b => Array.from(w).reduce((s, x, k) =>
    s + x * (m.values[(k + 1) * 3 + a]! - mean[a]!) * (m.values[(k + 1) * 3 + b]! - mean[b]!), 0) / (v1 - v2 / v1)))
}
