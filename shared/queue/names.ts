import { z } from 'zod'

/** BullMQ queue names. One queue per kind of work so workers can scale them separately. */
export const QUEUES = {
  demo: 'sheaf-demo'
} as const

/** Job kinds stored in jobs.kind. */
export const JOB_KINDS = {
  square: 'demo.square'
} as const

/** Body of POST /api/workspaces/[wid]/jobs: numbers to square, one step per number. */
export const squareRequestSchema = z.object({
  numbers: z.array(z.number({ error: 'Each entry must be a number' }).finite().min(-1e6).max(1e6))
    .min(1, 'Give at least one number').max(50, 'Give at most 50 numbers'),
  stepMs: z.number().int().min(0).max(2000).default(200)
})

/** Payload on the queue: the jobs row id plus the validated request. */
export const squarePayloadSchema = squareRequestSchema.extend({ jobId: z.uuid() })
export type SquarePayload = z.infer<typeof squarePayloadSchema>
