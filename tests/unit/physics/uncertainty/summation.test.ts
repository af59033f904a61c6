import { describe, expect, it } from 'vitest'
import { NeumaierSum, neumaierSum } from '../../../../shared/physics/uncertainty/summation'

// Neumaier, Z. Angew. Math. Mech. 54 (1974) 39; the test sums are the textbook cases where plain
// and Kahan summation lose the small terms (common practice).
describe('Neumaier summation', () => {
  it.each([
    { terms: [1, 1e100, 1, -1e100], expected: 2 },
    { terms: [1e100, 1, -1e100], expected: 1 },
    { terms: [], expected: 0 }
  ])('Σ $terms = $expected', ({ terms, expected }) => {
    expect(neumaierSum(terms)).toBe(expected)
  })

  it('sums 10⁶ copies of 0.1 to the correctly rounded 100000 (plain summation is off by ~1e-6)', () => {
    const s = new NeumaierSum()
    let plain = 0
    for (let i = 0; i < 1_000_000; i++) {
      s.add(0.1)
      plain += 0.1
    }
    expect(Math.abs(s.value - 100000)).toBeLessThan(1e-10)
    expect(Math.abs(plain - 100000)).toBeGreaterThan(1e-7)
  })
})
