import { describe, expect, it } from 'vitest'
import { hessianAsymmetric, hessianOneSided, hessianSymmetric, eigenvectorCount, eigenvectorDeviations } from '../../../../shared/physics/uncertainty/hessian'
import { memberValuesFromRows } from '../../../../shared/physics/uncertainty/matrix'
import { expectClose } from '../close'

// Two bins, two eigenvector pairs (members 1,2 = X₁±; 3,4 = X₂±).
const pairs = memberValuesFromRows([
  [10, 4], // X₀
  [12, 4.5], // X₁⁺
  [9, 3], // X₁⁻
  [10.5, 5], // X₂⁺
  [11, 4] // X₂⁻
])

// see shared/physics/README.md, "Hessian sets"
describe('symmetric Hessian ½√Σ(X⁺−X⁻)² (Pumplin et al. hep-ph/0101032)', () => {
  it.each([
    // bin 0: X⁺−X⁻ = 12−9 = 3 and 10.5−11 = −0.5 → ½√(9 + 0.25) = ½√9.25
    { bin: 0, expected: 0.5 * Math.sqrt(9.25) },
    // bin 1: 4.5−3 = 1.5 and 5−4 = 1 → ½√(2.25 + 1) = ½√3.25
    { bin: 1, expected: 0.5 * Math.sqrt(3.25) }
  ])('bin $bin: hand-worked', ({ bin, expected }) => {
    const band = hessianSymmetric(pairs)
    expectClose(band.plus[bin]!, expected)
    expectClose(band.minus[bin]!, expected)
    expect(band.central[bin]).toBe(pairs.values[bin])
  })
})

describe('asymmetric Hessian (Nadolsky & Sullivan hep-ph/0110378)', () => {
  it.each([
    // bin 0, X₀ = 10: pair 1 shifts (+2, −1) → up 2, down 1; pair 2 shifts (+0.5, +1) → up 1, down 0
    // ΔX⁺ = √(2² + 1²) = √5, ΔX⁻ = √(1² + 0²) = 1
    { bin: 0, plus: Math.sqrt(5), minus: 1 },
    // bin 1, X₀ = 4: pair 1 (+0.5, −1) → up 0.5, down 1; pair 2 (+1, 0) → up 1, down 0
    // ΔX⁺ = √(0.25 + 1) = √1.25, ΔX⁻ = √1 = 1
    { bin: 1, plus: Math.sqrt(1.25), minus: 1 }
  ])('bin $bin: hand-worked', ({ bin, plus, minus }) => {
    const band = hessianAsymmetric(pairs)
    expectClose(band.plus[bin]!, plus)
    expectClose(band.minus[bin]!, minus)
  })

  it('counts both members of a pair on the same side once, through the larger shift', () => {
    // X₀ = 0, X⁺ = 3, X⁻ = 1: both up; max(3, 1, 0) = 3 up, nothing down
    const band = hessianAsymmetric(memberValuesFromRows([[0], [3], [1]]))
    expect(band.plus[0]).toBe(3)
    expect(band.minus[0]).toBe(0)
  })

  it('relative widths are ΔX/|X₀|', () => {
    const band = hessianAsymmetric(pairs)
    expectClose(band.relPlus[0]!, Math.sqrt(5) / 10)
    expectClose(band.relMinus[1]!, 1 / 4)
  })
})

describe('one-sided √Σ(X_k − X₀)² (common practice)', () => {
  it.each([
    // shifts 3, −4, 0 → √(9 + 16 + 0) = 5
    { rows: [[10], [13], [6], [10]], expected: 5 },
    // one eigenvector, shift −2 → 2
    { rows: [[1], [-1]], expected: 2 }
  ])('hand-worked $expected', ({ rows, expected }) => {
    const band = hessianOneSided(memberValuesFromRows(rows))
    expectClose(band.plus[0]!, expected)
    expectClose(band.minus[0]!, expected)
  })
})

describe('member counts and deviations', () => {
  it('d_k = ½(X_k⁺ − X_k⁻) for pairs, X_k − X₀ one-sided', () => {
    expectClose(eigenvectorDeviations(pairs, 'hessian-pairs').values, [1.5, 0.75, -0.25, 0.5])
    expectClose(eigenvectorDeviations(memberValuesFromRows([[1, 2], [4, 0]]), 'hessian-one-sided').values, [3, -2])
  })

  it.each([
    { rows: [[1], [2]], kind: 'hessian-pairs' as const, message: /even number/ },
    { rows: [[1], [2], [3], [4]], kind: 'hessian-pairs' as const, message: /even number/ },
    { rows: [[1]], kind: 'hessian-one-sided' as const, message: /at least 2/ },
    { rows: [[1], [2], [3]], kind: 'replicas' as const, message: /no eigenvectors/ }
  ])('rejects $rows.length members as $kind', ({ rows, kind, message }) => {
    expect(() => eigenvectorCount(memberValuesFromRows(rows), kind)).toThrow(RangeError)
    expect(() => eigenvectorCount(memberValuesFromRows(rows), kind)).toThrow(message)
  })

  it('does not touch its input', () => {
    const before = Float64Array.from(pairs.values)
    hessianSymmetric(pairs)
    hessianAsymmetric(pairs)
    expect(pairs.values).toEqual(before)
  })
})
