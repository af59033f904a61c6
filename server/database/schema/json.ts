// The shapes stored in the JSON columns, typed once here so no query needs a cast. Types only;
// they come from shared/ (the engine and the parsers), never from the server.
import type { MeasurementData } from '../../../shared/measurements/csv'
import type { BandJson } from '../../../shared/physics/uncertainty/band'
import type { StudySpec } from '../../../shared/physics/study/spec'
import type { IntervalRule, Prescription } from '../../../shared/physics/uncertainty/bands'
import type { TwoSetVariation } from '../../../shared/physics/uncertainty/two-sets'

/** The snapshot a result keeps of what it ran: the spec, reporting choices and the sets. */
export interface SpecSnapshot {
  studyName: string
  spec: StudySpec
  prescription: string
  clPercent: number
  set: { id: string, name: string, version: string, family: string, kind: string, memberCount: number, confidenceLevelPercent: number }
  /**
   * The study's second set. `variation` (absent in results made before it was recorded, which
   * held the second set at its central member): 'central', 'paired' (member k with member k) or
   * 'apart' (each set varied with the other at its central member; the run's rows are the set's
   * members then the second set's members 1…; shared/physics/uncertainty/two-sets.ts).
   */
  second: {
    id: string, name: string, version: string, kind: string
    family?: string, memberCount?: number, confidenceLevelPercent?: number, variation?: TwoSetVariation
  } | null
}

/** The engine's scale variation (study/scale.ts) as JSON: central member at μ_F = κ μ. */
export interface ScaleVariationJson {
  /** Which variation up/down are: '3-point μ_F' or '7-point μ_F, μ_R' (kernels with α_s); absent in rows stored before it was recorded. */
  variation?: string
  label?: string
  kappas: [number, number, number]
  values: number[][]
  nominal: number[]
  up: number[]
  down: number[]
}

/** One prescription's bands of a result at one CL, as cached in result_bands. */
export interface StoredBands extends BandJson {
  prescription: Prescription
  clPercent: number
  /** The PDF part alone (equal to the total without α_s members). */
  pdf: BandJson
  /** The α_s part per bin, or null when the set has no α_s members. */
  alphas: number[] | null
  /** Which rule made the interval (percentile or Gaussian rescaling) and its label; absent in bands stored before it was recorded. */
  interval?: IntervalRule
  /**
   * An apart run's parts (two-sets.ts): the result's set's band (the top-level band is the
   * combination), the second set's band with its own prescription and the same CL, and the
   * combination in quadrature. Absent for single-set, central and paired runs.
   */
  apart?: ApartBands
}

/** The parts of an apart run's band, as stored with each prescription's bands. */
export interface ApartBands {
  /** The result's set alone (its members with the second set at its central member). */
  set: BandJson & { prescription: Prescription, interval?: IntervalRule }
  /** The second set alone (its members with the result's set at its central member). */
  second: BandJson & { prescription: Prescription, interval?: IntervalRule, name: string }
  /** set ⊕ second, equal to the top-level band. */
  combined: BandJson
}

/** A measurement as stored: the parsed points and, if given, the correlation and what it applies to. */
export type MeasurementJson = MeasurementData
