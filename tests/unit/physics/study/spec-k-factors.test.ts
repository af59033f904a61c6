// The K-factors of a study spec: accepted as given, and refused with the bin and grid column
// named (kFactor, kFactorError) for a wrong count, a value ≤ 0 or a negative uncertainty.
import { describe, expect, it } from 'vitest'
import { checkStudySpec, parseStudySpec } from '../../../../shared/physics/study/spec'

const bins = [{ x: 0.01, q2: 10 }, { x: 0.02, q2: 10 }, { x: 0.05, q2: 20 }]
const check = (kFactors: unknown) => checkStudySpec({ kernel: 'dis-nc-f2', bins, kFactors })
const issues = (kFactors: unknown) => {
  const r = check(kFactors)
  if (r.ok) throw new Error('expected the spec to be refused')
  return r.issues
}

describe('K-factors in a study spec', () => {
  it('keeps K-factors, their errors, source and quadrature choice; none when not given', () => {
    const k = { values: [1.1, 1.2, 1.3], errors: [0.05, 0, 0.1], source: 'NNLO/LO ratios of our own calculation', addErrorInQuadrature: true }
    expect(parseStudySpec({ kernel: 'dis-nc-f2', bins, kFactors: k }).kFactors).toEqual(k)
    expect('kFactors' in parseStudySpec({ kernel: 'dis-nc-f2', bins })).toBe(false)
  })

  it('names the bin and column of a K-factor ≤ 0 or not a number', () => {
    expect(issues({ values: [1, 0, 1] })).toEqual([expect.objectContaining({ bin: 2, column: 'kFactor', message: 'bin 2, column kFactor: a K-factor must be > 0' })])
    expect(issues({ values: [1, 1, -2] })[0]).toMatchObject({ bin: 3, column: 'kFactor' })
    expect(issues({ values: [null, 1, 1] })[0]).toMatchObject({ bin: 1, column: 'kFactor', message: expect.stringMatching(/^bin 1, column kFactor: must be a number/) })
  })

  it('names the bin and column of a negative K-factor uncertainty', () => {
    expect(issues({ values: [1, 1, 1], errors: [0, -0.1, 0] })).toEqual([
      expect.objectContaining({ bin: 2, column: 'kFactorError', message: 'bin 2, column kFactorError: a K-factor uncertainty must be ≥ 0' })
    ])
  })

  it('refuses a K-factor list of the wrong length, and an uncertainty list of the wrong length', () => {
    expect(issues({ values: [1, 1] })).toEqual([expect.objectContaining({ column: 'kFactor', message: 'kFactors.values (column kFactor): 2 K-factors for 3 bins; give one per bin' })])
    expect(issues({ values: [1, 1, 1], errors: [0.1] })[0]!.message).toMatch(/1 K-factor uncertainties for 3 bins/)
  })

  it('refuses unknown fields and a non-boolean choice', () => {
    expect(issues({ values: [1, 1, 1], scale: 2 })[0]!.message).toMatch(/kFactors.*scale/)
    expect(issues({ values: [1, 1, 1], addErrorInQuadrature: 'yes' })[0]!.message).toMatch(/kFactors.addErrorInQuadrature: must be true or false/)
  })
})
