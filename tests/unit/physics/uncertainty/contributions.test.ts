import { describe, expect, it } from 'vitest'
import { eigenvectorContributions } from '../../../../shared/physics/uncertainty/contributions'
import { hessianSymmetric } from '../../../../shared/physics/uncertainty/hessian'
import { memberValuesFromRows } from '../../../../shared/physics/uncertainty/matrix'
import { expectClose } from '../close'

const pairs = memberValuesFromRows([[10, 4], [12, 4.5], [9, 3], [10.5, 5], [11, 4]])

describe('per-eigenvector contributions', () => {
  it.each([
    // bin 0: d = ½(12 − 9) = 1.5, ½(10.5 − 11) = −0.25; Σd² = 2.3125 → fractions 2.25/2.3125, 0.0625/2.3125
    { bin: 0, signed: [1.5, -0.25], fraction: [2.25 / 2.3125, 0.0625 / 2.3125], total: Math.sqrt(2.3125) },
    // bin 1: d = 0.75, 0.5; Σd² = 0.8125
    { bin: 1, signed: [0.75, 0.5], fraction: [0.5625 / 0.8125, 0.25 / 0.8125], total: Math.sqrt(0.8125) }
  ])('bin $bin: hand-worked', ({ bin, signed, fraction, total }) => {
    const c = eigenvectorContributions(pairs, bin, { kind: 'hessian-pairs' })
    expect(Array.from(c.eigenvector)).toEqual([1, 2])
    expectClose(c.signed, signed)
    expectClose(c.fraction, fraction, 1e-14)
    expectClose(c.total, total, 1e-14)
    expectClose(c.fraction.reduce((s, f) => s + f, 0), 1, 1e-15)
    expectClose(c.total, hessianSymmetric(pairs).plus[bin]!, 1e-14)
  })

  it('one-sided: shifts X_k − X₀, rescaled to 68% CL', () => {
    const c = eigenvectorContributions(memberValuesFromRows([[10], [13], [6]]), 0, { kind: 'hessian-one-sided', clFrom: 90 })
    expectClose(c.signed, [3 / 1.644854, -4 / 1.644854], 5e-7) // 90% quantile from printed tables (from memory)
    expectClose(c.fraction, [9 / 25, 16 / 25], 1e-14)
  })

  it('refuses replica sets and missing bins', () => {
    expect(() => eigenvectorContributions(memberValuesFromRows([[0], [1], [2]]), 0, { kind: 'replicas' })).toThrow(/reduce them/)
    expect(() => eigenvectorContributions(pairs, 2, { kind: 'hessian-pairs' })).toThrow(/Bin 2 does not exist/)
  })
})
