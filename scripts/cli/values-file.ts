/**
 * The member-values document read by `bands`: either what `compute` prints (a `sets` array,
 * each entry carrying kind, clPercent and the members × bins values) or a single plain
 * `{ kind, clPercent, values }`.
 */
import { z, type ZodError } from 'zod'
import { formatPath } from '../../shared/physics/json-path'
import { memberValuesFromRows, type MemberValues } from '../../shared/physics/uncertainty'
import type { SetKind } from '../../shared/physics/types'
import { BadInputError } from './errors'

const finite = z.number({ error: 'must be a number' }).refine(Number.isFinite, 'must be a finite number')
const memberIndex = z.number().int('must be an integer member index').min(1, 'must be a member index ≥ 1')

/** One set's member values: kind, CL of the members (percent, default 68), α_s members, values[member][bin]. */
const valuesEntrySchema = z.looseObject({
  set: z.string().optional(),
  kind: z.enum(['hessian-pairs', 'hessian-one-sided', 'replicas'], { error: 'must be hessian-pairs, hessian-one-sided or replicas' }),
  clPercent: z.number().gt(0, 'must be a percentage above 0').lt(100, 'must be a percentage below 100').optional(),
  alphasMembers: z.tuple([memberIndex, memberIndex]).optional(),
  values: z.array(z.array(finite).min(1, 'a member needs at least one bin'), { error: 'must be an array of members, each an array of bin values' })
    .min(1, 'needs at least the central member')
})

const computeOutputSchema = z.looseObject({
  sets: z.array(valuesEntrySchema).min(1, 'needs at least one set')
})

/** A set's member values, ready for computeBands. */
export interface ValuesEntry {
  set: string
  kind: SetKind
  clPercent: number
  alphasMembers?: [number, number]
  matrix: MemberValues
}

/**
 * One line for the first problem zod found: `<file>: <path>: <message>` (and how many more).
 * @example zodProblem('values.json', error) // "values.json: sets[0].kind: must be hessian-pairs, …"
 */
export function zodProblem(file: string, error: ZodError): BadInputError {
  const first = error.issues[0]!
  const path = formatPath(first.path)
  const more = error.issues.length > 1 ? ` (and ${error.issues.length - 1} more problem${error.issues.length > 2 ? 's' : ''})` : ''
  return new BadInputError(`${file}: ${path === '' ? '' : `${path}: `}${first.message}${more}`)
}

/**
 * Reads a values document already parsed from JSON.
 * @param fallbackName set name used for a plain document without `set`.
 * @throws BadInputError naming the file and JSON path of the first problem, or the member and
 * bin of a ragged matrix.
 */
export function readValuesDocument(doc: unknown, file: string, fallbackName: string): ValuesEntry[] {
  const isComputeOutput = typeof doc === 'object' && doc !== null && 'sets' in doc
  const parsed = isComputeOutput ? computeOutputSchema.safeParse(doc) : valuesEntrySchema.safeParse(doc)
  if (!parsed.success) throw zodProblem(file, parsed.error)
  const entries = isComputeOutput ? (parsed.data as z.infer<typeof computeOutputSchema>).sets : [parsed.data as z.infer<typeof valuesEntrySchema>]
  return entries.map((e, i) => {
    const where = isComputeOutput ? `sets[${i}].values` : 'values'
    let matrix: MemberValues
    try {
      matrix = memberValuesFromRows(e.values)
    } catch (err) {
      throw new BadInputError(`${file}: ${where}: ${(err as Error).message}`)
    }
    const entry: ValuesEntry = { set: e.set ?? (isComputeOutput ? `set ${i + 1}` : fallbackName), kind: e.kind, clPercent: e.clPercent ?? 68, matrix }
    if (e.alphasMembers) entry.alphasMembers = e.alphasMembers
    return entry
  })
}
