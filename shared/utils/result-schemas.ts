import { z } from 'zod'
import { bandsQuerySchema } from './workflow-schemas'

/**
 * GET …/results/[rid]: the bands' prescription and CL, and which bins (0-based `binsOffset`,
 * `binsLimit` bins or `all`; by default the first page, see server/domain/results/page.ts).
 */
export const resultQuerySchema = bandsQuerySchema.extend({
  binsOffset: z.coerce.number({ error: 'binsOffset is a 0-based bin number' }).int('binsOffset is a whole number').min(0, 'binsOffset is 0 or more').optional(),
  binsLimit: z.union([
    z.literal('all'),
    z.coerce.number({ error: 'binsLimit is a number of bins or all' }).int('binsLimit is a whole number').min(1, 'binsLimit is at least 1').max(100_000, 'binsLimit is at most 100000')
  ], { error: 'binsLimit is a number of bins or all' }).optional()
})
