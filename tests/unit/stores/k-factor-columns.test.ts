// The bins grid's K-factor columns: shown on request, filled from the spec, read back into the
// spec's per-bin lists (kinematics untouched), and checked like any other cell.
import { describe, expect, it } from 'vitest'
import { validateRows } from '#shared/bins'
import { kernelDefinition } from '#shared/physics/kernels/registry'
import { kernelVariables } from '#shared/physics/study/spec'
import { binsFromRows, gridColumns, kFactorColumnsOf, kFactorNote, kFactorsFromRows, rowsFromBins, sameKFactors } from '../../../stores/study-view'

const dis = kernelVariables(kernelDefinition('dis-nc-f2'), {})
const bins = [{ x: 0.01, q2: 10 }, { x: 0.02, q2: 20, label: 'b' }]

describe('K-factor columns of the bins grid', () => {
  it('adds K (and δK) before the label only when asked', () => {
    expect(gridColumns(dis, { x: 'point', q2: 'point' }).map(c => c.key)).toEqual(['x', 'q2', 'label'])
    expect(gridColumns(dis, { x: 'point', q2: 'point' }, 'values').map(c => c.key)).toEqual(['x', 'q2', 'kFactor', 'label'])
    expect(gridColumns(dis, { x: 'point', q2: 'point' }, 'values-errors').map(c => c.key)).toEqual(['x', 'q2', 'kFactor', 'kFactorError', 'label'])
    expect(kFactorColumnsOf(undefined)).toBe('none')
    expect(kFactorColumnsOf({ values: [1] })).toBe('values')
    expect(kFactorColumnsOf({ values: [1], errors: [0] })).toBe('values-errors')
  })

  it('round-trips the spec\'s K-factors through the rows, keeping them out of the bins', () => {
    const columns = gridColumns(dis, { x: 'point', q2: 'point' }, 'values-errors')
    const rows = rowsFromBins(bins, columns, { values: [1.1, 1.2], errors: [0.01, 0.02] })
    expect(rows[1]).toEqual({ x: 0.02, q2: 20, kFactor: 1.2, kFactorError: 0.02, label: 'b' })
    expect(binsFromRows(rows, columns)).toEqual(bins)
    expect(kFactorsFromRows(rows, columns)).toEqual({ values: [1.1, 1.2], errors: [0.01, 0.02] })
    // An empty δK column gives no errors; an empty K cell goes to the server as it is (null), to be named there.
    const noErrors = rows.map(r => ({ ...r, kFactorError: null }))
    expect(kFactorsFromRows(noErrors, columns)).toEqual({ values: [1.1, 1.2] })
    expect(kFactorsFromRows([{ ...rows[0]!, kFactor: null }, rows[1]!], columns)!.values).toEqual([null, 1.2])
    expect(kFactorsFromRows(rows, gridColumns(dis, { x: 'point', q2: 'point' }))).toBeNull()
  })

  it('checks K > 0 and δK ≥ 0 in the cell, with the row and column named', () => {
    const columns = gridColumns(dis, { x: 'point', q2: 'point' }, 'values-errors')
    const errors = validateRows([{ x: 0.01, q2: 10, kFactor: 0, kFactorError: -1 }, { x: 0.01, q2: 10, kFactor: null }], columns)
    expect(errors.map(e => e.message)).toEqual([
      'row 1, column K-factor: the K-factor must be above 0',
      'row 1, column K-factor error: the K-factor error must be at least 0',
      'row 2, column K-factor: a value is required'
    ])
  })

  it('tells whether a result ran with the draft\'s K-factors, and says how they were used', () => {
    expect(sameKFactors(undefined, null)).toBe(true)
    expect(sameKFactors({ values: [1, 2] }, { values: [1, 2] })).toBe(true)
    expect(sameKFactors({ values: [1, 2] }, { values: [1, 3] })).toBe(false)
    expect(sameKFactors(undefined, { values: [1] })).toBe(false)
    const note = kFactorNote({ values: [1], errors: [0.1], source: 'ratio table', addedInQuadrature: false, error: [0.2], combined: null })
    expect(note).toMatch(/source: ratio table.*shown apart from the PDF band, not added to it.*your responsibility/)
  })
})
