import { EigenvalueDecomposition, Matrix } from 'ml-matrix'
import { describe, expect, it } from 'vitest'
import { computeBands } from '../../../../shared/physics/uncertainty/bands'
import { binCovariance } from '../../../../shared/physics/uncertainty/covariance'
import type { MemberValues } from '../../../../shared/physics/uncertainty/matrix'
import { reduceReplicasToHessian } from '../../../../shared/physics/uncertainty/pca'
import { normalStream } from '../../../../shared/physics/random'
import { expectClose } from '../close'

/** n replicas in `bins` bins: μ_b + Σ_j a_rj·u_jb + noise·z, u_j fixed smooth shapes. */
function structuredReplicas(n: number, bins: number, shapes: number, noise: number, seed: number): MemberValues {
  const normals = normalStream(seed, { purpose: 'synthetic', index: 0 })
  const values = new Float64Array((n + 1) * bins)
  for (let b = 0; b < bins; b++) values[b] = 5 + b
  for (let r = 1; r <= n; r++) {
    const weights = normals.fill(shapes)
    for (let b = 0; b < bins; b++) {
      let x = 5 + b
      for (let j = 0; j < shapes; j++) x += weights[j]! * Math.cos((j + 1) * (b + 0.5) * 0.4) / (j + 1)
      values[r * bins + b] = x + noise * normals.next()
    }
  }
  return { members: n + 1, bins, values }
}

const trace = (values: Float64Array, size: number) => Array.from({ length: size }, (_, i) => values[i * size + i]!).reduce((s, v) => s + v, 0)

describe('replicas → reduced Hessian by principal components', () => {
  const replicas = structuredReplicas(300, 8, 3, 0.05, 17)
  const full = binCovariance(replicas, { kind: 'replicas' })

  it.each([1, 2, 3, 5])('K = %s: the reduced set reproduces the trace fraction it reports', (k) => {
    const reduced = reduceReplicasToHessian(replicas, { components: k })
    expect(reduced.components).toBe(k)
    expect(reduced.kind).toBe('hessian-one-sided')
    expect(reduced.members.members).toBe(k + 1)
    // covariance of the reduced set by the one-sided formula, computed independently of the PCA
    const c = binCovariance(reduced.members, { kind: 'hessian-one-sided' })
    expectClose(trace(c.values, 8) / trace(full.values, 8), reduced.traceFraction, 1e-11)
    // and the reported largest relative shortfall of a diagonal entry
    const shortfall = Math.max(...Array.from({ length: 8 }, (_, b) => (full.values[b * 9]! - c.values[b * 9]!) / full.values[b * 9]!))
    expectClose(reduced.maxRelativeDiagonalDeviation, Math.max(shortfall, 0), 0, 1e-11)
  })

  it('three smooth shapes plus small noise: 3 components carry almost all of the trace', () => {
    const reduced = reduceReplicasToHessian(replicas, { components: 3 })
    expect(reduced.traceFraction).toBeGreaterThan(0.98)
    expect(reduceReplicasToHessian(replicas, { components: 1 }).traceFraction).toBeLessThan(reduced.traceFraction)
  })

  it('keeping every component gives back the replica covariance entry by entry', () => {
    const reduced = reduceReplicasToHessian(replicas, { components: 8 })
    expectClose(reduced.traceFraction, 1, 1e-12)
    expectClose(binCovariance(reduced.members, { kind: 'hessian-one-sided' }).values, full.values, 1e-10, 1e-13)
  })

  it('eigenvalues are those of the replica covariance (ml-matrix on the full matrix), descending', () => {
    const reduced = reduceReplicasToHessian(replicas, { components: 2 })
    const rows = Array.from({ length: 8 }, (_, i) => Array.from(full.values.subarray(i * 8, i * 8 + 8)))
    const expected = new EigenvalueDecomposition(new Matrix(rows), { assumeSymmetric: true }).realEigenvalues.sort((a, b) => b - a)
    expectClose(reduced.eigenvalues, expected, 1e-10, 1e-14)
  })

  it('more bins than replicas: the N × N route gives the same spectrum and covariance', () => {
    const wide = structuredReplicas(6, 12, 4, 0.1, 3)
    const reduced = reduceReplicasToHessian(wide)
    const c = binCovariance(wide, { kind: 'replicas' })
    expect(reduced.components).toBe(5) // N − 1 = 5 non-zero eigenvalues
    expectClose(binCovariance(reduced.members, { kind: 'hessian-one-sided' }).values, c.values, 1e-9, 1e-12)
    const rows = Array.from({ length: 12 }, (_, i) => Array.from(c.values.subarray(i * 12, i * 12 + 12)))
    const expected = new EigenvalueDecomposition(new Matrix(rows), { assumeSymmetric: true }).realEigenvalues.sort((a, b) => b - a)
    expectClose(reduced.eigenvalues.subarray(0, 5), expected.slice(0, 5), 1e-9)
  })

  it('pairs form: the symmetric Hessian band equals the one-sided band of the same components', () => {
    const pairs = reduceReplicasToHessian(replicas, { components: 3, form: 'pairs' })
    const single = reduceReplicasToHessian(replicas, { components: 3 })
    expect(pairs.members.members).toBe(7)
    const a = computeBands(pairs.members, { kind: 'hessian-pairs', prescription: 'hessian-symmetric' })
    const b = computeBands(single.members, { kind: 'hessian-one-sided', prescription: 'one-sided' })
    expectClose(a.plus, b.plus, 1e-13)
  })

  it('trace-fraction target picks the fewest components reaching it', () => {
    const reduced = reduceReplicasToHessian(replicas, { traceFraction: 0.9 })
    expect(reduced.traceFraction).toBeGreaterThanOrEqual(0.9)
    if (reduced.components > 1) {
      expect(reduceReplicasToHessian(replicas, { components: reduced.components - 1 }).traceFraction).toBeLessThan(0.9)
    }
  })

  it.each([
    { options: { components: 0 }, message: /1 to 8/ },
    { options: { components: 9 }, message: /1 to 8/ },
    { options: { traceFraction: 1.5 }, message: /\(0, 1\]/ },
    { options: { components: 2, traceFraction: 0.5 }, message: /not both/ }
  ])('rejects $options', ({ options, message }) => {
    expect(() => reduceReplicasToHessian(replicas, options)).toThrow(message)
  })

  it('rejects replicas without spread', () => {
    const flat = { members: 4, bins: 2, values: new Float64Array(8).fill(1) }
    expect(() => reduceReplicasToHessian(flat)).toThrow(/do not spread/)
  })
})
