/**
 * How a band appears in the command line's output, shared by `compute` and `bands`: one row per
 * bin, and the matching CSV table.
 */
import { bandRows, type Band, type BandResult } from '../../shared/physics/uncertainty'
import type { CsvCell } from '../../shared/export/csv'

/**
 * One bin of a band in the output (null where a relative width is undefined); pdf/alphas parts
 * only for sets with α_s members.
 */
export interface BandReportRow extends Band<number, number | null> {
  /** Bin number, from 1 as in the study's bins grid and the engine's messages (values[m][bin − 1]). */
  bin: number
  pdfPlus?: number
  pdfMinus?: number
  alphas?: number
  /** Quadrature error estimate of the bin's central value (compute only). */
  quadratureError?: number
  /** Scale variation of the central member about its nominal value, apart from the PDF band (compute only). */
  scaleUp?: number
  scaleDown?: number
}

/** A set's band as printed: prescription, CL and the rows. */
export interface BandReport {
  prescription: string
  clPercent: number
  /** How the interval was made, e.g. "percentile 5–95 %" or "Hessian, rescaled from 90 % to 68 % CL (Gaussian)". */
  interval: string
  /** Which scale variation scaleUp/scaleDown are (compute only), e.g. '7-point μ_F, μ_R'. */
  scaleVariation?: string
  rows: BandReportRow[]
}

/**
 * The printable form of computeBands' result. relPlus/relMinus are null where the central
 * value is 0 (the engine's NaN).
 */
export function bandReport(result: BandResult): BandReport {
  const pdf = bandRows(result.pdf)
  const rows = bandRows(result).map((r, bin): BandReportRow => {
    const row: BandReportRow = {
      bin: bin + 1,
      central: r.central,
      plus: r.plus,
      minus: r.minus,
      relPlus: Number.isFinite(r.relPlus) ? r.relPlus : null,
      relMinus: Number.isFinite(r.relMinus) ? r.relMinus : null
    }
    if (result.alphas !== null) {
      row.pdfPlus = pdf[bin]!.plus
      row.pdfMinus = pdf[bin]!.minus
      row.alphas = result.alphas[bin]!
    }
    return row
  })
  return { prescription: result.prescription, clPercent: result.clPercent, interval: result.interval.label, rows }
}

/** CSV columns of band tables (one line per set and bin). */
export const BAND_CSV_HEADER = ['set', 'bin', 'central', 'plus', 'minus', 'relPlus', 'relMinus', 'pdfPlus', 'pdfMinus', 'alphas', 'prescription', 'clPercent', 'interval', 'quadratureError', 'scaleUp', 'scaleDown', 'scaleVariation'] as const

/** The CSV lines of one set's band, in BAND_CSV_HEADER order. */
export function bandCsvRows(set: string, report: BandReport): CsvCell[][] {
  return report.rows.map(r => [set, r.bin, r.central, r.plus, r.minus, r.relPlus, r.relMinus, r.pdfPlus, r.pdfMinus, r.alphas, report.prescription, report.clPercent, report.interval, r.quadratureError, r.scaleUp, r.scaleDown, report.scaleVariation])
}
