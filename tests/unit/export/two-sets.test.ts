// Two-set results in the exports and on the page: the provenance names the second set and how it
// varied, a paired band says it is correlated, an apart run exports the combination and each
// set's part (CSV, JSON, LaTeX), the page's plot gets the same curves, the family page's R
// against A. Band numbers are invented (no physics claim) except where a sum is checked by hand.
import { describe, expect, it } from 'vitest'
import { bandsToCsv, bandsToJson, bandsToLatex, provenanceLines } from '#shared/export'
import { parseStudySpec } from '#shared/physics/study/spec'
import { apartStoredBands, memberSourceOf } from '../../../server/domain/results/bands'
import { resultForExport } from '../../../server/domain/results/export'
import { ratioAgainstA } from '../../../stores/family-ratios'
import { resultSeries } from '../../../stores/study-view'
import type { ExportProvenance } from '#shared/export'
import { expectClose } from '../physics/close'
import { handMadeResult } from './result'

const spec = parseStudySpec({ kernel: 'dis-nc-f2', bins: [{ x: 0.01, q2: 10 }, { x: 0.1, q2: 10 }] })
const provenance = (variation: 'central' | 'paired' | 'apart'): ExportProvenance => ({
  ...handMadeResult().provenance,
  set: { name: 'Ostrand-25-Pb208', version: '25.0', kind: 'hessian-pairs', family: 'Ostrand-25' },
  prescription: 'Hessian pairs, symmetric',
  setConfidenceLevelPercent: 68,
  secondSet: { name: 'toy-ff-pi+', version: '1', kind: 'hessian-pairs', family: 'toy-ff', variation, ...(variation === 'apart' ? { prescription: 'Hessian pairs, symmetric' } : {}) }
})
// Members (central, +, −) × 2 bins. Set: ½|X⁺ − X⁻| = (1, 0.5); second set: (2, 1.2);
// in quadrature (√5, 1.3) by hand.
const matrix = (rows: number[][]) => ({ members: rows.length, bins: 2, values: Float64Array.from(rows.flat()) })
const apart = apartStoredBands(
  { main: matrix([[10, 5], [11, 5.5], [9, 4.5]]), second: matrix([[10, 5], [12, 6.2], [8, 3.8]]) },
  { set: memberSourceOf({ kind: 'hessian-pairs', confidenceLevelPercent: 68 }), second: { kind: 'hessian-pairs', confidenceLevelPercent: 68, name: 'toy-ff-pi+', version: '1' } },
  'hessian-symmetric', 68
)

describe('an apart run in the exports', () => {
  it('stores the combination in quadrature with both parts (hand-worked)', () => {
    expectClose(apart.apart!.set.plus, [1, 0.5], 1e-12)
    expectClose(apart.apart!.second.plus, [2, 1.2], 1e-12)
    expectClose(apart.plus, [Math.sqrt(5), 1.3], 1e-12)
    expectClose(apart.minus, [Math.sqrt(5), 1.3], 1e-12)
  })

  it('writes the combination, the set alone and the second set alone in CSV, JSON and LaTeX, with the provenance line', () => {
    const data = resultForExport(provenance('apart'), spec, 'hessian-symmetric', apart, null)
    expect(data.bands.map(b => b.id)).toEqual(['hessian-symmetric', 'hessian-symmetric-set', 'hessian-symmetric-second'])
    const csv = bandsToCsv(data)
    expect(csv).toContain('# second set: toy-ff-pi+ version 1 (hessian-pairs, family toy-ff); sets varied apart, combined in quadrature; its own band: Hessian pairs, symmetric, at the same CL')
    expect(csv).toContain('plus[hessian-symmetric-second]')
    const header = csv.split('\r\n').find(l => l.startsWith('x,'))!.split(',')
    const first = csv.split('\r\n').find(l => l.startsWith('0.01,'))!.split(',')
    expect(Number(first[header.indexOf('plus[hessian-symmetric]')])).toBeCloseTo(Math.sqrt(5), 12)
    expect(Number(first[header.indexOf('plus[hessian-symmetric-set]')])).toBe(1)
    expect(Number(first[header.indexOf('plus[hessian-symmetric-second]')])).toBe(2)
    const json = bandsToJson(data)
    expect(json.provenance.secondSet).toMatchObject({ variation: 'apart', text: expect.stringContaining('combined in quadrature') })
    expect(json.bins[1]!.values['hessian-symmetric-second']!.plus).toBeCloseTo(1.2, 12)
    const latex = bandsToLatex(data)
    expect(latex).toContain('% second set: toy-ff-pi+ version 1')
    expect(latex).toMatch(/alone/)
    expect(latex).toContain('Second set toy-ff-pi+ version 1 (hessian-pairs, family toy-ff); sets varied apart, combined in quadrature')
  })
})

describe('a paired run in the exports', () => {
  it('labels the band and the provenance "correlated: members paired"', () => {
    const band = { ...apart, apart: undefined }
    const data = resultForExport(provenance('paired'), spec, 'hessian-symmetric', band, null)
    expect(data.bands).toHaveLength(1)
    expect(data.bands[0]!.label).toContain('(correlated: members paired)')
    expect(provenanceLines(data.provenance, data.observable, 'bands')).toContain('second set: toy-ff-pi+ version 1 (hessian-pairs, family toy-ff); correlated: members paired')
  })

  it('says a held second set is at its central member', () => {
    const data = resultForExport(provenance('central'), spec, 'hessian-symmetric', { ...apart, apart: undefined }, null)
    expect(bandsToCsv(data)).toContain('; second set at its central member')
  })
})

describe('the page\'s curves of a two-set result', () => {
  const detail = (variation: 'central' | 'paired' | 'apart') => ({
    setId: 's1', set: { id: 's1', name: 'Ostrand-25-Pb208', version: '25.0', kind: 'hessian-pairs', family: 'Ostrand-25', memberCount: 3, confidenceLevelPercent: 68 },
    second: { id: 's2', name: 'Ostrand-25-C12', version: '25.0', kind: 'hessian-pairs', variation },
    bands: variation === 'apart' ? apart : { ...apart, apart: undefined }
  })
  it('draws an apart run as the combination and each part alone', () => {
    expect(resultSeries(detail('apart')).map(s => s.id)).toEqual(['s1', 's1:set', 's1:second'])
    expect(resultSeries(detail('apart'))[2]!.band.plus).toEqual(apart.apart!.second.plus)
  })
  it('draws a paired run as one labelled band', () => {
    const s = resultSeries(detail('paired'))
    expect(s).toHaveLength(1)
    expect(s[0]!.label).toBe('Ostrand-25-Pb208 25.0 (correlated: members paired with Ostrand-25-C12)')
  })
})

describe('R at one x against A', () => {
  const one = (c: number, e: number) => ({ central: [c], plus: [e], minus: [e], relPlus: [e / c], relMinus: [e / c] })
  it('orders the nuclei by A and puts each one\'s band at its A; nuclei without a band are left out', () => {
    const r = ratioAgainstA([
      { a: 208, z: 82, name: 'Pb', band: one(0.8, 0.05) },
      { a: 12, z: 6, name: 'C', band: one(0.95, 0.02) },
      { a: 56, z: 26, name: 'Fe', band: null }
    ])!
    expect(r.a).toEqual([12, 208])
    expect(r.band.central).toEqual([0.95, 0.8])
    expect(r.band.plus).toEqual([0.02, 0.05])
    expect(r.labels[1]).toBe('Pb (Z = 82, A = 208)')
    expect(ratioAgainstA([{ a: 12, z: 6, name: 'C', band: null }])).toBeNull()
  })
})
