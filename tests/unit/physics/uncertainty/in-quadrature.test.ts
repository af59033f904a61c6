import { describe, expect, it } from 'vitest'
import { makeBands } from '../../../../shared/physics/uncertainty/band'
import { addBandsInQuadrature, addInQuadrature } from '../../../../shared/physics/uncertainty/in-quadrature'
import { expectClose } from '../close'

// see shared/physics/README.md, "Combining sets" and "Nuclear targets and isospin".
describe('independent uncertainties in quadrature (nuclear ⊕ baseline)', () => {
  it('hand-worked: (+3 −3) ⊕ (+4 −0) = (+5 −3)', () => {
    const nuclear = makeBands([10, 2], [3, 0.3], [3, 0.4])
    const baseline = makeBands([10, 2], [4, 0.4], [0, 0.3])
    const total = addBandsInQuadrature([nuclear, baseline])
    // √(3² + 4²) = 5, √(3² + 0²) = 3; bin 1: √(0.09 + 0.16) = 0.5 both ways
    expectClose(total.plus, [5, 0.5], 1e-14)
    expectClose(total.minus, [3, 0.5], 1e-14)
    expectClose(total.relPlus, [0.5, 0.25], 1e-14)
  })

  it('adds a symmetric α_s error to both sides', () => {
    const band = addInQuadrature(makeBands([10], [3], [0]), [4])
    expectClose(band.plus, [5])
    expectClose(band.minus, [4])
  })

  it.each([
    { bands: [], message: /at least one/ },
    { bands: [makeBands([1], [1], [1]), makeBands([1, 2], [1, 1], [1, 1])], message: /same bins/ },
    { bands: [makeBands([1], [1], [1]), makeBands([1.1], [1], [1])], message: /same prediction/ }
  ])('rejects: $message', ({ bands, message }) => {
    expect(() => addBandsInQuadrature(bands)).toThrow(message)
  })

  it('rejects a negative extra error', () => {
    expect(() => addInQuadrature(makeBands([1], [1], [1]), [-1])).toThrow(/non-negative/)
  })
})
