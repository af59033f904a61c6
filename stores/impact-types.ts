// What the set-update routes answer, as the impact components read it.
import type { BandJson } from '#shared/physics/uncertainty/band'

export interface ImpactSummaryView {
  method: 'reweight' | 'profile'
  points: number
  parent: { id: string, name: string, version: string, kind: string, memberCount: number }
  measurement: { id: string, name: string }
  study: { id: string, name: string }
  result: { id: string, version: number }
  chi2Before: number
  chi2After: number
  before: BandJson
  after: BandJson
  data: number[]
  reweight?: { replicas: number, effectiveReplicas: number, warning: string | null, unweightedReplicas: number, distinctReplicas: number, seed: number | null, profile: { alpha: number[], density: number[], mostProbableAlpha: number } }
  profile?: { tolerance: number, shifts: number[], penalty: number, eigenvalues: number[] }
  caution: string
}

export interface ImpactUpdateView {
  id: string
  studyId: string
  measurementId: string | null
  parentSetId: string | null
  method: 'reweight' | 'profile'
  request: { name: string, version: string, replicas?: number, seed?: number, tolerance?: number }
  state: string
  error: string | null
  cancelRequested: boolean
  progress: { done: number, total: number, percent: number }
  summary: ImpactSummaryView | null
  setId: string | null
  createdAt: string
  finishedAt: string | null
}

/** A label per bin of a study: its own label, else its number. */
export function studyBinLabels(study: { spec: { bins: ReadonlyArray<Record<string, unknown>> } }): string[] {
  return study.spec.bins.map((b, i) => (typeof b.label === 'string' && b.label ? b.label : String(i + 1)))
}
