import { describe, expect, it } from 'vitest'
import { computeBands, isPrescription, PRESCRIPTIONS, PRESCRIPTIONS_BY_KIND, prescriptionsFor } from '../../../../shared/physics/uncertainty/bands'
import { memberValuesFromRows } from '../../../../shared/physics/uncertainty/matrix'
import { expectClose } from '../close'

// 1 eigenvector pair + α_s members 3 (down) and 4 (up).
const hessian = memberValuesFromRows([[10], [11], [9], [9.4], [10.2]])
const z90 = 1.644854 // two-sided 90% Gaussian quantile, printed tables (from memory)

describe('computeBands dispatch', () => {
  it('lists the valid prescriptions of each kind', () => {
    expect(prescriptionsFor('hessian-pairs')).toEqual(['hessian-symmetric', 'hessian-asymmetric'])
    expect(prescriptionsFor('hessian-one-sided')).toEqual(['one-sided'])
    expect(prescriptionsFor('replicas')).toEqual(['replica-sd', 'replica-68-interval'])
    expect(Object.values(PRESCRIPTIONS_BY_KIND).flat().sort()).toEqual([...PRESCRIPTIONS].sort())
    expect(isPrescription('replica-sd')).toBe(true)
    expect(isPrescription('envelope')).toBe(false)
  })

  it('symmetric Hessian with α_s members set aside and added in quadrature', () => {
    // PDF: ½|11 − 9| = 1; α_s: ½|10.2 − 9.4| = 0.4; total √(1 + 0.16) = √1.16
    const band = computeBands(hessian, { kind: 'hessian-pairs', prescription: 'hessian-symmetric', alphasMembers: [3, 4] })
    expectClose(band.pdf.plus, [1], 1e-14)
    expectClose(band.alphas!, [0.4], 1e-14)
    expectClose(band.plus, [Math.sqrt(1.16)], 1e-14)
    expectClose(band.minus, [Math.sqrt(1.16)], 1e-14)
    expect(band.clPercent).toBe(68)
  })

  it('rescales a 90% CL set to 68% by 1/1.644854, α_s at the set CL by default', () => {
    const band = computeBands(hessian, { kind: 'hessian-pairs', prescription: 'hessian-symmetric', clFrom: 90, clTo: 68, alphasMembers: [3, 4] })
    expectClose(band.plus, [Math.sqrt(1.16) / z90], 5e-7)
    const alphas68 = computeBands(hessian, { kind: 'hessian-pairs', prescription: 'hessian-symmetric', clFrom: 90, alphasMembers: [3, 4], alphasCl: 68 })
    expectClose(alphas68.plus, [Math.sqrt(1 / z90 ** 2 + 0.16)], 5e-7)
  })

  it('CL round trip 90 → 68 → 90 returns the native band', () => {
    const native = computeBands(hessian, { kind: 'hessian-pairs', prescription: 'hessian-asymmetric', alphasMembers: [3, 4], clFrom: 90, clTo: 90 })
    const at68 = computeBands(hessian, { kind: 'hessian-pairs', prescription: 'hessian-asymmetric', alphasMembers: [3, 4], clFrom: 90, clTo: 68 })
    const back = computeBands(
      memberValuesFromRows([[10], [10 + at68.plus[0]!], [10 - at68.minus[0]!]]),
      { kind: 'hessian-pairs', prescription: 'hessian-asymmetric', clFrom: 68, clTo: 90 }
    )
    expectClose(back.plus, native.plus, 1e-14)
    expectClose(back.minus, native.minus, 1e-14)
  })

  it.each([
    // one-sided: shifts 3 and −4 → 5
    { rows: [[10], [13], [6]], kind: 'hessian-one-sided' as const, prescription: 'one-sided' as const, central: 10, plus: 5, minus: 5 },
    // replicas 1..4: mean 2.5, sd √(5/3)
    { rows: [[0], [1], [2], [3], [4]], kind: 'replicas' as const, prescription: 'replica-sd' as const, central: 2.5, plus: Math.sqrt(5 / 3), minus: Math.sqrt(5 / 3) },
    // replicas 1..4: median 2.5, 1σ percentiles p = 0.158655 → h = 0.47597 (Hyndman–Fan 7,
    // hand-worked): plus = minus = 1.5 − 0.47597 = 1.02403
    { rows: [[0], [1], [2], [3], [4]], kind: 'replicas' as const, prescription: 'replica-68-interval' as const, central: 2.5, plus: 1.5 - 3 * 0.15865525393145707, minus: 1.5 - 3 * 0.15865525393145707 }
  ])('$prescription: hand-worked', ({ rows, kind, prescription, central, plus, minus }) => {
    const band = computeBands(memberValuesFromRows(rows), { kind, prescription })
    expectClose([band.central[0]!, band.plus[0]!, band.minus[0]!], [central, plus, minus], 1e-13)
    expect(band.alphas).toBeNull()
  })

  it('replica percentile interval at 90% CL comes from the 5th and 95th percentiles, not a Gaussian rescaling', () => {
    // skewed replicas 1..20 and 100: sorted, Q(p) with h = 20p (Hyndman–Fan 7)
    // Q(0.05) = x(1) = 2, Q(0.5) = x(10) = 11, Q(0.95) = x(19) = 20 (0-based order statistics)
    const rows = [[0], ...Array.from({ length: 20 }, (_, i) => [i + 1]), [100]]
    const band = computeBands(memberValuesFromRows(rows), { kind: 'replicas', prescription: 'replica-68-interval', clFrom: 68, clTo: 90 })
    expectClose([band.central[0]!, band.plus[0]!, band.minus[0]!], [11, 9, 9], 1e-13)
    expect(band.interval).toMatchObject({ rule: 'percentile', label: 'percentile 5–95 %' })
    expectClose(band.interval.percentiles!, [5, 95], 1e-14)
    // the old rule (68% interval × 1.644854) would have given minus = (11 − Q(0.158655)) · 1.645 ≈ 12.9
    expect(band.minus[0]!).toBeLessThan(10)
    const at68 = computeBands(memberValuesFromRows(rows), { kind: 'replicas', prescription: 'replica-68-interval' })
    expect(at68.interval.label).toBe('percentile 15.87–84.13 %')
  })

  it('labels a Hessian band rescaled by the Gaussian quantile ratio', () => {
    const band = computeBands(hessian, { kind: 'hessian-pairs', prescription: 'hessian-symmetric', clFrom: 68, clTo: 90, alphasMembers: [3, 4] })
    expect(band.interval).toMatchObject({ rule: 'gaussian', label: 'Hessian, rescaled from 68 % to 90 % CL (Gaussian)', fromClPercent: 68 })
    expectClose(band.interval.factor!, z90, 5e-7)
    expectClose(band.pdf.plus, [z90], 5e-7)
    const native = computeBands(hessian, { kind: 'hessian-pairs', prescription: 'hessian-symmetric', clFrom: 90, clTo: 90 })
    expect(native.interval.label).toBe("Hessian at the set's 90 % CL")
    const sd = computeBands(memberValuesFromRows([[0], [1], [2], [3], [4]]), { kind: 'replicas', prescription: 'replica-sd', clTo: 90 })
    expect(sd.interval.label).toBe('replica standard deviation, rescaled from 68 % to 90 % CL (Gaussian)')
  })

  it('refuses a prescription that does not fit the kind, naming the valid ones', () => {
    expect(() => computeBands(hessian, { kind: 'hessian-pairs', prescription: 'replica-sd' })).toThrow(/use one of: hessian-symmetric, hessian-asymmetric/)
    // @ts-expect-error an unknown name as it could arrive from user input
    expect(() => computeBands(hessian, { kind: 'hessian-pairs', prescription: 'widest' })).toThrow(/unknown name/)
  })

  it('refuses a member count that does not fit the kind once α_s members are set aside', () => {
    // central + 1 pair + 1 stray member
    const odd = memberValuesFromRows([[10], [11], [9], [9.5]])
    expect(() => computeBands(odd, { kind: 'hessian-pairs', prescription: 'hessian-symmetric' })).toThrow(/even number/)
    // the same member given as α_s down and up
    expect(() => computeBands(hessian, { kind: 'hessian-pairs', prescription: 'hessian-symmetric', alphasMembers: [3, 3] })).toThrow(/twice/)
  })

  it('does not touch its input', () => {
    const before = Float64Array.from(hessian.values)
    computeBands(hessian, { kind: 'hessian-pairs', prescription: 'hessian-symmetric', alphasMembers: [3, 4], clFrom: 90 })
    expect(hessian.values).toEqual(before)
  })
})
