/**
 * All of a study's sets side by side in one file (CSV, JSON, LaTeX): the bins once, then each
 * set's band. Each set keeps its own provenance (version, run, review state); the caution is in
 * every file.
 */
import type { BandView } from '../physics/uncertainty/band'
import { bandsCsvRecords, bandsJsonBody, checkResult, csvColumnNotes } from './bands'
import { cautionOfKernel, varyingDensities } from './caution'
import { latexTable, latexText, type LatexTableOptions } from './latex'
import { variationText } from '../physics/uncertainty/two-sets'
import { approvalText, confidenceText, isoTime, kFactorText, provenanceObject, secondSetText, setText } from './provenance'
import type { ExportObservable, ExportProvenance, ResultForExport } from './types'

/** A study's newest finished result on each of its sets, all on the same bins. */
export interface StudyForExport {
  study: { id?: string, name: string }
  observable: ExportObservable
  binColumns: ResultForExport['binColumns']
  bins: ResultForExport['bins']
  /** One entry per set: a short id for the CSV headers and JSON keys, its provenance and band. */
  sets: Array<{ id: string, provenance: ExportProvenance, band: BandView }>
  exportedBy?: string
  exportedAt?: string | Date
}

const setLine = (p: ExportProvenance) =>
  `${setText(p)}; ${p.prescription}; ${confidenceText(p)}; result version ${p.resultVersion}, ${approvalText(p)}; run by ${p.ranBy} at ${isoTime(p.ranAt)}; engine ${p.engineVersion}${p.kFactors ? `; K-factors: ${kFactorText(p.kFactors)}` : ''}${p.secondSet ? `; second set: ${secondSetText(p.secondSet)}` : ''}`

/** Whether any set's result was scaled by K-factors. */
const withKFactors = (s: StudyForExport) => s.sets.some(x => x.provenance.kFactors)

/** The study as a ResultForExport-like table whose bands are the sets (label: set, prescription). */
function asTable(s: StudyForExport): Omit<ResultForExport, 'provenance'> {
  if (!s.sets.length) throw new RangeError('A study export needs at least one finished result')
  const table = {
    observable: s.observable, binColumns: s.binColumns, bins: s.bins,
    bands: s.sets.map(x => ({ id: x.id, label: `${x.provenance.set.name} ${x.provenance.set.version}, ${x.provenance.prescription}${x.provenance.secondSet && x.provenance.secondSet.variation !== 'central' ? ` (${variationText(x.provenance.secondSet.variation)})` : ''}`, band: x.band }))
  }
  checkResult({ ...table, provenance: s.sets[0]!.provenance })
  return table
}

/** The caution of a study's table: that of its first set's result (they share kernel and bins). */
function studyCaution(s: StudyForExport): string {
  const p = s.sets[0]!.provenance
  return cautionOfKernel(withKFactors(s), p.kernel.id, p.secondSet?.variation)
}

/** The comment lines above a study's table: study, observable, kernel, each set, caution. */
export function studyProvenanceLines(s: StudyForExport, what: string): string[] {
  const p = s.sets[0]!.provenance
  const constants = Object.entries(p.kernel.constants).map(([k, v]) => `${k}=${v}`).join(', ') || 'none'
  return [
    `Sheaf export: ${what}`,
    `study: ${s.study.name}${s.study.id ? ` (${s.study.id})` : ''}`,
    `observable: ${s.observable.name}${s.observable.unit ? ` [${s.observable.unit}]` : ''}`,
    `kernel: ${p.kernel.id}${p.kernel.label ? ` (${p.kernel.label})` : ''}; constants: ${constants}`,
    ...s.sets.map(x => `set ${x.id}: ${setLine(x.provenance)}`),
    ...(s.exportedAt || s.exportedBy ? [`exported${s.exportedBy ? ` by ${s.exportedBy}` : ''}${s.exportedAt ? ` at ${isoTime(s.exportedAt)}` : ''}`] : []),
    `caution: ${studyCaution(s)}`
  ]
}

/** CSV: the bins, then central, plus, minus, rel_plus_pct, rel_minus_pct per set (`central[<set id>]` …). */
export function studyToCsv(s: StudyForExport): string {
  const table = asTable(s)
  return bandsCsvRecords(table, [...studyProvenanceLines(s, 'all sets of a study side by side'), ...csvColumnNotes(table)])
}

/** JSON: the study, each set's provenance, and per bin its kinematics and each set's values. */
export function studyToJson(s: StudyForExport) {
  const table = asTable(s)
  return {
    format: 'sheaf-study-sets',
    formatVersion: 1,
    study: s.study,
    sets: s.sets.map(x => ({ id: x.id, provenance: provenanceObject(x.provenance) })),
    ...(s.exportedBy ? { exportedBy: s.exportedBy } : {}),
    ...(s.exportedAt ? { exportedAt: isoTime(s.exportedAt) } : {}),
    ...bandsJsonBody(table, studyCaution(s))
  }
}

export const studyToJsonText = (s: StudyForExport) => `${JSON.stringify(studyToJson(s), null, 2)}\n`

/** LaTeX: one column per set under one head, the sets explained in the caption's key. */
export function studyToLatex(s: StudyForExport, options: Pick<LatexTableOptions, 'label' | 'rounding' | 'longAfter' | 'caption'> = {}): string {
  const table = asTable(s)
  const cls = [...new Set(s.sets.map(x => confidenceText(x.provenance)))]
  const states = s.sets.map(x => `${latexText(x.provenance.set.name)} result version ${x.provenance.resultVersion}, ${latexText(approvalText(x.provenance))}`)
  return latexTable({
    comments: studyProvenanceLines(s, 'LaTeX table of all sets of a study'),
    observable: s.observable,
    binColumns: s.binColumns,
    bins: s.bins,
    columns: table.bands.map(b => ({ key: b.label, band: b.band })),
    kFactors: withKFactors(s),
    varies: varyingDensities(s.sets[0]!.provenance.kernel.id, s.sets[0]!.provenance.secondSet?.variation),
    caption: [
      ...(options.caption ? [options.caption] : []),
      `Study ${latexText(s.study.name)}; ${latexText(cls.join('; '))}.`,
      `${states.join('; ')}.`
    ]
  }, options)
}
