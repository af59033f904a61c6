/**
 * Inputs shared by the verbs that ask what a measurement does to a set (`kfactor`, `reweight`,
 * `profile`, `sensitivity`): a study's member values for one set (from a study file, evaluated
 * here, or from a values document), a measurement CSV with its optional correlation matrix, and
 * a K-factor CSV. Every problem names the file and, where known, the line and column.
 */
import { basename } from 'node:path'
import { readCsv } from '../../shared/bins/csv'
import { engineMeasurement, parseCorrelationMatrix, parseMeasurementPoints, type LocatedIssue } from '../../shared/measurements/csv'
import { applyKFactors, type KFactors } from '../../shared/physics/impact'
import { buildPlan, evaluatePlan, parseStudySpec } from '../../shared/physics/study'
import type { ErrorSet } from '../../shared/physics/types'
import type { Measurement, MemberValues } from '../../shared/physics/uncertainty'
import { stringOption, type OptionSpec, type ParsedArgs } from './args'
import { BadInputError, UsageError } from './errors'
import { readJson, readText, type CliIo } from './io'
import { setAlphas } from './set-file'
import { readValuesDocument } from './values-file'

/** The options every one of these verbs takes for its inputs. */
export const IMPACT_INPUT_OPTIONS: OptionSpec = {
  'correlation': { type: 'string' },
  'correlation-of': { type: 'string' },
  'k-factors': { type: 'string' },
  'k-source': { type: 'string' },
  'outside': { type: 'string' },
  'format': { type: 'string' }
}

/** Help lines for IMPACT_INPUT_OPTIONS. */
export const IMPACT_INPUT_HELP = `  --correlation <file>     correlation matrix of the measurement (N × N CSV without a header,
                           or a JSON array of rows)
  --correlation-of syst|total  what the matrix correlates: the syst column (default) or the
                           total error √(stat² + syst²)
  --k-factors <file>       K-factor CSV: a header with k (required), k_error (optional) and bin
                           (optional, 1, 2, 3 …), one line per bin; every member's value is
                           multiplied by its bin's K before anything else (K-factors are the
                           user's responsibility)
  --k-source <text>        where the K-factors came from, carried into the output
  --outside error|freeze   a study's bins outside the set's grid: refuse (default) or evaluate
                           at the grid edge
  --format json|csv        json (default) or CSV`

/** A study's values for one set, with what the output says about them. */
export interface StudyValues {
  matrix: MemberValues
  /** Title of the study, or the values file's name. */
  title: string
  /** The K-factors applied, if any. */
  kFactors?: KFactors & { addErrorInQuadrature?: boolean }
}

/**
 * The study's members × bins values for `set`: `file` is either a study (kernel, options, bins),
 * evaluated here through the precomputed plan, or a values document ('sheaf compute' output, in
 * which the entry named like the set is taken, or a plain { kind, values }).
 * @throws BadInputError naming the file for a study the engine refuses, values of another set.
 */
export function studyValues(io: CliIo, file: string, set: ErrorSet, setFile: string, args: ParsedArgs): StudyValues {
  const doc = readJson(io, file)
  const outside = stringOption(args, 'outside') ?? 'error'
  if (outside !== 'error' && outside !== 'freeze') throw new UsageError(`--outside must be error or freeze, got '${outside}'.`)
  let matrix: MemberValues
  let title: string
  let specK: (KFactors & { addErrorInQuadrature?: boolean }) | undefined
  if (typeof doc === 'object' && doc !== null && ('sets' in doc || 'values' in doc)) {
    const entries = readValuesDocument(doc, file, basename(file).replace(/\.json$/i, ''))
    const entry = entries.length === 1 ? entries[0]! : entries.find(e => e.set === set.header.name)
    if (entry === undefined) throw new BadInputError(`${file}: no entry for the set '${set.header.name}' among ${entries.map(e => `'${e.set}'`).join(', ')}.`)
    if (entry.matrix.members !== set.members.length) {
      throw new BadInputError(`${file}: the values have ${entry.matrix.members} members but ${setFile} has ${set.members.length}: they must come from that set.`)
    }
    if (entry.kind !== set.header.kind) throw new BadInputError(`${file}: the values are of kind ${entry.kind} but ${setFile} is ${set.header.kind}.`)
    matrix = entry.matrix
    title = entry.set
  } else {
    try {
      const spec = parseStudySpec(doc)
      specK = spec.kFactors
      const plan = buildPlan(spec, set, { outside, alphas: setAlphas(set.header) })
      const values = evaluatePlan(plan, set.members)
      matrix = { members: set.members.length, bins: spec.bins.length, values }
      title = spec.title ?? basename(file).replace(/\.json$/i, '')
    } catch (e) {
      const hint = outside === 'error' && /outside|below|above/.test((e as Error).message) ? ' (--outside freeze evaluates such bins at the grid edge)' : ''
      throw new BadInputError(`${file} with ${setFile}: ${(e as Error).message}${hint}`)
    }
  }
  const kFile = stringOption(args, 'k-factors')
  // A study whose spec carries K-factors is read with them, as the web app runs it.
  if (specK !== undefined) {
    if (kFile !== undefined || stringOption(args, 'k-source') !== undefined) {
      throw new UsageError(`${file} carries its own K-factors (kFactors in the study); drop --k-factors and --k-source, or remove them from the study.`)
    }
    return { matrix: applyKFactors(matrix, specK), title, kFactors: specK }
  }
  if (kFile === undefined) {
    if (stringOption(args, 'k-source') !== undefined) throw new UsageError('--k-source describes K-factors: give them with --k-factors <file>.')
    return { matrix, title }
  }
  const kFactors = readKFactors(io, kFile, matrix.bins)
  const source = stringOption(args, 'k-source')
  if (source !== undefined) kFactors.source = source
  return { matrix: applyKFactors(matrix, kFactors), title, kFactors }
}

function located(file: string, issue: LocatedIssue): string {
  const where = issue.line === undefined ? '' : issue.column === undefined ? `line ${issue.line}: ` : `line ${issue.line}, column ${issue.column}: `
  return `${file}: ${where}${issue.message}`
}

/**
 * A measurement CSV (shared/measurements/csv.ts) with its optional correlation matrix, as the
 * engine's Measurement, checked against the study's bin count.
 * @throws BadInputError "<file>: line L, column C: <message>" for the first problem.
 */
export function readMeasurement(io: CliIo, file: string, args: ParsedArgs, bins: number): Measurement {
  const points = parseMeasurementPoints(readText(io, file))
  if (points.issues.length > 0) throw new BadInputError(located(file, points.issues[0]!))
  const n = points.data.values.length
  if (n !== bins) throw new BadInputError(`${file}: the measurement has ${n} points but the study has ${bins} bins: give one line per bin, in bin order.`)
  const correlationOf = stringOption(args, 'correlation-of') ?? 'syst'
  if (correlationOf !== 'syst' && correlationOf !== 'total') throw new UsageError(`--correlation-of must be syst or total, got '${correlationOf}'.`)
  const correlationFile = stringOption(args, 'correlation')
  let correlation: number[][] | null = null
  if (correlationFile !== undefined) {
    const parsed = parseCorrelationMatrix(readText(io, correlationFile), n)
    if (parsed.issues.length > 0) throw new BadInputError(located(correlationFile, parsed.issues[0]!))
    correlation = parsed.matrix
    if (correlationOf === 'syst' && points.data.syst === null) {
      throw new BadInputError(`${file}: the correlation matrix applies to the syst column, which this file does not have (use --correlation-of total).`)
    }
  }
  return engineMeasurement({ ...points.data, correlation, correlationOf })
}

const K_COLUMNS = ['k', 'k_error', 'bin', 'label']

/**
 * A K-factor CSV: a header naming k (required), k_error, bin (1, 2, 3 … when present) and label
 * (ignored), then one line per bin; # lines are comments.
 * @throws BadInputError "<file>: line L, column C: <message>".
 */
export function readKFactors(io: CliIo, file: string, bins: number): KFactors {
  const { records, problems } = readCsv(readText(io, file), { comment: '#' })
  if (problems.length > 0) throw new BadInputError(`${file}: line ${problems[0]!.line}: ${problems[0]!.message} (character ${problems[0]!.column} of the line)`)
  const [head, ...rows] = records.filter(r => r.fields.some(f => f.trim() !== ''))
  if (head === undefined) throw new BadInputError(`${file}: the file is empty; expected a header (k, k_error, bin) and one line per bin.`)
  const names = head.fields.map(f => f.trim().toLowerCase())
  names.forEach((n, i) => {
    if (!K_COLUMNS.includes(n)) throw new BadInputError(`${file}: line ${head.line}, column ${i + 1}: unknown column "${head.fields[i]!.trim()}"; use k, k_error, bin or label.`)
    if (names.indexOf(n) !== i) throw new BadInputError(`${file}: line ${head.line}, column ${i + 1}: column "${n}" appears twice.`)
  })
  const kColumn = names.indexOf('k')
  if (kColumn < 0) throw new BadInputError(`${file}: line ${head.line}: the header needs a "k" column.`)
  if (rows.length !== bins) throw new BadInputError(`${file}: ${rows.length} K-factor lines but the study has ${bins} bins: give one line per bin, in bin order.`)
  const errorColumn = names.indexOf('k_error')
  const binColumn = names.indexOf('bin')
  const values: number[] = []
  const errors: number[] = []
  rows.forEach((row, r) => {
    if (row.fields.length !== names.length) throw new BadInputError(`${file}: line ${row.line}: expected ${names.length} fields as in the header, found ${row.fields.length}.`)
    const cell = (c: number, what: string, ok: (v: number) => boolean, rule: string) => {
      const text = row.fields[c]!.trim()
      const v = text === '' ? Number.NaN : Number(text)
      if (!Number.isFinite(v) || !ok(v)) throw new BadInputError(`${file}: line ${row.line}, column ${c + 1}: ${what} must be ${rule}; found "${text}".`)
      return v
    }
    if (binColumn >= 0) cell(binColumn, 'bin', v => v === r + 1, `${r + 1} here (bins come in order)`)
    values.push(cell(kColumn, 'k', v => v > 0, 'a number > 0'))
    if (errorColumn >= 0) errors.push(cell(errorColumn, 'k_error', v => v >= 0, 'a number ≥ 0'))
  })
  return errorColumn >= 0 ? { values, errors } : { values }
}

/** The output's description of the K-factors used (null when none). */
export function kFactorReport(k: KFactors | undefined): { values: number[], errors?: number[], source: string | null, caution: string } | null {
  if (k === undefined) return null
  return {
    values: Array.from(k.values),
    ...(k.errors ? { errors: Array.from(k.errors) } : {}),
    source: k.source ?? null,
    caution: 'K-factors are the user\'s responsibility: Sheaf multiplies every member by them and does not check them.'
  }
}

/** The caution every one of these verbs prints with its numbers. */
export const LO_CAUTION = 'Leading-order predictions are rough: use these numbers for orientation, not as a substitute for a higher-order analysis.'
