// Pages of bins of a result: past RESULT_PAGE_BINS bins, the result API sends one page of bins
// (their kinematics, bands and scale variation) at a time, so the study page of a 10,000-bin
// result loads a fraction of it; the member values never leave the server (bands for another
// prescription or CL are computed here, see results.ts).
import type { ScaleVariationJson, StoredBands } from '../../database/schema'
import type { BandJson } from '../../../shared/physics/uncertainty/band'
import type { StudySpec } from '../../../shared/physics/study/spec'
import { fail } from '../errors'

/** Bins sent at once by default; a result with at most this many is sent whole. */
export const RESULT_PAGE_BINS = Number(process.env.SHEAF_RESULT_PAGE_BINS ?? 2000)

export interface BinPage { offset: number, limit: number, total: number }

/**
 * The page of `total` bins a request asks for: `binsOffset` (0-based, default 0) and `binsLimit`
 * (default RESULT_PAGE_BINS; 'all' for every bin). 400 naming the parameter for an offset past
 * the last bin.
 */
export function binPage(total: number, query: { binsOffset?: number, binsLimit?: number | 'all' }): BinPage {
  const offset = query.binsOffset ?? 0
  if (offset > 0 && offset >= total) {
    fail(400, `binsOffset ${offset} is past the last bin: this result has ${total} bins (0-based offsets 0 to ${total - 1})`, { fields: { binsOffset: `at most ${total - 1}` } })
  }
  const wanted = query.binsLimit === 'all' ? total : query.binsLimit ?? RESULT_PAGE_BINS
  return { offset, limit: Math.max(0, Math.min(wanted, total - offset)), total }
}

const slice = <T>(a: T[], p: BinPage) => (p.offset === 0 && p.limit === a.length ? a : a.slice(p.offset, p.offset + p.limit))
const bandPage = (b: BandJson, p: BinPage): BandJson => ({
  central: slice(b.central, p), plus: slice(b.plus, p), minus: slice(b.minus, p), relPlus: slice(b.relPlus, p), relMinus: slice(b.relMinus, p)
})

/** A result's bands on the bins of page `p`. */
export function bandsPage(bands: StoredBands, p: BinPage): StoredBands {
  const apart = bands.apart
  return {
    ...bands, ...bandPage(bands, p), pdf: bandPage(bands.pdf, p), alphas: bands.alphas ? slice(bands.alphas, p) : null,
    ...(apart ? { apart: { set: { ...apart.set, ...bandPage(apart.set, p) }, second: { ...apart.second, ...bandPage(apart.second, p) }, combined: bandPage(apart.combined, p) } } : {})
  }
}

/** A scale variation on the bins of page `p`. */
export function scalePage(scale: ScaleVariationJson, p: BinPage): ScaleVariationJson {
  return { ...scale, kappas: scale.kappas, values: scale.values.map(v => slice(v, p)), nominal: slice(scale.nominal, p), up: slice(scale.up, p), down: slice(scale.down, p) }
}

/** The bins of page `p` of a list (the spec's bins). */
export const binsPage = <T>(bins: T[], p: BinPage) => slice(bins, p)

/** The spec with the bins (and their K-factors, if any) of page `p`. */
export function specPage(spec: StudySpec, p: BinPage): StudySpec {
  const k = spec.kFactors
  return {
    ...spec,
    bins: slice(spec.bins, p),
    ...(k ? { kFactors: { ...k, values: slice(k.values, p), ...(k.errors ? { errors: slice(k.errors, p) } : {}) } } : {})
  }
}
