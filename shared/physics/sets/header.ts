import { z } from 'zod'
import { setDensitySchema, type SetDensity } from '../fragmentation/species'
import { partonCodeSchema } from '../partons'
import type { SetHeader, SetTarget } from '../types'
import { SET_BODY_ORDER, SET_FORMAT_VERSION } from './format'

/**
 * zod schemas of the JSON header of a set file (format.ts) and of SetHeader. Objects are strict:
 * an unknown key is refused, so a misspelt key cannot silently drop information.
 */

const text = (max: number) => z.string().min(1, 'must not be empty').max(max, `must be at most ${max} characters`)
const alphas = z.number().gt(0.05, 'α_s(M_Z) must exceed 0.05').lt(0.3, 'α_s(M_Z) must be below 0.3')

const targetSchema = z.discriminatedUnion('type', [
  z.strictObject({ type: z.literal('proton') }),
  z.strictObject({ type: z.literal('nucleus'), z: z.number().int().min(1), a: z.number().int().min(1).max(300) })
])

/** The fields every version of the header shares (version 1 has exactly these). */
const headerFields = {
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
  target: targetSchema,
  provenance: z.string().max(4000),
  memberCount: z.number().int().min(0),
  replicaCentral: z.enum(['mean', 'fit']).optional()
}

/** zod schema of SetHeader (types.ts), the in-memory header. Cross-field rules are in validate.ts. */
export const setHeaderSchema = z.strictObject({ ...headerFields, density: setDensitySchema.optional() })

/**
 * The neutral target a fragmentation set carries in memory. A fragmentation function describes
 * a parton turning into a hadron, not the content of a target, so a version-2 file of a
 * fragmentation set has no `set.target`; the reader fills in this value, the writer drops it
 * again. It is the free-proton value so that code asking "is this a nucleus?" gets "no" and
 * the database's target column stays filled; never read it as "a proton target": ask
 * `densityOf(header)` first.
 */
export const NO_TARGET: SetTarget = Object.freeze({ type: 'proton' }) as SetTarget

/** Name of the momentum-fraction axis of a grid holding this density: x for partons, z for fragmentation. */
export function fractionAxisOf(density: SetDensity | undefined): 'x' | 'z' {
  return density?.type === 'fragmentation' ? 'z' : 'x'
}

/**
 * The rule tying `target` to `density`: a parton-density header needs a target; a
 * fragmentation header has none. `where` is the path prefix of the header ('set.' in a file).
 * Returns the problem (path and message) or undefined.
 */
export function densityTargetProblem(header: { density?: SetDensity, target?: SetTarget }, where: string): { path: string, message: string } | undefined {
  const density = header.density ?? { type: 'parton' }
  if (density.type === 'fragmentation' && header.target !== undefined) {
    return { path: `${where}target`, message: `a fragmentation set (into ${density.hadron}) has no target: a fragmentation function describes a parton turning into a hadron, not a target's content; remove ${where}target` }
  }
  if (density.type === 'parton' && header.target === undefined) {
    return { path: `${where}target`, message: `a set of parton densities needs ${where}target: { "type": "proton" } or { "type": "nucleus", "z": Z, "a": A }` }
  }
  return undefined
}

/** zod schema of the `set` object of a version-1 file header: parton densities, no `density` key. */
const fileSetV1Schema = z.strictObject(headerFields)

/**
 * zod schema of the `set` object of a version-2 file header: `density` is required, `target`
 * present for parton densities and absent for fragmentation (checked by densityTargetProblem).
 */
const fileSetV2Schema = z.strictObject({ ...headerFields, target: targetSchema.optional(), density: setDensitySchema })

const bodySchema = z.strictObject({
  encoding: z.enum(['float64-le', 'float32-le']),
  order: z.literal(SET_BODY_ORDER),
  valueCount: z.number().int().min(0)
})
const q2Nodes = z.array(z.number()).min(2, 'needs at least 2 Q² nodes')
const flavourList = z.array(partonCodeSchema).min(1, 'needs at least one flavour')

/** zod schema of a version-1 file header (parton densities, axis `grid.x`). */
export const setFileHeaderV1Schema = z.strictObject({
  formatVersion: z.literal(1),
  set: fileSetV1Schema,
  grid: z.strictObject({ x: z.array(z.number()).min(2, 'needs at least 2 x nodes'), q2GeV2: q2Nodes, flavours: flavourList }),
  body: bodySchema
})

/**
 * zod schema of a version-2 file header, the one the writer produces. The momentum-fraction axis
 * is `grid.x` for parton densities and `grid.z` for fragmentation functions (exactly one of the
 * two; which one is checked against `set.density` by the parser).
 */
export const setFileHeaderSchema = z.strictObject({
  formatVersion: z.literal(SET_FORMAT_VERSION, { error: 'formatVersion must be 1 or 2' }),
  set: fileSetV2Schema,
  grid: z.strictObject({
    x: z.array(z.number()).min(2, 'needs at least 2 x nodes').optional(),
    z: z.array(z.number()).min(2, 'needs at least 2 z nodes').optional(),
    q2GeV2: q2Nodes,
    flavours: flavourList
  }),
  body: bodySchema
})

export type SetFileHeader = z.infer<typeof setFileHeaderSchema>

/** Drops undefined optional keys so headers compare and serialise cleanly. */
export function cleanHeader(header: SetHeader): SetHeader {
  const out: Record<string, unknown> = {}
  for (const [k, v] of Object.entries(header)) if (v !== undefined) out[k] = v
  return out as unknown as SetHeader
}

/**
 * The in-memory header as a version-2 file writes it: `density` always said, `target` dropped for
 * a fragmentation set (it has none; see NO_TARGET).
 */
export function fileSetHeader(header: SetHeader): SetFileHeader['set'] {
  const density = header.density ?? { type: 'parton' as const }
  const { target, density: _density, ...rest } = cleanHeader(header)
  return density.type === 'fragmentation' ? { ...rest, density } : { ...rest, target, density }
}

/**
 * The in-memory header of a file's `set` object (either version): a fragmentation set gets the
 * neutral NO_TARGET; parton densities are the absent `density` (types.ts), so `{ type: 'parton' }`
 * is dropped and a header read back equals the one written.
 */
export function memorySetHeader(set: SetFileHeader['set'] | z.infer<typeof fileSetV1Schema>): SetHeader {
  const density = 'density' in set ? set.density : undefined
  if (density?.type === 'fragmentation') return cleanHeader({ ...set, target: { ...NO_TARGET }, density } as SetHeader)
  const { density: _density, ...rest } = set as SetFileHeader['set']
  return cleanHeader(rest as SetHeader)
}
