// Request bodies and queries of the workflow routes (zod). The study's spec itself is checked by
// the engine (checkStudySpec), which locates problems by bin and column. Every string is a
// storableString and every free JSON document a storableJson (see storable.ts); every name,
// label, comment and description has a length cap.
import { z } from 'zod'
import { PRESCRIPTIONS } from '../physics/uncertainty/bands'
import { GridSpecSchema, MembersSpecSchema } from '../physics/input/schema'
import { storableJson, storableString } from './storable'

/**
 * Longest set name, as the set-file header allows (shared/physics/sets/header.ts): with the
 * version (at most 100) the unique (workspace, name, version) index entry stays under 1.3 KB,
 * well below PostgreSQL's B-tree limit of about 2.7 KB.
 */
export const SET_NAME_MAX = 200
/** Longest stored file name of an uploaded set. */
export const SET_FILE_NAME_MAX = 255

/** A set name typed by a person (upload, rename, build). */
export const setNameSchema = storableString({ error: 'Give the set a name' }).trim()
  .min(1, 'The name cannot be empty').max(SET_NAME_MAX, `Keep the name under ${SET_NAME_MAX} characters`)

/** Body of PATCH …/sets/[sid]: rename. */
export const setRenameSchema = z.object({ name: setNameSchema }).strict()

/** The text parts of a set upload (multipart): the optional name and the file's own name. */
export const setUploadFieldsSchema = z.object({
  name: setNameSchema.optional(),
  fileName: storableString().max(SET_FILE_NAME_MAX, `Keep the file name under ${SET_FILE_NAME_MAX} characters`)
})

const clPercent = z.number({ error: 'The confidence level is a number of percent' })
  .gt(0, 'The confidence level must be above 0%').lt(100, 'The confidence level must be below 100%')

export const prescriptionChoice = z.enum(['auto', ...PRESCRIPTIONS], {
  error: `Choose a prescription: auto, ${PRESCRIPTIONS.join(', ')}`
})

const setIdList = z.array(z.uuid({ error: 'Each set id must be a uuid' })).max(20, 'Run at most 20 sets in one study')
  .refine(ids => new Set(ids).size === ids.length, 'A set appears twice in setIds')

export const studyCreateSchema = z.object({
  name: storableString({ error: 'Give the study a name' }).trim().min(1, 'Give the study a name').max(200, 'Keep the name under 200 characters'),
  description: storableString().max(5000, 'Keep the description under 5000 characters').default(''),
  /** The engine's StudySpec (kernel, options, bins, optional per-bin kFactors …), checked by the engine (bin and column located). */
  spec: storableJson().refine(v => v !== undefined, 'Give the study spec (kernel, options and bins)'),
  setIds: setIdList.default([]),
  secondSetId: z.uuid({ error: 'secondSetId must be a uuid' }).nullable().default(null),
  prescription: prescriptionChoice.default('auto'),
  clPercent: clPercent.default(68)
}).strict()
export type StudyCreate = z.infer<typeof studyCreateSchema>

/** A PATCH changes any subset of the fields; `revision` guards against overwriting a newer save. */
export const studyPatchSchema = z.object({
  name: studyCreateSchema.shape.name.optional(),
  description: storableString().max(5000, 'Keep the description under 5000 characters').optional(),
  spec: storableJson().optional(),
  setIds: setIdList.optional(),
  secondSetId: z.uuid().nullable().optional(),
  prescription: prescriptionChoice.optional(),
  clPercent: clPercent.optional(),
  revision: z.number().int().min(1).optional()
}).strict()

/** Body of POST …/studies/validate: a draft to check without saving. */
export const studyDraftSchema = z.object({
  spec: storableJson(),
  setIds: setIdList.default([]),
  secondSetId: z.uuid().nullable().default(null)
}).strict()

/** Body of POST …/studies/[id]/run: which of the study's sets to run (default all). */
export const runRequestSchema = z.object({
  setIds: z.array(z.uuid()).min(1, 'Pick at least one set to run').optional()
}).strict()

/** Query of a result's bands: prescription (default the study's) and CL (default the study's). */
export const bandsQuerySchema = z.object({
  prescription: prescriptionChoice.optional(),
  cl: z.coerce.number({ error: 'cl is a number of percent' }).gt(0, 'cl must be above 0').lt(100, 'cl must be below 100').optional()
})

export const exportQuerySchema = bandsQuerySchema.extend({
  format: z.enum(['csv', 'json', 'latex', 'covariance', 'correlation'], { error: 'format is one of csv, json, latex, covariance, correlation' })
})

export const contributionsQuerySchema = z.object({
  bin: z.coerce.number({ error: 'bin is a 1-based bin number' }).int('bin is a whole number').min(1, 'bins are numbered from 1'),
  cl: bandsQuerySchema.shape.cl
})

export const reviewCommentSchema = z.object({
  comment: storableString().trim().max(4000, 'Keep the comment under 4000 characters').default('')
}).strict()

export const returnCommentSchema = z.object({
  comment: storableString({ error: 'Say what needs to change' }).trim().min(1, 'Say what needs to change').max(4000, 'Keep the comment under 4000 characters')
}).strict()

/** Most flavours one densities request may ask for (after duplicates are dropped). */
export const DENSITIES_MAX_FLAVOURS = 13

/** Query of a set's densities at one Q²: a flavour named twice is plotted once. */
export const densitiesQuerySchema = z.object({
  q2: z.coerce.number({ error: 'q2 is a number of GeV²' }).positive('Q² must be positive'),
  flavours: storableString().default('21,2,1,-2,-1,3')
    .transform((s, ctx) => {
      const list = [...new Set(s.split(',').map(v => v.trim()).filter(Boolean))]
      const bad = list.filter(v => !/^(-?[1-6]|21|22|uv|dv)$/.test(v))
      if (bad.length) ctx.addIssue({ code: 'custom', message: `Unknown flavour ${bad.slice(0, 5).join(', ')}${bad.length > 5 ? ', …' : ''}: use PDG codes (1..6, -1..-6, 21, 22) or uv, dv` })
      else if (list.length > DENSITIES_MAX_FLAVOURS) ctx.addIssue({ code: 'custom', message: `Ask for at most ${DENSITIES_MAX_FLAVOURS} flavours at once; got ${list.length} different ones` })
      return list.map(v => (v === 'uv' || v === 'dv' ? v : Number(v)))
    }),
  points: z.coerce.number().int().min(10).max(400).default(100),
  /** How the points are spread over the grid's momentum fractions: even in ln x (log) or in x (linear). */
  spacing: z.enum(['log', 'linear'], { error: 'spacing is log or linear' }).default('log'),
  prescription: prescriptionChoice.optional(),
  cl: bandsQuerySchema.shape.cl,
  ratioTo: z.uuid({ error: 'ratioTo is the id of another set' }).optional(),
  /** One x instead of the log-spaced points (a family's R at fixed x against A). */
  x: z.coerce.number({ error: 'x is a number' }).positive('x must be positive').lt(1, 'x must be below 1').optional()
})

export const sumRulesQuerySchema = z.object({
  q2: z.coerce.number({ error: 'q2 is a number of GeV²' }).positive('Q² must be positive'),
  prescription: prescriptionChoice.optional(),
  cl: bandsQuerySchema.shape.cl
})

/** Body of POST …/sets/builds: build an error set from a parametrised fit. */
export const setBuildSchema = z.object({
  /** Name of the set to create; default the input document's name. */
  name: setNameSchema.optional(),
  /** The parametrised input (or nuclear modification) document, as JSON. */
  input: storableJson().refine(v => v !== undefined, 'Give the parametrised input document'),
  /** For a nuclear modification: its baseline parametrised input. */
  baseline: storableJson().optional(),
  /** Hessian (tolerance) or replicas (count, seed); overrides the document's `members`. */
  members: MembersSpecSchema.optional(),
  /** Output grid; overrides the document's `grid`. */
  grid: GridSpecSchema.optional(),
  /**
   * For a nuclear modification: build it for these nuclei, one set each, in one job. Each entry
   * is an element symbol of a usual target ("Fe" = ⁵⁶Fe, "D" the deuteron) or { z, a, name? }.
   */
  nuclei: z.array(z.union([
    storableString().trim().min(1, 'A nucleus symbol cannot be empty').max(8, 'A nucleus symbol is at most 8 characters'),
    z.object({
      z: z.number({ error: 'Z is a whole number' }).int('Z is a whole number'),
      a: z.number({ error: 'A is a whole number' }).int('A is a whole number'),
      name: setNameSchema.optional()
    }).strict()
  ], { error: 'Each nucleus is an element symbol ("Fe") or { "z": 26, "a": 56 }' })).min(1, 'Give at least one nucleus').max(12, 'Build at most 12 nuclei in one job').optional()
}).strict()

/** Comparison of several sets' latest results of one study. */
export const comparisonQuerySchema = z.object({
  setIds: storableString().optional().transform(s => (s ? [...new Set(s.split(',').map(v => v.trim()).filter(Boolean))] : undefined))
    .pipe(z.array(z.uuid({ error: 'setIds is a comma-separated list of set ids' })).max(20, 'Compare at most 20 sets at once').optional()),
  cl: bandsQuerySchema.shape.cl,
  /** Default: 100, or fewer when a replica set has fewer replicas. */
  replicasPerSet: z.coerce.number().int().min(2).max(2000).optional(),
  seed: z.coerce.number().int().min(0).max(Number.MAX_SAFE_INTEGER).default(1)
})

export const measurementJsonSchema = z.object({
  name: storableString({ error: 'Give the measurement a name' }).trim().min(1, 'Give the measurement a name').max(200, 'Keep the name under 200 characters'),
  /** The points CSV text. */
  csv: storableString({ error: 'Give the points as CSV text' }).min(1, 'The CSV is empty'),
  /** Optional N × N correlation matrix: CSV text, JSON text, or an array of rows. */
  correlation: z.union([storableString(), z.array(z.array(z.number({ error: 'Each correlation is a finite number' })))], { error: 'The correlation matrix is CSV or JSON text, or an array of rows of numbers' }).optional(),
  /** Which errors the correlation matrix applies to; required with a matrix. */
  correlationOf: z.enum(['stat', 'syst', 'total'], { error: 'correlationOf is one of stat, syst, total' }).optional(),
  /** How the syst column combines between points when the matrix is not of syst. */
  systCombination: z.enum(['uncorrelated', 'fully-correlated'], { error: 'systCombination is uncorrelated or fully-correlated' }).optional()
}).strict()

export const chi2QuerySchema = z.object({
  setIds: comparisonQuerySchema.shape.setIds
})
