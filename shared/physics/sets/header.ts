import { z } from 'zod'
import { setDensitySchema } from '../fragmentation/species'
import { partonCodeSchema } from '../partons'
import type { SetHeader } from '../types'
import { SET_BODY_ORDER, SET_FORMAT_VERSION } from './format'

/**
 * zod schemas of the JSON header of a set file (format.ts) and of SetHeader. Objects are strict:
 * an unknown key is refused, so a misspelt key cannot silently drop information.
 */

const text = (max: number) => z.string().min(1, 'must not be empty').max(max, `must be at most ${max} characters`)
const alphas = z.number().gt(0.05, 'α_s(M_Z) must exceed 0.05').lt(0.3, 'α_s(M_Z) must be below 0.3')

/** zod schema of SetHeader (types.ts). Cross-field rules are in validate.ts. */
export const setHeaderSchema = z.strictObject({
  name: text(200),
  family: text(200),
  version: text(100),
  kind: z.enum(['hessian-pairs', 'hessian-one-sided', 'replicas']),
  confidenceLevelPercent: z.number().gt(0, 'must be a percentage above 0').lt(100, 'must be a percentage below 100'),
  alphasMz: z.array(alphas).optional(),
  alphasMembers: z.tuple([z.number().int().min(1), z.number().int().min(1)]).optional(),
  alphasMzCentral: alphas,
  order: z.literal('LO'),
  scheme: z.strictObject({
    type: z.enum(['fixed', 'variable']),
    nf: z.union([z.literal(3), z.literal(4), z.literal(5), z.literal(6)]),
    massesGeV: z.strictObject({
      charm: z.number().positive('must be a positive mass in GeV'),
      bottom: z.number().positive('must be a positive mass in GeV'),
      top: z.number().positive('must be a positive mass in GeV')
    })
  }),
  target: z.discriminatedUnion('type', [
    z.strictObject({ type: z.literal('proton') }),
    z.strictObject({ type: z.literal('nucleus'), z: z.number().int().min(1), a: z.number().int().min(1).max(300) })
  ]),
  provenance: z.string().max(4000),
  memberCount: z.number().int().min(0),
  replicaCentral: z.enum(['mean', 'fit']).optional(),
  density: setDensitySchema.optional()
})


/** zod schema of the whole JSON header of a set file. */
export const setFileHeaderSchema = z.strictObject({
  formatVersion: z.literal(SET_FORMAT_VERSION),
  set: setHeaderSchema,
  grid: z.strictObject({
    x: z.array(z.number()).min(2, 'needs at least 2 x nodes'),
    q2GeV2: z.array(z.number()).min(2, 'needs at least 2 Q² nodes'),
    flavours: z.array(partonCodeSchema).min(1, 'needs at least one flavour')
  }),
  body: z.strictObject({
    encoding: z.enum(['float64-le', 'float32-le']),
    order: z.literal(SET_BODY_ORDER),
    valueCount: z.number().int().min(0)
  })
})

export type SetFileHeader = z.infer<typeof setFileHeaderSchema>

/** Drops undefined optional keys so headers compare and serialise cleanly. */
export function cleanHeader(header: SetHeader): SetHeader {
  const out: Record<string, unknown> = {}
  for (const [k, v] of Object.entries(header)) if (v !== undefined) out[k] = v
  return out as unknown as SetHeader
}
