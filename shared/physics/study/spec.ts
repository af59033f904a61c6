import { z } from 'zod'
import type { AnyKernelDefinition, CompositeDefinition, KernelDefinition, VariableName, VariableSpec } from '../kernels/registry'
import { KERNEL_IDS, kernelDefinition } from '../kernels/registry'

/**
 * A study: which kernel, its options, and the bins — plain JSON shared by the web app, the
 * worker and the command line. Example (Drell–Yan at 13 TeV, two mass points, each integrated
 * over a rapidity bin with 8 Gauss–Legendre points):
 * ```json
 * { "kernel": "drell-yan", "options": { "sqrtSGeV": 13000 },
 *   "bins": [ { "m": 20, "yMin": 0, "yMax": 0.5 }, { "m": 40, "yMin": 0, "yMax": 0.5 } ],
 *   "quadratureOrder": 8 }
 * ```
 * Each bin is a row whose columns give every variable of the kernel either as a point (`m`) or
 * as a range (`mMin`, `mMax`). A range is integrated over (rangeMode 'integrate', the default)
 * or averaged ('average'); ranged variables use the Gauss–Legendre rule of `quadratureOrder`
 * points each. Totals and luminosities integrate the whole rapidity range inside each bin with
 * `fullRangeOrder` points. The factorisation scale is μ_F = scaleFactor · μ (μ = Q for DIS, the
 * produced mass for hadron–hadron kernels); kernels with α_s (gg → H) take it at
 * μ_R = renormalisationScaleFactor · μ (default 1), set independently.
 */

/** Columns a bin row may carry: each variable as a point or as Min/Max. */
// In the order exports list them: the collision energy first, then x, z and Q² as physicists write them.
export const BIN_COLUMNS = ['sqrtS', 'sqrtSMin', 'sqrtSMax', 'x', 'xMin', 'xMax', 'z', 'zMin', 'zMax', 'q2', 'q2Min', 'q2Max', 'y', 'yMin', 'yMax', 'm', 'mMin', 'mMax'] as const
export type BinColumn = typeof BIN_COLUMNS[number]

/** One bin: a point or a range per kernel variable, and an optional label. */
export type BinRow = Partial<Record<BinColumn, number>> & { label?: string }

const finite = z.number({ error: 'must be a number' }).refine(Number.isFinite, 'must be a finite number')

/** zod schema of one bin row (structure only; kernel-specific checks in {@link checkStudySpec}). */
export const binRowSchema = z.strictObject({
  label: z.string().max(200).optional(),
  ...Object.fromEntries(BIN_COLUMNS.map(c => [c, finite.optional()])) as Record<BinColumn, z.ZodOptional<typeof finite>>
})

/** Most characters of a K-factor source text. */
export const K_FACTOR_SOURCE_MAX = 2000

/**
 * zod schema of a study's per-bin K-factors (see shared/physics/impact/k-factors.ts): one K per
 * bin (finite, > 0), optionally one uncertainty δK per bin (finite, ≥ 0, one standard deviation),
 * where they came from, and whether δK is added in quadrature to the PDF band (default: reported apart).
 */
export const kFactorsSchema = z.strictObject({
  values: z.array(finite.refine(v => v > 0, 'a K-factor must be > 0')),
  errors: z.array(finite.refine(v => v >= 0, 'a K-factor uncertainty must be ≥ 0')).optional(),
  source: z.string().max(K_FACTOR_SOURCE_MAX, `keep the source under ${K_FACTOR_SOURCE_MAX} characters`).optional(),
  addErrorInQuadrature: z.boolean({ error: 'must be true or false' }).optional()
})

/** A study's K-factors as stored in its spec. */
export type StudyKFactors = z.infer<typeof kFactorsSchema>

/** zod schema of a study specification (structure only). */
export const studySpecSchema = z.strictObject({
  title: z.string().max(200).optional(),
  kernel: z.string({ error: 'must name a kernel' }),
  options: z.record(z.string(), z.unknown()).optional(),
  bins: z.array(binRowSchema).min(1, 'a study needs at least one bin').max(100_000, 'a study may have at most 100000 bins'),
  quadratureOrder: z.number().int('must be an integer').min(1, 'must be at least 1').max(64, 'must be at most 64').optional(),
  fullRangeOrder: z.number().int('must be an integer').min(4, 'must be at least 4').max(256, 'must be at most 256').optional(),
  scaleFactor: z.number().min(0.25, 'must be at least 0.25').max(4, 'must be at most 4').optional(),
  renormalisationScaleFactor: z.number().min(0.25, 'must be at least 0.25').max(4, 'must be at most 4').optional(),
  rangeMode: z.enum(['integrate', 'average']).optional(),
  kFactors: kFactorsSchema.optional(),
  varySecondSet: z.boolean({ error: 'must be true or false' }).optional()
})

/** A study specification as written by a user (optional fields may be missing). */
export type StudySpecInput = z.input<typeof studySpecSchema>

/** A validated study with defaults filled in. */
export interface StudySpec {
  title?: string
  kernel: string
  options: Record<string, unknown>
  bins: BinRow[]
  /** Gauss–Legendre points per integrated variable (default 8). */
  quadratureOrder: number
  /** Gauss–Legendre points over the full rapidity range of totals and luminosities (default 32). */
  fullRangeOrder: number
  /** κ in μ_F = κ μ (default 1). */
  scaleFactor: number
  /** κ_R in μ_R = κ_R μ for kernels with α_s (gg → H); default 1, independent of scaleFactor. */
  renormalisationScaleFactor?: number
  rangeMode: 'integrate' | 'average'
  /** Per-bin K-factors multiplying every member's value before the bands; absent: none. */
  kFactors?: StudyKFactors
  /**
   * Vary the study's second set too (each set's members with the other at its central member,
   * the two bands combined in quadrature; uncertainty/two-sets.ts). A fragmentation second set
   * always varies; two sets of one family with the same member layout are paired instead.
   */
  varySecondSet?: boolean
}

/** One problem found in a study, located for the bins grid. */
export interface StudyIssue {
  /** 1-based bin row, when the problem is in a bin. */
  bin?: number
  /** Column of the bin row or option key, when known. */
  column?: string
  /** Full path in the JSON document. */
  path: Array<string | number>
  /** Located, physicist-readable message, e.g. "bin 3, column xMin: x must be in (0, 1)". */
  message: string
}

/** Thrown by {@link parseStudySpec}: every issue found, the first one in the message. */
export class StudySpecError extends RangeError {
  readonly issues: StudyIssue[]
  constructor(issues: StudyIssue[]) {
    super(issues.length === 1 ? issues[0]!.message : `${issues[0]!.message} (and ${issues.length - 1} more problem${issues.length > 2 ? 's' : ''})`)
    this.name = 'StudySpecError'
    this.issues = issues
  }
}

/** The bins-grid column of a K-factor field. */
const K_COLUMNS: Record<string, string> = { values: 'kFactor', errors: 'kFactorError' }

function issueAt(path: Array<string | number>, text: string): StudyIssue {
  if (path[0] === 'kFactors' && typeof path[1] === 'string' && K_COLUMNS[path[1]] && typeof path[2] === 'number') {
    const bin = path[2] + 1
    const column = K_COLUMNS[path[1]]!
    return { bin, column, path, message: `bin ${bin}, column ${column}: ${text}` }
  }
  if (path[0] === 'bins' && typeof path[1] === 'number') {
    const bin = path[1] + 1
    const column = typeof path[2] === 'string' ? path[2] : undefined
    return { bin, column, path, message: `bin ${bin}${column ? `, column ${column}` : ''}: ${text}` }
  }
  if (path[0] === 'options' && path.length > 1) {
    const column = path.slice(1).join('.')
    return { column, path, message: `option ${column}: ${text}` }
  }
  return { path, message: path.length > 0 ? `${path.join('.')}: ${text}` : text }
}

function zodIssues(error: z.ZodError, prefix: Array<string | number>): StudyIssue[] {
  return error.issues.flatMap((i) => {
    const path = [...prefix, ...i.path.map(p => (typeof p === 'symbol' ? String(p) : p))]
    // One issue per unknown key, located at the key itself (a bins-grid column or an option).
    if (i.code === 'unrecognized_keys') return i.keys.map(k => issueAt([...path, k], path[0] === 'bins' ? 'unknown column' : 'unknown key'))
    return [issueAt(path, i.message)]
  })
}

/** The variables of a kernel (a composite takes those of its first part). */
export function kernelVariables(def: AnyKernelDefinition, options: Record<string, unknown>): readonly VariableSpec[] {
  if (!def.composite) return def.variables(options)
  const [first] = def.parts(options)
  return (kernelDefinition(first.kernel) as KernelDefinition).variables(first.options)
}

function checkOptions(def: AnyKernelDefinition, options: Record<string, unknown>): StudyIssue[] {
  const parsed = def.optionsSchema.safeParse(options)
  if (!parsed.success) return zodIssues(parsed.error, ['options'])
  if (!def.composite) return []
  const issues: StudyIssue[] = []
  for (const part of (def as CompositeDefinition).parts(options)) {
    const inner = kernelDefinition(part.kernel)
    const r = inner.optionsSchema.safeParse(part.options)
    if (!r.success) issues.push(...zodIssues(r.error, ['options']))
  }
  return issues
}

function checkBin(row: BinRow, index: number, variables: readonly VariableSpec[]): StudyIssue[] {
  const issues: StudyIssue[] = []
  const at = (column: string, text: string) => issues.push(issueAt(['bins', index, column], text))
  const names = new Set<VariableName>(variables.map(v => v.name))
  for (const column of BIN_COLUMNS) {
    if (row[column] === undefined) continue
    const base = column.replace(/(Min|Max)$/, '') as VariableName
    if (!names.has(base)) {
      at(column, variables.length === 0
        ? 'this kernel has no bin variables (it integrates the whole phase space); leave the row empty'
        : `this kernel has no variable ${base}; its variables are ${variables.map(v => v.name).join(', ')}`)
    }
  }
  for (const v of variables) {
    const point = row[v.name]
    const lo = row[`${v.name}Min` as BinColumn]
    const hi = row[`${v.name}Max` as BinColumn]
    if (point !== undefined && (lo !== undefined || hi !== undefined)) {
      at(v.name, `give ${v.name} either as a point or as ${v.name}Min and ${v.name}Max, not both`)
      continue
    }
    if (point === undefined && lo === undefined && hi === undefined) {
      issues.push(issueAt(['bins', index], `missing ${v.label}: give ${v.name}, or ${v.name}Min and ${v.name}Max`))
      continue
    }
    if (point !== undefined) {
      const why = v.check(point)
      if (why) at(v.name, why)
      continue
    }
    if (lo === undefined) {
      at(`${v.name}Min`, `missing; a range needs both ${v.name}Min and ${v.name}Max`)
      continue
    }
    if (hi === undefined) {
      at(`${v.name}Max`, `missing; a range needs both ${v.name}Min and ${v.name}Max`)
      continue
    }
    const whyLo = v.check(lo)
    const whyHi = v.check(hi)
    if (whyLo) at(`${v.name}Min`, whyLo)
    if (whyHi) at(`${v.name}Max`, whyHi)
    if (!whyLo && !whyHi && !(hi > lo)) at(`${v.name}Max`, `${v.name}Max (${hi}) must exceed ${v.name}Min (${lo})`)
  }
  return issues
}

/** One K-factor (and one uncertainty, when given) per bin. */
function checkKFactorCount(k: StudyKFactors, bins: number): StudyIssue[] {
  const issues: StudyIssue[] = []
  for (const field of ['values', 'errors'] as const) {
    const list = k[field]
    if (list === undefined || list.length === bins) continue
    const what = field === 'values' ? 'K-factors' : 'K-factor uncertainties'
    issues.push({ column: K_COLUMNS[field], path: ['kFactors', field], message: `kFactors.${field} (column ${K_COLUMNS[field]}): ${list.length} ${what} for ${bins} bins; give one per bin` })
  }
  return issues
}

/** Result of {@link checkStudySpec}. */
export type StudyCheck = { ok: true, spec: StudySpec } | { ok: false, issues: StudyIssue[] }

/**
 * Validates a study document: structure (zod), kernel id, the kernel's options (and those of
 * both parts of a composite), and every bin row against the kernel's variables and their
 * domains. Collects every problem with its location ("bin 3, column xMin: x must be in (0, 1)";
 * bins are numbered from 1). The kinematic reach against a set is checked separately
 * ({@link checkReach}), because it needs the set's grid.
 * @example checkStudySpec({ kernel: 'dis-nc-f2', bins: [{ x: 0.01, q2: 10 }] }).ok // true
 */
export function checkStudySpec(input: unknown): StudyCheck {
  const parsed = studySpecSchema.safeParse(input)
  if (!parsed.success) return { ok: false, issues: zodIssues(parsed.error, []) }
  const doc = parsed.data
  if (!KERNEL_IDS.includes(doc.kernel)) {
    return { ok: false, issues: [issueAt(['kernel'], `unknown kernel "${doc.kernel}"; known kernels: ${KERNEL_IDS.join(', ')}`)] }
  }
  const def = kernelDefinition(doc.kernel)
  const options = doc.options ?? {}
  const issues = checkOptions(def, options)
  if (issues.length > 0) return { ok: false, issues }
  const variables = kernelVariables(def, options)
  doc.bins.forEach((row, i) => issues.push(...checkBin(row, i, variables)))
  if (doc.kFactors) issues.push(...checkKFactorCount(doc.kFactors, doc.bins.length))
  if (issues.length > 0) return { ok: false, issues }
  return {
    ok: true,
    spec: {
      title: doc.title,
      kernel: doc.kernel,
      options,
      bins: doc.bins as BinRow[],
      quadratureOrder: doc.quadratureOrder ?? 8,
      fullRangeOrder: doc.fullRangeOrder ?? 32,
      scaleFactor: doc.scaleFactor ?? 1,
      ...(doc.renormalisationScaleFactor !== undefined ? { renormalisationScaleFactor: doc.renormalisationScaleFactor } : {}),
      rangeMode: doc.rangeMode ?? 'integrate',
      ...(doc.kFactors ? { kFactors: doc.kFactors } : {}),
      ...(doc.varySecondSet ? { varySecondSet: true } : {})
    }
  }
}

/**
 * {@link checkStudySpec} that returns the validated spec or throws a {@link StudySpecError}
 * (a RangeError carrying every issue).
 * @example parseStudySpec(JSON.parse(text)).quadratureOrder // 8 unless given
 */
export function parseStudySpec(input: unknown): StudySpec {
  const r = checkStudySpec(input)
  if (!r.ok) throw new StudySpecError(r.issues)
  return r.spec
}

/**
 * Unit of a study's results, e.g. "pb/GeV" for Drell–Yan d²σ/dM dy at points, "pb" when M is
 * integrated over a range, "1" for structure functions.
 * @example resultUnit(parseStudySpec({ kernel: 'drell-yan', options: { sqrtSGeV: 13000 }, bins: [{ m: 20, y: 0 }] })) // 'pb/GeV'
 */
export function resultUnit(spec: StudySpec): string {
  const def = kernelDefinition(spec.kernel)
  if (def.composite) return '1'
  if (def.id === 'user') {
    const label = (spec.options as { unitLabel?: string }).unitLabel
    if (label) return label
  }
  let power = -def.gevPower
  if (spec.rangeMode === 'integrate') {
    const variables = def.variables(spec.options)
    const ranged = new Set(spec.bins.flatMap(b => variables.filter(v => b[`${v.name}Min` as BinColumn] !== undefined).map(v => v.name)))
    if (ranged.size > 0) {
      // Mixed binning gives mixed units; the unit of the first bin is reported.
      const first = spec.bins[0]!
      for (const v of variables) if (first[`${v.name}Min` as BinColumn] !== undefined) power += v.gevPower
    }
  }
  const base = def.crossSection ? String((spec.options as { unit?: string }).unit ?? 'pb') : ''
  if (power === 0) return base || '1'
  const gev = `GeV${Math.abs(power) === 1 ? '' : `^${Math.abs(power)}`}`
  if (power < 0) return `${base || '1'}/${gev}`
  return base ? `${base}·${gev}` : gev
}
