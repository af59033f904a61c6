import { describe, expect, it } from 'vitest'
import { readCsv } from '#shared/bins'
import { RESULT_CAUTION, studyToCsv, studyToJson, studyToLatex, type StudyForExport } from '#shared/export'
import { makeBands } from '#shared/physics/uncertainty/band'
import { handMadeResult } from './result'

/** Two sets of one hand-made study (invented numbers). */
function twoSets(): StudyForExport {
  const r = handMadeResult()
  const other = { ...r.provenance, setConfidenceLevelPercent: 68, set: { name: 'Quill', version: '22', kind: 'replicas' }, prescription: 'replicas, 68% interval', resultVersion: 1, approval: { state: 'draft' as const } }
  return {
    study: { id: 'st-1', name: 'High-mass DY, test' },
    observable: r.observable,
    binColumns: r.binColumns.slice(0, 2),
    bins: r.bins,
    sets: [
      { id: 'Bramble-H-1.2', provenance: r.provenance, band: r.bands[0]!.band },
      { id: 'Quill-22', provenance: other, band: makeBands([1.3, 0.1, 1.3e-5], [0.119, 0.0367, 0.98e-6], [0.119, 0.0367, 0.98e-6]) }
    ]
  }
}

describe('all of a study\'s sets side by side', () => {
  it('CSV: the bins once, each set\'s columns, each set\'s provenance and the caution', () => {
    const text = studyToCsv(twoSets())
    expect(text).toContain('# set Bramble-H-1.2: Bramble-H version 1.2 (hessian-pairs, family Bramble); Hessian pairs, asymmetric; 68% CL')
    expect(text).toContain('# set Quill-22: Quill version 22 (replicas); replicas, 68% interval; 68% CL; result version 1, draft, not reviewed')
    expect(text).toContain(`# caution: ${RESULT_CAUTION}`)
    const { records } = readCsv(text, { comment: '#' })
    expect(records[0]!.fields.slice(0, 3)).toEqual(['mMin', 'mMax', 'central[Bramble-H-1.2]'])
    expect(records[0]!.fields).toContain('central[Quill-22]')
    expect(records).toHaveLength(4)
  })
  it('JSON: one entry per set with its provenance, values per bin by set id', () => {
    const json = JSON.parse(JSON.stringify(studyToJson(twoSets())))
    expect(json.format).toBe('sheaf-study-sets')
    expect(json.sets.map((s: { id: string }) => s.id)).toEqual(['Bramble-H-1.2', 'Quill-22'])
    expect(json.caution).toBe(RESULT_CAUTION)
    expect(json.bins[0].values['Quill-22']).toMatchObject({ central: 1.3, plus: 0.119 })
  })
  it('LaTeX: one column per set under one head, the sets in the key, PDG rounding', () => {
    const tex = studyToLatex(twoSets())
    expect(tex).toContain('Columns (a) Bramble-H 1.2, Hessian pairs, asymmetric; (b) Quill 22, replicas, 68\\% interval.')
    expect(tex).toContain('$1.30 \\pm 0.12$') // 0.119 → 0.12, by the PDG rule
    expect(tex).toContain('$0.10 \\pm 0.04$') // 0.0367 → 0.04
    expect(tex).toContain('% caution: ')
    expect(tex).toContain('Leading-order prediction')
  })
})
