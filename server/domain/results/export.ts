import { and, desc, eq } from 'drizzle-orm'
import type { DB } from '../../database/client'
import { tables as t } from '../../database/client'
import type { Result, ScaleVariationJson, StoredBands, Study } from '../../database/schema'
import type { BinColumn as GridColumn, BinRow as GridRow } from '../../../shared/bins/types'
import type { ExportObservable, ExportProvenance, ExportSecondSet, LabelledBand, ResultForExport } from '../../../shared/export/types'
import { variationText } from '../../../shared/physics/uncertainty/two-sets'
import { bandToJson, makeBands } from '../../../shared/physics/uncertainty/band'
import * as C from '../../../shared/physics/constants'
import { kernelDefinition } from '../../../shared/physics/kernels/registry'
import { BIN_COLUMNS, type StudySpec } from '../../../shared/physics/study/spec'
import type { SetHeader } from '../../../shared/physics/types'
import type { Prescription } from '../../../shared/physics/uncertainty/bands'
import { PRESCRIPTION_LABELS } from '../../../shared/utils/prescriptions'
import { slotsOf } from '../../../shared/utils/set-match'
import { studyObservable } from '../../../shared/bins/observable'
import type { StudyForExport } from '../../../shared/export/study'
import { fail } from '../errors'
import { latestDoneResults } from '../studies/studies'
import { resolvePrescription } from './bands'
import { apartSecondHeader, reportingChoice, resultBands, resultSetHeader, userNames } from './results'
import { exportKFactors, kFactorExportBands, kFactorView } from './k-factors'

const COLUMN_LABELS: Record<string, { label: string, unit?: string }> = {
  x: { label: 'x' }, xMin: { label: 'x min' }, xMax: { label: 'x max' },
  q2: { label: 'Q²', unit: 'GeV²' }, q2Min: { label: 'Q² min', unit: 'GeV²' }, q2Max: { label: 'Q² max', unit: 'GeV²' },
  y: { label: 'y' }, yMin: { label: 'y min' }, yMax: { label: 'y max' },
  m: { label: 'M', unit: 'GeV' }, mMin: { label: 'M min', unit: 'GeV' }, mMax: { label: 'M max', unit: 'GeV' },
  z: { label: 'z' }, zMin: { label: 'z min' }, zMax: { label: 'z max' },
  sqrtS: { label: '√s', unit: 'GeV' }, sqrtSMin: { label: '√s min', unit: 'GeV' }, sqrtSMax: { label: '√s max', unit: 'GeV' }
}

/** Kinematic columns used by any bin of the spec, in the engine's column order (label first if any). */
export function exportColumns(spec: StudySpec): GridColumn[] {
  const used = BIN_COLUMNS.filter(c => spec.bins.some(b => b[c] !== undefined))
  const columns: GridColumn[] = used.map(key => ({ key, label: COLUMN_LABELS[key]!.label, unit: COLUMN_LABELS[key]!.unit, kind: 'number' }))
  if (spec.bins.some(b => b.label)) columns.unshift({ key: 'label', label: 'bin', kind: 'text' })
  // The K-factors of each bin (and their uncertainty) follow the kinematics.
  if (spec.kFactors) columns.push({ key: 'kFactor', label: 'K-factor', kind: 'number' })
  if (spec.kFactors?.errors) columns.push({ key: 'kFactorError', label: 'K-factor error', kind: 'number' })
  return columns
}

/** The bins as export rows: the kinematics, with the bin's K-factor and its error when the study has them. */
export function exportBins(spec: StudySpec): GridRow[] {
  const k = spec.kFactors
  return spec.bins.map((b, i) => ({
    ...b,
    ...(k ? { kFactor: k.values[i]! } : {}),
    ...(k?.errors ? { kFactorError: k.errors[i]! } : {})
  }) as GridRow)
}

/** Options as flat "key=value" constants (nested objects get dotted keys), with the physical constants. */
function kernelConstants(spec: StudySpec): Record<string, number | string | boolean> {
  const out: Record<string, number | string | boolean> = {}
  const walk = (prefix: string, v: unknown) => {
    if (v !== null && typeof v === 'object' && !Array.isArray(v)) for (const [k, w] of Object.entries(v)) walk(prefix ? `${prefix}.${k}` : k, w)
    else if (typeof v === 'number' || typeof v === 'string' || typeof v === 'boolean') out[prefix] = v
    else if (v !== undefined) out[prefix] = JSON.stringify(v)
  }
  walk('', spec.options)
  Object.assign(out, {
    quadratureOrder: spec.quadratureOrder, fullRangeOrder: spec.fullRangeOrder, scaleFactor: spec.scaleFactor, rangeMode: spec.rangeMode,
    // The physical constants the kernels use, as the engine defines them (shared/physics/constants.ts, sources there).
    alphaEm: C.ALPHA_EM, gFermiGeVm2: C.GF_GEV2, mWGeV: C.MW_GEV, mZGeV: C.MZ_GEV, mHGeV: C.MH_GEV,
    sin2ThetaWEff: C.SIN2_THETA_W_EFF, hbarc2PbGeV2: C.HBARC2_PB_GEV2
  })
  return out
}

/** The observable of every export: named and given its unit from the bin layout (shared/bins/observable.ts). */
export function exportObservable(spec: StudySpec): ExportObservable {
  const { name, latex, unit, perBin } = studyObservable(spec)
  return { name, ...(unit ? { unit } : {}), ...(latex ? { latex } : {}), ...(perBin ? { perBin } : {}) }
}

/** The provenance block of every export of result `r`. */
export async function exportProvenance(db: DB, r: Result, study: Pick<Study, 'id' | 'name'>, header: SetHeader, prescription: Prescription, clPercent: number, exportedBy: string): Promise<ExportProvenance> {
  const snap = r.specSnapshot
  const spec = snap.spec
  const def = kernelDefinition(spec.kernel)
  const names = await userNames(db, [r.requestedBy])
  const [approval] = await db.select({ at: t.resultReviews.createdAt, by: t.users.name }).from(t.resultReviews)
    .leftJoin(t.users, eq(t.users.id, t.resultReviews.actorId))
    .where(and(eq(t.resultReviews.resultId, r.id), eq(t.resultReviews.action, 'approved')))
    .orderBy(desc(t.resultReviews.createdAt)).limit(1)
  return {
    study: { id: study.id, name: study.name },
    set: { name: snap.set.name, version: snap.set.version, kind: snap.set.kind, family: snap.set.family },
    prescription: PRESCRIPTION_LABELS[prescription],
    confidenceLevelPercent: clPercent,
    setConfidenceLevelPercent: header.confidenceLevelPercent,
    kernel: { id: spec.kernel, label: def.title, constants: kernelConstants(spec) },
    engineVersion: r.engineVersion ?? 'unknown',
    ranBy: (r.requestedBy && names.get(r.requestedBy)) || 'unknown',
    ranAt: r.finishedAt ?? r.createdAt,
    resultVersion: r.version,
    approval: r.reviewState === 'approved' && approval
      ? { state: 'approved', by: approval.by ?? undefined, at: approval.at }
      : { state: r.reviewState },
    exportedBy,
    exportedAt: new Date(),
    ...(spec.kFactors ? { kFactors: exportKFactors(spec) } : {}),
    ...(snap.second ? { secondSet: await exportSecondSet(db, r, prescription) } : {})
  }
}

/** The second set of a result as the exports describe it (name, variation, and an apart run's own prescription). */
async function exportSecondSet(db: DB, r: Result, prescription: Prescription): Promise<ExportSecondSet> {
  const second = r.specSnapshot.second!
  const variation = second.variation ?? 'central'
  const header = variation === 'apart' ? await apartSecondHeader(db, r) : null
  return {
    name: second.name, version: second.version, kind: second.kind, ...(second.family ? { family: second.family } : {}), variation,
    ...(header ? { prescription: PRESCRIPTION_LABELS[resolvePrescription(header.kind, prescription)] } : {})
  }
}

/**
 * The bands of a two-set result as exported: a paired run's band says it is correlated; an apart
 * run gives the combination first, then each set's part (two-sets.ts).
 */
function twoSetBands(provenance: ExportProvenance, prescription: Prescription, bands: StoredBands, pdfLabel: string): LabelledBand[] {
  const second = provenance.secondSet
  if (!second || second.variation === 'central') return [{ id: prescription, label: pdfLabel, band: bands }]
  if (second.variation === 'paired' || !bands.apart) return [{ id: prescription, label: `${pdfLabel} (${variationText(second.variation)})`, band: bands }]
  const { set, second: part } = bands.apart
  return [
    { id: prescription, label: `${pdfLabel}, ${provenance.set.name} ⊕ ${part.name} (${variationText('apart')})`, band: bands },
    { id: `${prescription}-set`, label: `${provenance.set.name} alone (${PRESCRIPTION_LABELS[set.prescription]}; ${part.name} at its central member)`, band: set },
    { id: `${part.prescription}-second`, label: `${part.name} alone (${PRESCRIPTION_LABELS[part.prescription]}; ${provenance.set.name} at its central member)`, band: part }
  ]
}

/**
 * A result version as the shared/export formatters take it: the PDF band, then the K-factor
 * uncertainty (apart, and with the PDF band in quadrature when the study asks), then the scale band apart.
 */
export function resultForExport(
  provenance: ExportProvenance, spec: StudySpec, prescription: Prescription, bands: StoredBands,
  scale: ScaleVariationJson | null
): ResultForExport {
  // The band's first word says whose members vary in it: PDF, or fragmentation functions (FF).
  const pdfLabel = `${slotsOf(spec.kernel).main === 'fragmentation' ? 'FF' : 'PDF'}, ${PRESCRIPTION_LABELS[prescription]}`
  const exportBands: LabelledBand[] = twoSetBands(provenance, prescription, bands, pdfLabel)
  exportBands.push(...kFactorExportBands(kFactorView(spec, bands, bands.clPercent), bands, pdfLabel))
  if (scale) {
    const [lo, mid, hi] = scale.kappas
    exportBands.push({ id: 'scale', label: `factorisation-scale variation, μ_F/μ = ${lo}, ${mid}, ${hi} (not a PDF uncertainty)`, band: bandToJson(makeBands(scale.nominal, scale.up, scale.down)) })
  }
  return {
    provenance,
    observable: exportObservable(spec),
    binColumns: exportColumns(spec),
    bins: exportBins(spec),
    bands: exportBands
  }
}

/**
 * A study's newest finished result on each of its sets, side by side (shared/export/study.ts),
 * each at the study's prescription for its kind and at `clPercent` (default the study's CL as
 * run). 409 when none has finished or when they ran on different bins.
 */
export async function studyForExport(db: DB, study: Study, query: { cl?: number }, exportedBy: string): Promise<StudyForExport> {
  const results = await latestDoneResults(db, study.id, study.setIds)
  if (!results.length) fail(409, 'No finished results to export yet; run the study first')
  if (new Set(results.map(r => JSON.stringify(r.specSnapshot.spec.bins))).size > 1) {
    fail(409, 'The newest results were computed on different bins (the study was edited between runs); run the study again on every set')
  }
  if (new Set(results.map(r => JSON.stringify(r.specSnapshot.spec.kFactors ?? null))).size > 1) {
    fail(409, 'The newest results were computed with different K-factors (the study was edited between runs); run the study again on every set')
  }
  const ids = new Set<string>()
  const sets = await Promise.all(results.map(async (r) => {
    const header = await resultSetHeader(db, r)
    const { prescription, clPercent } = reportingChoice(r, header, { cl: query.cl })
    const band = await resultBands(db, r, header, prescription, clPercent)
    const provenance = await exportProvenance(db, r, study, header, prescription, clPercent, exportedBy)
    return { r, provenance, band }
  }))
  const spec = results[0]!.specSnapshot.spec
  return {
    study: { id: study.id, name: study.name },
    observable: exportObservable(spec),
    binColumns: exportColumns(spec),
    bins: exportBins(spec),
    sets: sets.map(({ r, provenance, band }) => {
      let id = `${r.specSnapshot.set.name}-${r.specSnapshot.set.version}`.replace(/[^\w.-]+/g, '_')
      while (ids.has(id)) id += '_'
      ids.add(id)
      return { id, provenance, band }
    }),
    exportedBy,
    exportedAt: new Date()
  }
}
