// Bands of a result from its stored member values, through the engine's computeBands: the
// worker computes the first bands with these, the server the others.
import type { StoredBands } from '../../database/schema'
import { bandToJson } from '../../../shared/physics/uncertainty/band'
import { combineApart } from '../../../shared/physics/uncertainty/two-sets'
import {
  computeBands, isPrescription, prescriptionsFor, type BandResult, type MemberValues,
  type Prescription
} from '../../../shared/physics/uncertainty'
import type { SetKind } from '../../../shared/physics/types'

/** What the band computation needs to know of the set the members come from. */
export interface MemberSource {
  kind: SetKind
  /** CL of the set's members, percent (SetHeader.confidenceLevelPercent). */
  confidenceLevelPercent: number
  /** [down, up] α_s members (SetHeader.alphasMembers), if any. */
  alphasMembers?: [number, number]
}

/**
 * The prescription to use for a set of `kind` when the study or the request asks for `wanted`:
 * 'auto' (or a prescription that does not apply to this kind, when `strict` is false) gives the
 * kind's default. With `strict`, a prescription that does not apply throws a RangeError.
 */
export function resolvePrescription(kind: SetKind, wanted: string, strict = false): Prescription {
  const valid = prescriptionsFor(kind)
  if (wanted === 'auto') return valid[0]!
  if (isPrescription(wanted) && valid.includes(wanted)) return wanted
  if (strict) {
    throw new RangeError(`Prescription '${wanted}' does not apply to a ${kind} set; use one of: ${valid.join(', ')}`)
  }
  return valid[0]!
}

/** computeBands on stored member values with the set's kind, CL and α_s members. */
export function bandsFromValues(values: MemberValues, source: MemberSource, prescription: Prescription, clPercent: number): BandResult {
  return computeBands(values, {
    kind: source.kind,
    prescription,
    clFrom: source.confidenceLevelPercent,
    clTo: clPercent,
    alphasMembers: source.alphasMembers
  })
}

/** A prescription's bands as cached in result_bands (JSON numbers, null for undefined relative widths). */
export function storedBands(r: BandResult): StoredBands {
  return {
    ...bandToJson(r),
    prescription: r.prescription,
    clPercent: r.clPercent,
    pdf: bandToJson(r.pdf),
    alphas: r.alphas ? Array.from(r.alphas) : null,
    interval: r.interval
  }
}

/** The member source of a set header as stored in error_sets.header. */
export function memberSourceOf(header: { kind: SetKind, confidenceLevelPercent: number, alphasMembers?: [number, number] }): MemberSource {
  return { kind: header.kind, confidenceLevelPercent: header.confidenceLevelPercent, alphasMembers: header.alphasMembers }
}

/**
 * One prescription's bands of an apart run (shared/physics/uncertainty/two-sets.ts): the result's
 * set's part with `prescription`, the second set's part with the same prescription when it fits
 * its kind (else its kind's default) and its own CL rescaled to `clPercent`, and their
 * combination in quadrature as the top-level band; the parts are kept under `apart`. `pdf` and
 * `alphas` stay those of the result's set.
 */
export function apartStoredBands(parts: { main: MemberValues, second: MemberValues },
  sources: { set: MemberSource, second: MemberSource & { name: string, version: string } }, prescription: Prescription, clPercent: number): StoredBands {
  const set = bandsFromValues(parts.main, sources.set, prescription, clPercent)
  const secondPrescription = resolvePrescription(sources.second.kind, prescription)
  const second = bandsFromValues(parts.second, memberSourceOf(sources.second), secondPrescription, clPercent)
  const combined = bandToJson(combineApart(set, second))
  return {
    ...storedBands(set),
    ...combined,
    apart: {
      set: { ...bandToJson(set), prescription, interval: set.interval },
      second: { ...bandToJson(second), prescription: secondPrescription, interval: second.interval, name: `${sources.second.name} ${sources.second.version}` },
      combined
    }
  }
}
