import { z } from 'zod'
import { bandsQuerySchema } from './workflow-schemas'

/** Query of GET …/studies/[id]/export: all of a study's sets side by side, at ?cl= (default the study's). */
export const studyExportQuerySchema = z.object({
  format: z.enum(['csv', 'json', 'latex'], { error: 'format is one of csv, json, latex' }),
  cl: bandsQuerySchema.shape.cl
})
