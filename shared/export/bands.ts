import { writeCsv } from './csv'
import { provenanceLines, provenanceObject } from './provenance'
import { RESULT_CAUTION, cautionOfKernel } from './caution'
import type { LabelledBand, ResultForExport } from './types'

const BAND_PARTS = ['central', 'plus', 'minus', 'relPlus', 'relMinus'] as const

/** Refuses a result whose bands do not have one value per bin, or negative errors. */
export function checkResult(result: ResultForExport): void {
  const n = result.bins.length
  if (!result.bands.length) throw new RangeError('A result export needs at least one band')
  for (const { id, band } of result.bands) {
    for (const part of BAND_PARTS) {
      if (band[part].length !== n) throw new RangeError(`Band ${id} has ${band[part].length} ${part} values for ${n} bins`)
    }
    for (let i = 0; i < n; i++) {
      if (band.plus[i]! < 0 || band.minus[i]! < 0) throw new RangeError(`Band ${id}, bin ${i + 1}: errors are magnitudes and must be ≥ 0`)
    }
  }
}

/** A relative width (fraction of |central|) in percent, or null where it is undefined. */
const percent = (relative: number | null) => (relative !== null && Number.isFinite(relative) ? 100 * relative : null)

/** Central, plus, minus and the two relative widths in percent of one bin of a band. */
const bandCells = ({ band }: LabelledBand, i: number) =>
  [band.central[i]!, band.plus[i]!, band.minus[i]!, percent(band.relPlus[i]!), percent(band.relMinus[i]!)] as const

/**
 * Bands as CSV, one line per bin: the bin's kinematic columns (by key), then for every band
 * `central[id]`, `plus[id]`, `minus[id]`, `rel_plus_pct[id]`, `rel_minus_pct[id]` (errors as
 * magnitudes, relative errors in percent of |central|, empty where undefined). Provenance and
 * caution come first as `# ` comment lines. Written by {@link writeCsv} (CRLF, RFC 4180 quoting,
 * numbers in their shortest exact form, empty cells for non-finite values).
 */
export function bandsToCsv(result: ResultForExport): string {
  checkResult(result)
  const comments = [
    ...provenanceLines(result.provenance, result.observable, 'bands'),
    ...csvColumnNotes(result)
  ]
  return bandsCsvRecords(result, comments)
}

/** The CSV comment lines that explain the columns (units, band ids). */
export function csvColumnNotes(result: Pick<ResultForExport, 'binColumns' | 'observable' | 'bands'>): string[] {
  const units = result.binColumns.filter(c => c.unit).map(c => `${c.key} [${c.unit}]`)
  return [
    `columns: ${[...units, `central/plus/minus [${result.observable.unit ?? 'dimensionless'}]`, 'rel_*_pct [%]'].join(', ')}`,
    `bands: ${result.bands.map(b => `${b.id} = ${b.label}`).join('; ')}`
  ]
}

/** The records of {@link bandsToCsv} under the given comment lines. */
export function bandsCsvRecords(result: Omit<ResultForExport, 'provenance'>, comments: string[]): string {
  const perBin = result.observable.perBin
  const header = [
    ...result.binColumns.map(c => c.key),
    ...(perBin ? ['observable'] : []),
    ...result.bands.flatMap(b => ['central', 'plus', 'minus', 'rel_plus_pct', 'rel_minus_pct'].map(h => `${h}[${b.id}]`))
  ]
  const lines = result.bins.map((bin, i) => [
    ...result.binColumns.map(c => bin[c.key] ?? null),
    ...(perBin ? [perBin[i] ?? null] : []),
    ...result.bands.flatMap(b => bandCells(b, i))
  ])
  return writeCsv([header, ...lines], { comments })
}

/** Bands as a JSON-ready object: provenance, caution, columns, and per bin its kinematics and bands. */
export function bandsToJson(result: ResultForExport) {
  checkResult(result)
  return {
    format: 'sheaf-bands',
    formatVersion: 1,
    provenance: provenanceObject(result.provenance),
    ...bandsJsonBody(result, cautionOfKernel(Boolean(result.provenance.kFactors), result.provenance.kernel.id, result.provenance.secondSet?.variation))
  }
}

/** Everything of {@link bandsToJson} after the provenance: caution, observable, columns, bins. */
export function bandsJsonBody(result: Omit<ResultForExport, 'provenance'>, caution = RESULT_CAUTION) {
  return {
    caution,
    observable: result.observable,
    columns: result.binColumns.map(({ key, label, unit }) => ({ key, label, ...(unit ? { unit } : {}) })),
    bands: result.bands.map(({ id, label }) => ({ id, label })),
    bins: result.bins.map((bin, i) => ({
      index: i + 1,
      kinematics: Object.fromEntries(result.binColumns.map(c => [c.key, bin[c.key] ?? null])),
      ...(result.observable.perBin ? { observable: result.observable.perBin[i] ?? null } : {}),
      values: Object.fromEntries(result.bands.map((b) => {
        const [central, plus, minus, relPlusPercent, relMinusPercent] = bandCells(b, i)
        return [b.id, { central, plus, minus, relPlusPercent, relMinusPercent }]
      }))
    }))
  }
}

/** {@link bandsToJson} as text, two-space indented. */
export const bandsToJsonText = (result: ResultForExport) => `${JSON.stringify(bandsToJson(result), null, 2)}\n`
