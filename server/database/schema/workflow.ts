/**
 * Tables of the analyst's workflow: the error-set library, studies, versioned results with their
 * per-member values, the bands cache, reviews and measurements. Re-exported by schema/index.ts.
 *
 * Storage choice: a set file and a result's member values live in PostgreSQL `bytea` columns,
 * not on disk. One transaction then stores or refuses everything (no orphan file when an insert
 * fails, no temp-file rename), and a test database is cleaned by dropping it.
 */
import { relations, sql } from 'drizzle-orm'
import {
  boolean, doublePrecision, index, integer, jsonb, pgTable, primaryKey, text,
  timestamp, unique, uuid
} from 'drizzle-orm/pg-core'
import type { SetHeader, SetTarget } from '../../../shared/physics/types'
import type { StudySpec } from '../../../shared/physics/study/spec'
import { JOB_PHASES, type SetBuildRequest } from '../../../shared/queue/workflow'
import { users, workspaces } from './accounts'
import { bytea, createdAt, updatedAt } from './columns'
import type { MeasurementJson, ScaleVariationJson, SpecSnapshot, StoredBands } from './json'

/** Kinds of error sets, as in shared/physics/types.ts SetKind. */
export const setKinds = ['hessian-pairs', 'hessian-one-sided', 'replicas'] as const
/** States of anything that runs on the queue (a result, a set build). */
export const jobStates = ['queued', 'running', 'done', 'failed', 'cancelled'] as const
/** What a queued or running job is doing now (shared/queue/workflow.ts JOB_PHASES). */
export const jobPhases = JOB_PHASES
export type JobState = typeof jobStates[number]
/** Review states of a result version; `approved` freezes it. */
export const reviewStates = ['draft', 'submitted', 'approved', 'returned'] as const
export type ReviewState = typeof reviewStates[number]

/** Columns of a row that a queued job fills (a set build, a result). */
const queuedWork = () => ({
  state: text({ enum: jobStates }).notNull().default('queued'),
  /** The failure reason shown to users. */
  error: text(),
  /** Set by Cancel; the worker stops at the next chunk. */
  cancelRequested: boolean().notNull().default(false),
  /** The phase named in the progress: queued, evaluating/evolving members, combining, storing. */
  phase: text({ enum: jobPhases }).notNull().default('queued'),
  requestedBy: uuid().references(() => users.id, { onDelete: 'set null' }),
  /** BullMQ job id (= the row id). */
  jobId: text(),
  startedAt: timestamp({ withTimezone: true }),
  finishedAt: timestamp({ withTimezone: true })
})

// ---------------------------------------------------------------- error sets

export const errorSets = pgTable('error_sets', {
  id: uuid().primaryKey().defaultRandom(),
  workspaceId: uuid().notNull().references(() => workspaces.id, { onDelete: 'cascade' }),
  name: text().notNull(),
  family: text().notNull(),
  version: text().notNull(),
  kind: text({ enum: setKinds }).notNull(),
  /** Members including the central one. */
  memberCount: integer().notNull(),
  confidenceLevelPercent: doublePrecision().notNull(),
  xMin: doublePrecision().notNull(),
  xMax: doublePrecision().notNull(),
  /** Smallest and largest Q² node, GeV². */
  q2Min: doublePrecision().notNull(),
  q2Max: doublePrecision().notNull(),
  /** SetTarget: { type: 'proton' } or { type: 'nucleus', z, a }. */
  target: jsonb().$type<SetTarget>().notNull(),
  /** The full SetHeader as parsed. */
  header: jsonb().$type<SetHeader>().notNull(),
  /** The grid's nodes { x, q2, flavours }: reach checks need them without reading the file. */
  axes: jsonb().$type<{ x: number[], q2: number[], flavours: number[] }>().notNull(),
  /** 'upload' or 'build' (built from a fit by the build-set job). */
  origin: text({ enum: ['upload', 'build'] }).notNull(),
  fileName: text().notNull(),
  sizeBytes: integer().notNull(),
  sha256: text().notNull(),
  /** The set file in Sheaf's format, byte for byte as uploaded or written. */
  content: bytea().notNull(),
  addedBy: uuid().references(() => users.id, { onDelete: 'set null' }),
  createdAt: createdAt(),
  updatedAt: updatedAt()
}, t => [
  index('error_sets_workspace_id_idx').on(t.workspaceId),
  unique('error_sets_workspace_id_name_version_unique').on(t.workspaceId, t.name, t.version)
])

/** A request to build a set from a parametrised fit, and its progress on the queue. */
export const setBuilds = pgTable('set_builds', {
  id: uuid().primaryKey().defaultRandom(),
  workspaceId: uuid().notNull().references(() => workspaces.id, { onDelete: 'cascade' }),
  /** Name the built set will get. */
  name: text().notNull(),
  /** The validated build request (input, method, grid). */
  request: jsonb().$type<SetBuildRequest>().notNull(),
  ...queuedWork(),
  progressDone: integer().notNull().default(0),
  progressTotal: integer().notNull().default(0),
  setId: uuid().references(() => errorSets.id, { onDelete: 'set null' }),
  /**
   * Every set the build wrote, in request order: one for a single fit, one per nucleus for a
   * nuclear family built for several nuclei (setId is then the first).
   */
  setIds: uuid().array().notNull().default(sql`'{}'::uuid[]`),
  createdAt: createdAt(),
  updatedAt: updatedAt()
}, t => [index('set_builds_workspace_id_idx').on(t.workspaceId)])

// ---------------------------------------------------------------- studies

export const studies = pgTable('studies', {
  id: uuid().primaryKey().defaultRandom(),
  workspaceId: uuid().notNull().references(() => workspaces.id, { onDelete: 'cascade' }),
  name: text().notNull(),
  description: text().notNull().default(''),
  /** The engine's StudySpec (kernel, constants, bins). */
  spec: jsonb().$type<StudySpec>().notNull(),
  /** Error sets to run, in display order. */
  setIds: uuid().array().notNull().default(sql`'{}'::uuid[]`),
  /**
   * A second set for kernels that read two (beam 2 of a p–A collision, the nuclear set of a
   * nuclear ratio); held at its central member while the main set's members vary.
   */
  secondSetId: uuid().references(() => errorSets.id, { onDelete: 'set null' }),
  /** Prescription to report ('auto' = the one the set's kind implies). */
  prescription: text().notNull().default('auto'),
  clPercent: doublePrecision().notNull().default(68),
  /** Incremented on every saved edit; a result records the revision it ran. */
  revision: integer().notNull().default(1),
  createdBy: uuid().references(() => users.id, { onDelete: 'set null' }),
  createdAt: createdAt(),
  updatedAt: updatedAt()
}, t => [index('studies_workspace_id_idx').on(t.workspaceId)])

// ---------------------------------------------------------------- results

/** One computation of one study on one set; versions count up per (study, set). */
export const results = pgTable('results', {
  id: uuid().primaryKey().defaultRandom(),
  studyId: uuid().notNull().references(() => studies.id, { onDelete: 'cascade' }),
  /** restrict: a set in use by a result cannot be deleted (the route answers 409 first). */
  setId: uuid().notNull().references(() => errorSets.id, { onDelete: 'restrict' }),
  /** The study's second set when this version ran (see studies.secondSetId). */
  secondSetId: uuid().references(() => errorSets.id, { onDelete: 'restrict' }),
  version: integer().notNull(),
  studyRevision: integer().notNull(),
  /** The study's spec, prescription and CL and the set's header summary, as run. */
  specSnapshot: jsonb().$type<SpecSnapshot>().notNull(),
  ...queuedWork(),
  membersDone: integer().notNull().default(0),
  membersTotal: integer().notNull(),
  binCount: integer().notNull(),
  reviewState: text({ enum: reviewStates }).notNull().default('draft'),
  engineVersion: text(),
  createdAt: createdAt(),
  updatedAt: updatedAt()
}, t => [
  unique('results_study_id_set_id_version_unique').on(t.studyId, t.setId, t.version),
  index('results_study_id_idx').on(t.studyId),
  index('results_set_id_idx').on(t.setId)
])

/**
 * The per-member observable values of a finished result: Float64 little-endian, member-major
 * (`values[m * binCount + b]`), one row per result so a 100-replica × 200-bin result is one
 * 160 kB insert. The factorisation-scale variation of the central member is stored apart.
 */
export const resultValues = pgTable('result_values', {
  resultId: uuid().primaryKey().references(() => results.id, { onDelete: 'cascade' }),
  memberCount: integer().notNull(),
  binCount: integer().notNull(),
  values: bytea().notNull(),
  /**
   * The engine's scaleVariation of the central member (κ × ½, 1, 2): { kappas, values (3 rows),
   * nominal, up, down }; null when a varied scale leaves a set's grid.
   */
  scale: jsonb().$type<ScaleVariationJson>(),
  createdAt: createdAt()
})

/** Bands computed from resultValues, per prescription and CL (a cache; recomputable). */
export const resultBands = pgTable('result_bands', {
  resultId: uuid().notNull().references(() => results.id, { onDelete: 'cascade' }),
  prescription: text().notNull(),
  clPercent: doublePrecision().notNull(),
  bands: jsonb().$type<StoredBands>().notNull(),
  createdAt: createdAt()
}, t => [primaryKey({ name: 'result_bands_pk', columns: [t.resultId, t.prescription, t.clPercent] })])

/** Review steps of a result version (submit, approve, return), newest last. */
export const resultReviews = pgTable('result_reviews', {
  id: uuid().primaryKey().defaultRandom(),
  resultId: uuid().notNull().references(() => results.id, { onDelete: 'cascade' }),
  action: text({ enum: ['submitted', 'approved', 'returned'] }).notNull(),
  comment: text().notNull().default(''),
  actorId: uuid().references(() => users.id, { onDelete: 'set null' }),
  createdAt: createdAt()
}, t => [index('result_reviews_result_id_idx').on(t.resultId)])

// ---------------------------------------------------------------- measurements

/** A measured spectrum to compare a study's results with (χ²). */
export const measurements = pgTable('measurements', {
  id: uuid().primaryKey().defaultRandom(),
  studyId: uuid().notNull().references(() => studies.id, { onDelete: 'cascade' }),
  name: text().notNull(),
  /** { values, stat, syst: number[][] (per source, per bin), correlation?: number[][] } */
  data: jsonb().$type<MeasurementJson>().notNull(),
  pointCount: integer().notNull(),
  uploadedBy: uuid().references(() => users.id, { onDelete: 'set null' }),
  createdAt: createdAt()
}, t => [index('measurements_study_id_idx').on(t.studyId)])

// ---------------------------------------------------------------- relations

export const errorSetsRelations = relations(errorSets, ({ one, many }) => ({
  workspace: one(workspaces, { fields: [errorSets.workspaceId], references: [workspaces.id] }),
  addedByUser: one(users, { fields: [errorSets.addedBy], references: [users.id] }),
  results: many(results)
}))

export const setBuildsRelations = relations(setBuilds, ({ one }) => ({
  workspace: one(workspaces, { fields: [setBuilds.workspaceId], references: [workspaces.id] }),
  set: one(errorSets, { fields: [setBuilds.setId], references: [errorSets.id] })
}))

export const studiesRelations = relations(studies, ({ one, many }) => ({
  workspace: one(workspaces, { fields: [studies.workspaceId], references: [workspaces.id] }),
  results: many(results),
  measurements: many(measurements)
}))

export const resultsRelations = relations(results, ({ one, many }) => ({
  study: one(studies, { fields: [results.studyId], references: [studies.id] }),
  set: one(errorSets, { fields: [results.setId], references: [errorSets.id] }),
  values: one(resultValues, { fields: [results.id], references: [resultValues.resultId] }),
  bands: many(resultBands),
  reviews: many(resultReviews)
}))

export const resultValuesRelations = relations(resultValues, ({ one }) => ({
  result: one(results, { fields: [resultValues.resultId], references: [results.id] })
}))

export const resultBandsRelations = relations(resultBands, ({ one }) => ({
  result: one(results, { fields: [resultBands.resultId], references: [results.id] })
}))

export const resultReviewsRelations = relations(resultReviews, ({ one }) => ({
  result: one(results, { fields: [resultReviews.resultId], references: [results.id] })
}))

export const measurementsRelations = relations(measurements, ({ one }) => ({
  study: one(studies, { fields: [measurements.studyId], references: [studies.id] })
}))

export type ErrorSetRow = typeof errorSets.$inferSelect
export type NewErrorSetRow = typeof errorSets.$inferInsert
export type SetBuild = typeof setBuilds.$inferSelect
export type Study = typeof studies.$inferSelect
export type NewStudy = typeof studies.$inferInsert
export type Result = typeof results.$inferSelect
export type NewResult = typeof results.$inferInsert
export type ResultValues = typeof resultValues.$inferSelect
export type ResultReview = typeof resultReviews.$inferSelect
export type Measurement = typeof measurements.$inferSelect
