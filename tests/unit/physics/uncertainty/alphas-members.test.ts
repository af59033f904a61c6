import { describe, expect, it } from 'vitest'
import { alphasShift, alphasVariationError } from '../../../../shared/physics/uncertainty/alphas-members'
import { memberValuesFromRows } from '../../../../shared/physics/uncertainty/matrix'
import { expectClose } from '../close'

// PDF4LHC recommendations, arXiv:1510.03865; see shared/physics/README.md, "α_s members"
describe('α_s variation ΔX = ½|X(α_s⁺) − X(α_s⁻)|', () => {
  const m = memberValuesFromRows([[10, 5], [11, 5], [9, 5], [9.4, 5.3], [10.2, 4.9]])
  it.each([
    // bin 0: ½(10.2 − 9.4) = 0.4; bin 1: ½(4.9 − 5.3) = −0.2, magnitude 0.2
    { bin: 0, shift: 0.4, error: 0.4 },
    { bin: 1, shift: -0.2, error: 0.2 }
  ])('bin $bin: hand-worked', ({ bin, shift, error }) => {
    expectClose(alphasShift(m, [3, 4])[bin]!, shift, 1e-14)
    expectClose(alphasVariationError(m, [3, 4])[bin]!, error, 1e-14)
  })

  it.each([
    { members: [3, 3] as [number, number], message: /must differ/ },
    { members: [0, 4] as [number, number], message: /does not exist/ },
    { members: [3, 9] as [number, number], message: /does not exist/ }
  ])('rejects α_s members $members', ({ members, message }) => {
    expect(() => alphasShift(m, members)).toThrow(message)
  })
})
