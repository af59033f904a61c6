/**
 * Updates of an error set by a measurement (reweighting a replica set, profiling a Hessian set):
 * one row per request, filled by the impact-update job, with the derived set it saved to the
 * library. Re-exported by schema/index.ts; imports workflow (columns ← accounts ← workflow ← impact).
 */
import { relations } from 'drizzle-orm'
import { boolean, index, integer, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import type { BandJson } from '../../../shared/physics/uncertainty/band'
import { users, workspaces } from './accounts'
import { createdAt, updatedAt } from './columns'
import { errorSets, jobStates, measurements, results, studies } from './workflow'

/** How a set is updated: Bayesian reweighting (replicas) or profiling (Hessian). */
export const impactMethods = ['reweight', 'profile'] as const
export type ImpactMethod = typeof impactMethods[number]

/** What the request asked for, as checked when it was made. */
export interface ImpactRequest {
  /** Name and version the saved set gets in the library. */
  name: string
  version: string
  /** Reweighting: replicas of the unweighted set and the seed of its random offset. */
  replicas?: number
  seed?: number
  /** Profiling: the tolerance T (default: the Gaussian multiple of the set's CL). */
  tolerance?: number
}

/** What a finished update found (JSON numbers; null where a value is undefined). */
export interface ImpactSummary {
  method: ImpactMethod
  points: number
  parent: { id: string, name: string, version: string, kind: string, memberCount: number }
  measurement: { id: string, name: string }
  study: { id: string, name: string }
  result: { id: string, version: number }
  /** χ² of the data with the parent's central prediction and with the updated one (experimental covariance). */
  chi2Before: number
  chi2After: number
  /** The study's bins with the parent set and the saved set, 68% CL, each by its kind's default prescription. */
  before: BandJson
  after: BandJson
  data: number[]
  reweight?: {
    replicas: number
    effectiveReplicas: number
    warning: string | null
    unweightedReplicas: number
    distinctReplicas: number
    seed: number | null
    profile: { alpha: number[], density: number[], mostProbableAlpha: number }
  }
  profile?: {
    tolerance: number
    shifts: number[]
    penalty: number
    eigenvalues: number[]
  }
  caution: string
}

export const impactUpdates = pgTable('impact_updates', {
  id: uuid().primaryKey().defaultRandom(),
  workspaceId: uuid().notNull().references(() => workspaces.id, { onDelete: 'cascade' }),
  studyId: uuid().notNull().references(() => studies.id, { onDelete: 'cascade' }),
  measurementId: uuid().references(() => measurements.id, { onDelete: 'set null' }),
  /** The parent set's result the update read (its member values). */
  resultId: uuid().references(() => results.id, { onDelete: 'set null' }),
  parentSetId: uuid().references(() => errorSets.id, { onDelete: 'set null' }),
  method: text({ enum: impactMethods }).notNull(),
  request: jsonb().$type<ImpactRequest>().notNull(),
  state: text({ enum: jobStates }).notNull().default('queued'),
  error: text(),
  cancelRequested: boolean().notNull().default(false),
  requestedBy: uuid().references(() => users.id, { onDelete: 'set null' }),
  jobId: text(),
  startedAt: timestamp({ withTimezone: true }),
  finishedAt: timestamp({ withTimezone: true }),
  progressDone: integer().notNull().default(0),
  progressTotal: integer().notNull().default(0),
  summary: jsonb().$type<ImpactSummary>(),
  /** The derived set saved to the library. */
  setId: uuid().references(() => errorSets.id, { onDelete: 'set null' }),
  createdAt: createdAt(),
  updatedAt: updatedAt()
}, t => [
  index('impact_updates_workspace_id_idx').on(t.workspaceId),
  index('impact_updates_study_id_idx').on(t.studyId),
  index('impact_updates_set_id_idx').on(t.setId)
])

export const impactUpdatesRelations = relations(impactUpdates, ({ one }) => ({
  workspace: one(workspaces, { fields: [impactUpdates.workspaceId], references: [workspaces.id] }),
  study: one(studies, { fields: [impactUpdates.studyId], references: [studies.id] }),
  set: one(errorSets, { fields: [impactUpdates.setId], references: [errorSets.id] })
}))

export type ImpactUpdate = typeof impactUpdates.$inferSelect
