import { describe, expect, it } from 'vitest'
import { binObservable, observableIssues, studyObservable } from '#shared/bins/observable'
import { parseStudySpec } from '#shared/physics/study/spec'
import { bandsToCsv, bandsToJson, bandsToLatex } from '#shared/export'
import { makeBands } from '#shared/physics/uncertainty/band'
import { resultForExport } from '../../../server/domain/results/export'
import { handMadeResult } from '../export/result'

// Naming rule (common practice of analysis notes): a variable integrated over its bin leaves the
// derivative, a bin average keeps it and is written ⟨…⟩, a point keeps it. Units follow by
// dimensional analysis: pb/GeV × GeV = pb.
const dy = (bins: object[], rangeMode?: 'integrate' | 'average') =>
  parseStudySpec({ kernel: 'drell-yan', options: { sqrtSGeV: 13000 }, bins, ...(rangeMode ? { rangeMode } : {}) })

describe('the observable from the bin layout', () => {
  it('names a Drell–Yan study whose y is an integrated range dσ/dM in pb/GeV', () => {
    const o = studyObservable(dy([{ m: 200, yMin: -2.5, yMax: 2.5 }, { m: 300, yMin: -2.5, yMax: 2.5 }]))
    expect(o).toEqual({ name: 'dσ/dM', latex: '\\mathrm{d}\\sigma/\\mathrm{d}M', unit: 'pb/GeV' })
  })
  it('names a DIS nuclear ratio by its structure function and what it divides by, and keeps the collider title otherwise', () => {
    const ratio = (options: Record<string, unknown>) => parseStudySpec({ kernel: 'nuclear-ratio', options: { nucleus: { z: 6, a: 12 }, ...options }, bins: [{ x: 0.1, q2: 10 }] })
    expect(studyObservable(ratio({ base: 'dis-nc-f2', denominator: 'isoscalar' }))).toEqual({ name: 'F₂ ratio per nucleon, A over ½(p + n)', latex: '', unit: null })
    expect(studyObservable(ratio({ base: 'dis-nc-f2', denominator: 'deuteron' })).name).toBe('F₂ ratio per nucleon, A over D')
    expect(studyObservable(ratio({ base: 'dis-nc-f2' })).name).toBe('F₂ ratio per nucleon, A over p')
  })
  it('keeps both derivatives at points', () => {
    expect(studyObservable(dy([{ m: 200, y: 0 }]))).toMatchObject({ name: 'd²σ/dM dy', unit: 'pb/GeV' })
  })
  it('gives σ in pb when M and y are both integrated (pb/GeV × GeV = pb)', () => {
    expect(studyObservable(dy([{ mMin: 100, mMax: 200, yMin: -1, yMax: 1 }]))).toMatchObject({ name: 'σ', unit: 'pb' })
  })
  it('writes averaged ranges as ⟨…⟩ and keeps the derivative and the unit', () => {
    const o = studyObservable(dy([{ mMin: 100, mMax: 200, y: 0 }], 'average'))
    expect(o).toMatchObject({ name: '⟨d²σ/dM dy⟩', unit: 'pb/GeV' })
    expect(o.latex).toBe('\\langle \\mathrm{d}^{2}\\sigma/\\mathrm{d}M\\,\\mathrm{d}y \\rangle')
  })
  it('writes μb, not ub', () => {
    const spec = parseStudySpec({ kernel: 'w-plus', options: { sqrtSGeV: 13000, unit: 'ub' }, bins: [{ y: 0 }] })
    expect(studyObservable(spec)).toMatchObject({ name: 'dσ/dy', unit: 'μb' })
  })
  it('integrates a structure function over a Q² range as ∫ F₂ dQ² in GeV²', () => {
    const spec = parseStudySpec({ kernel: 'dis-nc-f2', options: {}, bins: [{ x: 0.1, q2Min: 10, q2Max: 20 }] })
    expect(studyObservable(spec)).toMatchObject({ name: '∫ F₂ dQ²', unit: 'GeV²' })
  })
  it('names a ratio by the quantity of its parts', () => {
    const spec = parseStudySpec({ kernel: 'w-charge-ratio', options: { sqrtSGeV: 13000 }, bins: [{ yMin: 0, yMax: 1 }] })
    expect(studyObservable(spec)).toMatchObject({ name: 'W⁺/W⁻ ratio of σ', unit: null })
  })

  it('names bins per bin when the name changes but the unit does not', () => {
    const spec = parseStudySpec({ kernel: 'dis-nc-d2sigma', options: { sqrtSGeV: 300 }, bins: [{ x: 0.1, q2Min: 10, q2Max: 20 }, { xMin: 0.1, xMax: 0.2, q2Min: 10, q2Max: 20 }] })
    expect(observableIssues(spec)).toEqual([])
    expect(studyObservable(spec)).toMatchObject({ name: 'dσ/dx or σ', unit: 'pb', perBin: ['dσ/dx', 'σ'] })
  })

  it('refuses a study mixing a ranged and a point M (the unit would change), located by bin and column', () => {
    const spec = dy([{ mMin: 100, mMax: 200, y: 0 }, { m: 300, y: 0 }, { mMin: 300, mMax: 400, y: 0 }])
    expect(binObservable(spec, spec.bins[1]!).unit).toBe('pb/GeV')
    const issues = observableIssues(spec)
    expect(issues).toHaveLength(1)
    expect(issues[0]).toMatchObject({ bin: 2, column: 'm', path: ['bins', 1, 'm'] })
    expect(issues[0]!.message).toMatch(/^bin 2, column m: this bin gives d²σ\/dM dy \[pb\/GeV\] but bin 1 gives dσ\/dy \[pb\]/)
    expect(() => studyObservable(spec)).toThrow(RangeError)
  })
})

describe('the observable in every export', () => {
  const spec = dy([{ m: 200, yMin: -2.5, yMax: 2.5 }, { m: 300, yMin: -2.5, yMax: 2.5 }])
  const data = resultForExport(handMadeResult().provenance, spec, 'hessian-asymmetric' as never, makeBands([2, 1], [0.1, 0.05], [0.1, 0.05]) as never, null)
  it('CSV, JSON and LaTeX say dσ/dM [pb/GeV], never d²σ/dM dy', () => {
    const csv = bandsToCsv(data)
    const json = JSON.stringify(bandsToJson(data))
    const tex = bandsToLatex(data)
    expect(csv).toContain('# observable: dσ/dM [pb/GeV]')
    expect(json).toContain('"name":"dσ/dM","unit":"pb/GeV"')
    expect(tex).toContain('\\mathrm{d}\\sigma/\\mathrm{d}M')
    for (const text of [csv, json, tex]) expect(text).not.toMatch(/d²σ|\\mathrm\{d\}\^\{2\}/)
  })
})
