// Bodies and queries of the set-update routes (reweighting, profiling, sensitivity maps) under
// …/studies/[id]/updates and …/studies/[id]/sensitivity.
import { z } from 'zod'
import { isPartonCode, PARTON_CODES_TEXT } from '../physics/partons'
import { setNameSchema } from './workflow-schemas'
import { storableString } from './storable'

/** Most replicas an unweighted set may have (our choice: ten times the demo's replica sets). */
export const UPDATE_MAX_REPLICAS = 1000
/** Longest version text of a saved set. */
export const UPDATE_VERSION_MAX = 40

/** Body of POST …/studies/[id]/updates: update one of the study's sets by one of its measurements. */
export const impactUpdateSchema = z.object({
  setId: z.uuid({ error: 'Choose one of the study\'s sets' }),
  measurementId: z.uuid({ error: 'Choose one of the study\'s measurements' }),
  /** Name of the saved set (default: the parent's name with '-reweighted' or '-profiled'). */
  name: setNameSchema.optional(),
  /** Version of the saved set (default: the parent's version followed by '+' and the date). */
  version: storableString().trim().min(1, 'The version cannot be empty').max(UPDATE_VERSION_MAX, `Keep the version under ${UPDATE_VERSION_MAX} characters`).optional(),
  /** Reweighting: replicas of the unweighted set (default the parent's count). */
  replicas: z.number({ error: 'The replica count is a whole number' }).int('The replica count is a whole number')
    .min(2, 'The unweighted set needs at least 2 replicas').max(UPDATE_MAX_REPLICAS, `At most ${UPDATE_MAX_REPLICAS} replicas`).optional(),
  /** Reweighting: seed of the unweighting's random offset. */
  seed: z.number({ error: 'The seed is a whole number' }).int('The seed is a whole number').min(0, 'The seed is ≥ 0').max(Number.MAX_SAFE_INTEGER, 'The seed is below 2^53').optional(),
  /** Profiling: tolerance T > 0 (default: the Gaussian multiple of the set's CL). */
  tolerance: z.number({ error: 'The tolerance is a number' }).positive('The tolerance T must be > 0').max(100, 'A tolerance above 100 is not a tolerance').optional()
}).strict()
export type ImpactUpdateBody = z.infer<typeof impactUpdateSchema>

/** Most x points of a sensitivity map. */
export const SENSITIVITY_MAX_POINTS = 200

/** Query of GET …/studies/[id]/sensitivity. */
export const sensitivityQuerySchema = z.object({
  setId: z.uuid({ error: 'Choose one of the study\'s sets' }),
  flavour: z.coerce.number({ error: `The flavour is a PDG code: ${PARTON_CODES_TEXT}` }).int(`The flavour is a PDG code: ${PARTON_CODES_TEXT}`)
    .refine(isPartonCode, { message: `The flavour is a PDG code: ${PARTON_CODES_TEXT}` }),
  q2: z.coerce.number({ error: 'Q² is a number in GeV²' }).positive('Q² must be > 0 GeV²'),
  /** x points, logarithmically spaced over the set's x range (below x = 0.1) and linearly above. */
  points: z.coerce.number().int('The point count is a whole number').min(5, 'At least 5 x points').max(SENSITIVITY_MAX_POINTS, `At most ${SENSITIVITY_MAX_POINTS} x points`).default(60),
  /** A measurement of the study: adds the sensitivity (cos φ × prediction error / data error). */
  measurementId: z.uuid({ error: 'Not a measurement of this study' }).optional()
})
