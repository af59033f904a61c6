import type { BinColumn, BinRow } from '../bins/types'
import type { BandView } from '../physics/uncertainty/band'

/**
 * Inputs of the export formatters. The lead's routes fill them from the stored result; nothing
 * here reads a database. Dates are ISO 8601 strings (or Date objects, printed as ISO).
 */

/** Review state of a result version; 'approved' versions are frozen. */
export type ApprovalState = 'draft' | 'submitted' | 'returned' | 'approved'

/** Where a result came from: printed at the top of every export. */
export interface ExportProvenance {
  study?: { id?: string, name: string }
  set: { name: string, version: string, kind: string, family?: string }
  /** The prescription the study reports, as a reader should see it ("Hessian pairs, asymmetric"). */
  prescription: string
  /** Confidence level of the reported bands, in percent. */
  confidenceLevelPercent: number
  /** CL the set's members are published at, when it differs (the bands were rescaled). */
  setConfidenceLevelPercent?: number
  kernel: { id: string, label?: string, constants: Record<string, number | string | boolean> }
  engineVersion: string
  ranBy: string
  ranAt: string | Date
  resultVersion: number
  approval: { state: ApprovalState, by?: string, at?: string | Date }
  exportedBy?: string
  exportedAt?: string | Date
  /** Present when the study's members were multiplied by per-bin K-factors before the bands. */
  kFactors?: ExportKFactors
  /** The study's second set and how it varied (shared/physics/uncertainty/two-sets.ts); absent with one set. */
  secondSet?: ExportSecondSet
}

/** The second set of a two-set result and how its members entered the bands. */
export interface ExportSecondSet {
  name: string
  version: string
  kind: string
  family?: string
  /** 'central' (held at its central member), 'paired' (member k with member k) or 'apart' (varied on its own, combined in quadrature). */
  variation: 'central' | 'paired' | 'apart'
  /** The second set's own prescription in an apart run, as a reader should see it. */
  prescription?: string
}

/** Which K-factors a result used (the per-bin values are columns of the bins). */
export interface ExportKFactors {
  /** Where they came from, as the user wrote it; null when not given. */
  source: string | null
  /** Whether a per-bin K-factor uncertainty was given (then reported as its own band). */
  withErrors: boolean
  /** Whether that uncertainty was also added in quadrature to the PDF band (its own band too). */
  addedInQuadrature: boolean
}

/** The observable, for headers and captions. */
export interface ExportObservable {
  /** Plain text name ("dσ/dM"). */
  name: string
  /** Unit of the values ("pb/GeV"); omit when dimensionless. */
  unit?: string
  /** The name as LaTeX math, without dollars ("\\mathrm{d}\\sigma/\\mathrm{d}M"); else `name` is escaped. */
  latex?: string
  /** Each bin's name, when the bins give different names in the same unit ("dσ/dx" beside "σ"). */
  perBin?: string[]
}

/**
 * A band with what a reader sees of it, for every export format and every figure. `band` is the
 * engine's band type in any array form (engine or JSON, {@link BandView}), one entry per bin in
 * bin order; its `plus` and `minus` are magnitudes (ΔX⁺, ΔX⁻ ≥ 0).
 */
export interface LabelledBand<B extends BandView = BandView> {
  /** Short id used in CSV headers, JSON keys and figure legends ("hessian-asym"). */
  id: string
  /** What a reader sees ("Hessian, asymmetric"). */
  label: string
  /** Colour in figures (#rrggbb); default: the next colour of the palette. */
  color?: string
  band: B
}

/** A result version ready to export: the bins, their kinematics and one band per prescription. */
export interface ResultForExport {
  provenance: ExportProvenance
  observable: ExportObservable
  /** Kinematic columns of the bins, in display order. */
  binColumns: BinColumn[]
  bins: BinRow[]
  /** At least one band. */
  bands: LabelledBand[]
}

/** A bin-to-bin matrix (covariance in unit², or correlation) of one result. */
export interface MatrixForExport {
  provenance: ExportProvenance
  observable: ExportObservable
  kind: 'covariance' | 'correlation'
  /** Row-major n × n values, n = number of bins. */
  values: ArrayLike<ArrayLike<number>>
  /** One label per bin; default "bin 1" … */
  labels?: string[]
}
