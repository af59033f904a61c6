import { cautionOfKernel } from './caution'
import { variationText } from '../physics/uncertainty/two-sets'
import type { ExportKFactors, ExportObservable, ExportProvenance, ExportSecondSet } from './types'

export const isoTime = (t: string | Date) => (typeof t === 'string' ? t : t.toISOString())

/** "68% CL" or "68% CL (set published at 90% CL, rescaled)". */
export function confidenceText(p: ExportProvenance): string {
  const rescaled = p.setConfidenceLevelPercent !== undefined && p.setConfidenceLevelPercent !== p.confidenceLevelPercent
  return `${p.confidenceLevelPercent}% CL${rescaled ? ` (set published at ${p.setConfidenceLevelPercent}% CL, rescaled)` : ''}`
}

/** "approved by Ana Ruiz at 2025-03-02T10:00:00Z", "submitted for review", "draft, not reviewed". */
export function approvalText(p: ExportProvenance): string {
  const { state, by, at } = p.approval
  const who = `${by ? ` by ${by}` : ''}${at ? ` at ${isoTime(at)}` : ''}`
  switch (state) {
    case 'approved': return `approved${who}`
    case 'submitted': return `submitted for review${who}, not yet approved`
    case 'returned': return `returned by the reviewer${who}, not approved`
    default: return 'draft, not reviewed'
  }
}

export const setText = (p: ExportProvenance) => `${p.set.name} version ${p.set.version} (${p.set.kind}${p.set.family ? `, family ${p.set.family}` : ''})`

const constantsText = (c: ExportProvenance['kernel']['constants']) =>
  Object.entries(c).map(([k, v]) => `${k}=${v}`).join(', ') || 'none'

/** The provenance line of K-factors: that they were used, their source, how their uncertainty is reported. */
export function kFactorText(k: ExportKFactors): string {
  const error = !k.withErrors
    ? 'no K-factor uncertainty given'
    : `their uncertainty is reported apart (band k-factor)${k.addedInQuadrature ? ' and also added in quadrature to the PDF band (band pdf+k-factor)' : ''}`
  return `per-bin K-factors multiply every member before the bands (columns kFactor, kFactorError); source: ${k.source?.trim() || 'not given'}; ${error}`
}

/**
 * The provenance line of a second set: which set and how its members entered the bands, e.g.
 * "Ostrand-25-C12 version 1 (hessian-pairs, family Ostrand-25); correlated: members paired".
 */
export function secondSetText(s: ExportSecondSet): string {
  const own = s.variation === 'apart' && s.prescription ? `; its own band: ${s.prescription}, at the same CL` : ''
  return `${s.name} version ${s.version} (${s.kind}${s.family ? `, family ${s.family}` : ''}); ${variationText(s.variation)}${own}`
}

/**
 * The provenance as "key: value" lines, the same in every format (CSV `#` comments, LaTeX `%`
 * comments), ending with the caution.
 */
export function provenanceLines(p: ExportProvenance, observable: ExportObservable, what: string): string[] {
  return [
    `Sheaf export: ${what}`,
    ...(p.study ? [`study: ${p.study.name}${p.study.id ? ` (${p.study.id})` : ''}`] : []),
    `observable: ${observable.name}${observable.unit ? ` [${observable.unit}]` : ''}`,
    `set: ${setText(p)}`,
    ...(p.secondSet ? [`second set: ${secondSetText(p.secondSet)}`] : []),
    `prescription: ${p.prescription}; ${confidenceText(p)}`,
    `kernel: ${p.kernel.id}${p.kernel.label ? ` (${p.kernel.label})` : ''}; constants: ${constantsText(p.kernel.constants)}`,
    ...(p.kFactors ? [`K-factors: ${kFactorText(p.kFactors)}`] : []),
    `engine version: ${p.engineVersion}`,
    `run by: ${p.ranBy} at ${isoTime(p.ranAt)}`,
    `result version: ${p.resultVersion}; ${approvalText(p)}`,
    ...(p.exportedAt || p.exportedBy ? [`exported${p.exportedBy ? ` by ${p.exportedBy}` : ''}${p.exportedAt ? ` at ${isoTime(p.exportedAt)}` : ''}`] : []),
    `caution: ${cautionOfKernel(Boolean(p.kFactors), p.kernel.id, p.secondSet?.variation)}`
  ]
}

/** The provenance as a plain object for JSON (dates as ISO strings). */
export function provenanceObject(p: ExportProvenance) {
  return {
    ...p,
    ranAt: isoTime(p.ranAt),
    approval: { ...p.approval, ...(p.approval.at ? { at: isoTime(p.approval.at) } : {}) },
    ...(p.exportedAt ? { exportedAt: isoTime(p.exportedAt) } : {}),
    confidence: confidenceText(p),
    ...(p.secondSet ? { secondSet: { ...p.secondSet, text: secondSetText(p.secondSet) } } : {})
  }
}
