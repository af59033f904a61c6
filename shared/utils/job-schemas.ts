import { z } from 'zod'

/** States of queued work, as in the database (server/database/schema/workflow.ts jobStates). */
export const JOB_STATES = ['queued', 'running', 'done', 'failed', 'cancelled'] as const

/** GET …/jobs?kind=&state=&limit=: what the job monitor lists. */
export const jobsQuerySchema = z.object({
  kind: z.enum(['run', 'build'], { error: 'kind is run or build' }).optional(),
  state: z.enum(JOB_STATES, { error: `state is one of ${JOB_STATES.join(', ')}` }).optional(),
  limit: z.coerce.number({ error: 'limit is a number of jobs' }).int('limit is a whole number').min(1, 'limit is at least 1').max(500, 'limit is at most 500').optional()
}).strict()
