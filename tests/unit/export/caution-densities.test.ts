// The caution names whose uncertainty a band is: the parton densities, the fragmentation functions,
// or both combined (which slot reads what: shared/physics/README.md, "Hadron production: which set
// goes where"; how a second set varies: section 15.1).
import { describe, expect, it } from 'vitest'
import { FRAGMENTATION_CAUTION, RESULT_CAUTION, cautionOfKernel, resultCautionShort, varyingDensities } from '../../../shared/export/caution'

describe('what the band of a result is the uncertainty of', () => {
  it('is the parton densities for parton kernels, however the second set entered', () => {
    expect(varyingDensities('dis-nc-f2')).toBe('parton')
    expect(varyingDensities('nuclear-ratio', 'paired')).toBe('parton')
    expect(varyingDensities('nuclear-ratio', 'apart')).toBe('parton')
  })

  it('is the fragmentation functions for e⁺e⁻ kernels, and both for a multiplicity whose fragmentation set varied', () => {
    expect(varyingDensities('epem-hadron')).toBe('fragmentation')
    expect(varyingDensities('sidis-multiplicity', 'central')).toBe('parton')
    expect(varyingDensities('sidis-multiplicity', 'apart')).toBe('both')
  })

  it('says so in the caution, with the fragmentation sentence wherever fragmentation functions enter', () => {
    expect(cautionOfKernel(false, 'dis-nc-f2')).toBe(RESULT_CAUTION)
    const ee = cautionOfKernel(false, 'epem-hadron')
    expect(ee).toMatch(/^Leading-order prediction\. The band is the fragmentation-function uncertainty only, not the full theory uncertainty/)
    expect(ee).toContain(FRAGMENTATION_CAUTION)
    expect(ee).not.toContain('PDF uncertainty only')
    const sidis = cautionOfKernel(true, 'sidis-multiplicity', 'apart')
    expect(sidis).toMatch(/The band combines the PDF and the fragmentation-function uncertainties in quadrature/)
    expect(sidis).toContain(FRAGMENTATION_CAUTION)
    expect(sidis).toMatch(/K-factors/)
    // Held at its central member, the fragmentation set still enters the prediction.
    expect(cautionOfKernel(false, 'sidis-multiplicity', 'central')).toMatch(/PDF uncertainty only.*z ≈ 0\.05/)
    expect(resultCautionShort(false, 'fragmentation')).toBe('Leading-order prediction; fragmentation-function uncertainty only, not the full theory uncertainty.')
  })
})
