// A result's K-factors as the result view and the exports show them: the per-bin values and
// errors of the spec snapshot (the stored members are already K-scaled, see studies/run.ts), and
// the K-factor uncertainty of the band computed by the engine (kFactorReportOf), reported apart
// from the PDF band and combined in quadrature only when the study asks for it.
import type { BandJson } from '../../../shared/physics/uncertainty/band'
import { bandToJson, makeBands } from '../../../shared/physics/uncertainty/band'
import { kFactorReportOf } from '../../../shared/physics/impact/k-factors'
import type { StudySpec } from '../../../shared/physics/study/spec'
import type { ExportKFactors, LabelledBand } from '../../../shared/export/types'
import type { BinPage } from './page'

/** The K-factors of a result for the result API (one page of bins), or null without K-factors. */
export interface KFactorView {
  values: number[]
  /** δK per bin (68% CL), null when none were given. */
  errors: number[] | null
  source: string | null
  addedInQuadrature: boolean
  /** δX' = |X'| δK/K at the band's CL, per bin; null without δK. */
  error: number[] | null
  /** The PDF band with δX' added in quadrature; only when the study asks for it. */
  combined: BandJson | null
}

/** What the exports' provenance says of the K-factors; undefined without them. */
export function exportKFactors(spec: StudySpec): ExportKFactors | undefined {
  const k = spec.kFactors
  if (!k) return undefined
  return { source: k.source?.trim() || null, withErrors: k.errors !== undefined, addedInQuadrature: k.errors !== undefined && k.addErrorInQuadrature === true }
}

const pageOf = <T>(list: readonly T[], p?: BinPage) => (p ? list.slice(p.offset, p.offset + p.limit) : [...list])

/**
 * The K-factor view of a band of K-scaled members at `clPercent`, on page `page` of the bins
 * (`band` is already that page; undefined page: all bins).
 */
export function kFactorView(spec: StudySpec, band: BandJson, clPercent: number, page?: BinPage): KFactorView | null {
  const k = spec.kFactors
  if (!k) return null
  const values = pageOf(k.values, page)
  const errors = k.errors ? pageOf(k.errors, page) : null
  const add = errors !== null && k.addErrorInQuadrature === true
  const report = errors ? kFactorReportOf(band, { values, errors }, clPercent, add) : null
  return {
    values, errors, source: k.source?.trim() || null, addedInQuadrature: add,
    error: report ? Array.from(report.kFactorErrorAtCl) : null,
    combined: report?.combined ? bandToJson(report.combined) : null
  }
}

/** The bands an export adds for the K-factor uncertainty: apart, and combined when asked. */
export function kFactorExportBands(view: KFactorView | null, band: BandJson, pdfLabel: string): LabelledBand[] {
  if (!view?.error) return []
  const out: LabelledBand[] = [{
    id: 'k-factor', label: 'K-factor uncertainty, δX = |X| δK/K at the band\'s CL (not a PDF uncertainty)',
    band: bandToJson(makeBands(band.central, view.error, view.error))
  }]
  if (view.combined) out.push({ id: 'pdf+k-factor', label: `${pdfLabel} and K-factor uncertainty in quadrature`, band: view.combined })
  return out
}
