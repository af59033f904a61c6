import { describe, expect, it } from 'vitest'
import { makeBands } from '../../../../shared/physics/uncertainty/band'
import { bandEnvelope } from '../../../../shared/physics/uncertainty/envelope'
import { expectClose } from '../close'

// Envelope (common practice): lower = min of lows, upper = max of highs, central = midpoint.
describe('envelope of several bands', () => {
  it('hand-worked', () => {
    // set A: 10 ± 1 → [9, 11]; set B: 11 +2 −0.5 → [10.5, 13]; set C: 9.5 ± 0.2 → [9.3, 9.7]
    // lower 9, upper 13 → central 11, half-width 2
    const env = bandEnvelope([makeBands([10], [1], [1]), makeBands([11], [2], [0.5]), makeBands([9.5], [0.2], [0.2])])
    expectClose(env.central, [11], 1e-14)
    expectClose(env.plus, [2], 1e-14)
    expectClose(env.minus, [2], 1e-14)
  })

  it('of one band is that band made symmetric about its midpoint', () => {
    const env = bandEnvelope([makeBands([10], [3], [1])])
    expectClose([env.central[0]!, env.plus[0]!], [11, 2])
  })

  it('rejects bands of different bins, or none', () => {
    expect(() => bandEnvelope([])).toThrow(/at least one/)
    expect(() => bandEnvelope([makeBands([1], [1], [1]), makeBands([1, 1], [1, 1], [1, 1])])).toThrow(/same bins/)
  })
})
