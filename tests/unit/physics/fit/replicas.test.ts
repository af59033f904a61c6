import { describe, expect, it } from 'vitest'
import { replicaParameters } from '~/shared/physics/fit/replicas'

const sigma = [0.02, 0.1, 0.3, 0.05]
const rho = [[1, 0.6, -0.3, 0.1], [0.6, 1, -0.5, 0.2], [-0.3, -0.5, 1, 0], [0.1, 0.2, 0, 1]]
const cov = rho.map((r, i) => r.map((v, j) => v * sigma[i]! * sigma[j]!))
const p0 = [0.7, 3.4, -1, 2.5]

function sampleStats(reps: Float64Array[]) {
  const n = reps.length
  const d = p0.length
  const mean = new Float64Array(d)
  for (const r of reps) r.forEach((v, i) => { mean[i]! += v / n })
  const c = Array.from({ length: d }, () => new Float64Array(d))
  for (const r of reps) for (let i = 0; i < d; i++) for (let j = 0; j < d; j++) c[i]![j]! += ((r[i]! - mean[i]!) * (r[j]! - mean[j]!)) / (n - 1)
  return { mean, c }
}

// see shared/physics/README.md, "Members from a fit"
describe('Monte-Carlo replicas p_r = p₀ + L z_r, C = L Lᵀ', () => {
  const all = replicaParameters(p0, cov, 25600, 7)
  const sizes = [100, 400, 1600, 6400, 25600]
  // Deviations in units of their expected statistical size: σ_i/√N for the mean and
  // √((C_ii C_jj + C_ij²)/N) for a sample covariance element (Gaussian sampling, common practice).
  const rows = sizes.map((n) => {
    const { mean, c } = sampleStats(all.slice(0, n))
    let zMean = 0
    let zCov = 0
    let rmsCov = 0
    for (let i = 0; i < 4; i++) {
      zMean = Math.max(zMean, Math.abs(mean[i]! - p0[i]!) / (sigma[i]! / Math.sqrt(n)))
      for (let j = 0; j < 4; j++) {
        const se = Math.sqrt((cov[i]![i]! * cov[j]![j]! + cov[i]![j]! ** 2) / n)
        zCov = Math.max(zCov, Math.abs(c[i]![j]! - cov[i]![j]!) / se)
        rmsCov += ((c[i]![j]! - cov[i]![j]!) / Math.sqrt(cov[i]![i]! * cov[j]![j]!)) ** 2 / 16
      }
    }
    return { n, zMean, zCov, rmsCov: Math.sqrt(rmsCov) }
  })

  it.each(rows.map(r => [r.n, r]))('with N = %i the sample mean and covariance lie within 4.5σ of p₀ and C', (_n, r) => {
    expect(r.zMean).toBeLessThan(4.5)
    expect(r.zCov).toBeLessThan(4.5)
  })

  it('the covariance error falls as N^(−1/2): fitted log-log slope in [−0.75, −0.25] over N = 100…25600', () => {
    const xs = rows.map(r => Math.log(r.n))
    const ys = rows.map(r => Math.log(r.rmsCov))
    const mx = xs.reduce((s, v) => s + v, 0) / xs.length
    const my = ys.reduce((s, v) => s + v, 0) / ys.length
    const slope = xs.reduce((s, x, i) => s + (x - mx) * (ys[i]! - my), 0) / xs.reduce((s, x) => s + (x - mx) ** 2, 0)
    console.info(`replica covariance convergence: slope ${slope.toFixed(3)}; rms errors ${rows.map(r => r.rmsCov.toExponential(2)).join(', ')}`)
    expect(slope).toBeGreaterThan(-0.75)
    expect(slope).toBeLessThan(-0.25)
  })

  it('is reproducible and prefix-stable: replica r depends only on (seed, r, C)', () => {
    const a = replicaParameters(p0, cov, 10, 2024)
    const b = replicaParameters(p0, cov, 3, 2024)
    expect(Array.from(b[2]!)).toEqual(Array.from(a[2]!))
    expect(Array.from(replicaParameters(p0, cov, 10, 2024)[9]!)).toEqual(Array.from(a[9]!))
    expect(replicaParameters(p0, cov, 1, 2025)[0]![0]).not.toBe(a[0]![0])
  })

  it.each([
    ['a non-symmetric covariance', () => replicaParameters([0, 0], [[1, 0.1], [0.2, 1]], 5, 1), /not symmetric/],
    ['a non-positive-definite covariance', () => replicaParameters([0, 0], [[1, 3], [3, 1]], 5, 1), /not positive definite/],
    ['zero replicas', () => replicaParameters(p0, cov, 0, 1), /replica count/]
  ])('refuses %s', (_label, f, message) => {
    expect(f).toThrow(RangeError)
    expect(f).toThrow(message)
  })
})
