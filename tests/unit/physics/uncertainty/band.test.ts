import { describe, expect, it } from 'vitest'
import { bandRows, makeBands, scaleBands } from '../../../../shared/physics/uncertainty/band'
import { expectClose } from '../close'

describe('bands', () => {
  it('relative widths are half-widths over |central|, NaN at zero', () => {
    const band = makeBands([10, -4, 0], [1, 1, 1], [2, 2, 2])
    expectClose(band.relPlus.subarray(0, 2), [0.1, 0.25])
    expectClose(band.relMinus.subarray(0, 2), [0.2, 0.5])
    expect(band.relPlus[2]).toBeNaN()
  })

  it('scales half-widths only, into new arrays', () => {
    const band = makeBands([10], [1], [2])
    const half = scaleBands(band, 0.5)
    expectClose([half.central[0]!, half.plus[0]!, half.minus[0]!, half.relMinus[0]!], [10, 0.5, 1, 0.1])
    expect(band.plus[0]).toBe(1)
  })

  it('gives one plain object per bin', () => {
    expect(bandRows(makeBands([10], [1], [2]))).toEqual([{ central: 10, plus: 1, minus: 2, relPlus: 0.1, relMinus: 0.2 }])
  })

  it.each([
    { args: [[], [], []], message: /at least one bin/ },
    { args: [[1], [1, 2], [1]], message: /differ in length/ },
    { args: [[1], [-1], [1]], message: /non-negative/ }
  ])('rejects $message', ({ args, message }) => {
    expect(() => makeBands(args[0]!, args[1]!, args[2]!)).toThrow(message)
  })

  it('rejects a negative scale factor', () => {
    expect(() => scaleBands(makeBands([1], [1], [1]), -2)).toThrow(RangeError)
  })
})
