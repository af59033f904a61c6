/**
 * `sheaf compute <study.json> <set-file>... [--second <set-file>] [--outside error|freeze]
 * [--format json|csv] [--table bands|values]`: every member's value in every bin of a study,
 * and each set's band with its default prescription at 68% CL.
 */
import { computeBands, prescriptionsFor } from '../../../shared/physics/uncertainty'
import {
  buildPlan, evaluatePlan, memberAlphasFunctions, parseStudySpec, quadratureErrors, resultUnit, scaleVariation,
  type PlanOptions, type ScalePoint, type StudySpec
} from '../../../shared/physics/study'
import type { ErrorSet } from '../../../shared/physics/types'
import { outputFormat, parseVerbArgs, stringOption, type VerbSpec } from '../args'
import { BAND_CSV_HEADER, bandCsvRows, bandReport, type BandReport } from '../band-report'
import { BadInputError, UsageError } from '../errors'
import { readJson, type CliIo } from '../io'
import { toCsv, toJson } from '../output'
import { densityText } from '../../../shared/physics/sets/density-words'
import { loadSet, setAlphas } from '../set-file'
import { slotIssues } from '../../../shared/utils/set-match'

export const computeVerb: VerbSpec = {
  name: 'compute',
  summary: 'per-member values and bands of a study for one or more set files',
  help: `Usage: sheaf compute <study.json> <set-file>... [options]

Evaluates the study (kernel, options, bins; see the README's study format) with every member of
each set, through the precomputed plan, and prints per set: its name, kind, the CL of its
members, the members × bins values (member 0 central; unit in study.unit) and the band with the
set's default prescription at 68% CL (α_s members, when the set has them, added in quadrature;
null for a set of the central member alone; 'interval' says which rule made it).
Reported apart from the PDF band, on the central member: the scale variation (scaleVariation:
μ_F × ½, 2 for most kernels, '3-point μ_F'; for kernels with α_s, gg → H, μ_F and μ_R varied
independently by ½ and 2 without the opposite corners, '7-point μ_F, μ_R'; up/down are the
envelope; null with scaleVariationError when a varied scale leaves the grid), and each bin's
quadrature error estimate |I(2n) − I(n)| (quadratureError, beside each band row and under
quadrature).
The output is a values document that 'sheaf bands' reads.

Options:
  --second <set-file>      second set: beam 2 of a pA collision, the nuclear set of a
                           nuclear ratio, the fragmentation set of a semi-inclusive
                           multiplicity or the second species of an e+e- species ratio
                           (members paired index by index with each main set's; a set of
                           one member is held at its central member)
Each set must hold what its slot reads: parton densities, or fragmentation functions for
epem-hadron and epem-species-ratio (main and second) and the sidis-* kernels (second).
  --outside error|freeze   bins reaching outside a set's grid: refuse (default) or evaluate
                           at the grid edge and list them under outsideBins
  --format json|csv        json (default) or CSV
  --table bands|values     with --format csv: the bands (default; one line per set and bin) or
                           the values (one line per set, member and bin)
Bins are numbered from 1 (as in the engine's messages), members from 0 (the central member).
  -h, --help               this text`,
  options: {
    second: { type: 'string' },
    outside: { type: 'string' },
    format: { type: 'string' },
    table: { type: 'string' }
  },
  positionals: { min: 2, max: Infinity, what: 'files (a study, then one or more set files)' }
}

/** One set's result in compute's output. */
export interface ComputedSet {
  set: string
  /** What the set holds, in words ("parton densities in the proton", "fragmentation into π⁺"). */
  holds: string
  file: string
  kind: ErrorSet['header']['kind']
  /** CL of the set's members, percent. */
  clPercent: number
  alphasMembers?: [number, number]
  members: number
  bins: number
  /** values[member][bin], in the study's unit. */
  values: number[][]
  /** The band, or null for a set of the central member alone. */
  bands: BandReport | null
  /** Bins (numbered from 1) evaluated at the grid edge (--outside freeze), with the reason. */
  outsideBins?: Array<{ bin: number, message: string }>
  /** Scale variation of the central member, apart from the PDF band; null when a varied scale leaves the grid. */
  scaleVariation: ScaleReport | null
  /** Why there is no scale variation. */
  scaleVariationError?: string
  /** Per-bin quadrature error estimate |I(2n) − I(n)| of the central member, study unit. */
  quadrature: { order: number, checkOrder: number, error: number[] } | null
}

/** The scale variation as printed: which variation, its points and per bin the values at each point. */
export interface ScaleReport {
  variation: string
  label: string
  /** The scale points (μ_F and μ_R factors on the nominal scales), in the order of each row's values. */
  points: ScalePoint[]
  rows: Array<{ bin: number, nominal: number, up: number, down: number, values: number[] }>
}

function scaleReport(spec: StudySpec, set: ErrorSet, options: PlanOptions & { secondCentral?: Float64Array }): { report: ScaleReport | null, error?: string } {
  try {
    const v = scaleVariation(spec, set, set.members[0]!, options)
    const nBins = spec.bins.length
    const rows = Array.from(v.nominal, (nominal, b) => ({
      bin: b + 1, nominal, up: v.up[b]!, down: v.down[b]!, values: v.points.map((_, r) => v.pointValues[r * nBins + b]!)
    }))
    return { report: { variation: v.variation, label: v.label, points: v.points, rows } }
  } catch (e) {
    if (!(e instanceof RangeError)) throw e
    return { report: null, error: e.message }
  }
}

function loadStudy(io: CliIo, file: string): StudySpec {
  const doc = readJson(io, file)
  try {
    const spec = parseStudySpec(doc)
    if (spec.kFactors) throw new RangeError('the study carries K-factors (kFactors); compute gives leading-order values only: use \'sheaf kfactor\' for the K-scaled bands')
    return spec
  } catch (e) {
    throw new BadInputError(`${file}: ${(e as Error).message}`)
  }
}

function computeSet(spec: StudySpec, file: string, set: ErrorSet, outside: 'error' | 'freeze', second?: { file: string, set: ErrorSet }): ComputedSet {
  const { header } = set
  let values: Float64Array
  let outsideBins: ComputedSet['outsideBins']
  try {
    const plan = buildPlan(spec, set, { outside, second: second?.set, alphas: setAlphas(header), scheme: header.scheme })
    // Each member with its own α_s(M_Z) where the kernel has α_s (gg → H).
    values = evaluatePlan(plan, set.members, second?.set.members, { memberAlphas: memberAlphasFunctions({ ...header, memberCount: set.members.length }) })
    if (plan.outsideBins.length > 0) outsideBins = plan.outsideBins.map(i => ({ bin: i.bin, message: i.message }))
  } catch (e) {
    const hint = outside === 'error' && /outside|below|above/.test((e as Error).message) ? ' (--outside freeze evaluates such bins at the grid edge)' : ''
    throw new BadInputError(`${file}${second ? ` with ${second.file}` : ''}: ${(e as Error).message}${hint}`)
  }
  const bins = spec.bins.length
  const members = values.length / bins
  const matrix = { members, bins, values }
  const alphasMembers = header.alphasMembers
  // A set of the central member alone (e.g. written by 'sheaf evolve --out') has no band.
  let bands = null
  if (members > 1 + (alphasMembers ? 2 : 0)) {
    try {
      bands = bandReport(computeBands(matrix, { kind: header.kind, prescription: prescriptionsFor(header.kind)[0]!, clFrom: header.confidenceLevelPercent, clTo: 68, alphasMembers }))
    } catch (e) {
      throw new BadInputError(`${file}: ${(e as Error).message}`)
    }
  }
  const rows: number[][] = []
  for (let m = 0; m < members; m++) rows.push(Array.from(values.subarray(m * bins, (m + 1) * bins)))
  const context = { outside, second: second?.set, alphas: setAlphas(header), scheme: header.scheme, ...(second ? { secondCentral: second.set.members[0]! } : {}) }
  const scale = scaleReport(spec, set, context)
  if (bands && scale.report) {
    bands.scaleVariation = scale.report.variation
    bands.rows.forEach((r, b) => { r.scaleUp = scale.report!.rows[b]!.up; r.scaleDown = scale.report!.rows[b]!.down })
  }
  let quadrature: ComputedSet['quadrature'] = null
  try {
    const q = quadratureErrors(spec, set, set.members[0]!, context)
    quadrature = { order: q.order, checkOrder: q.checkOrder, error: Array.from(q.error) }
    if (bands) bands.rows.forEach((r, b) => { r.quadratureError = q.error[b]! })
  } catch (e) {
    if (!(e instanceof RangeError)) throw e
  }
  const out: ComputedSet = {
    set: header.name, holds: densityText(header), file, kind: header.kind, clPercent: header.confidenceLevelPercent, members, bins, values: rows, bands,
    scaleVariation: scale.report, ...(scale.error ? { scaleVariationError: scale.error } : {}), quadrature
  }
  if (alphasMembers) out.alphasMembers = alphasMembers
  if (outsideBins) out.outsideBins = outsideBins
  return out
}

/**
 * Refuses a set file in a slot that reads the other density, a missing or unused --second (the
 * web app's check, shared/utils/set-match.ts), naming the file.
 */
function checkSlots(spec: StudySpec, sets: ReadonlyArray<{ file: string, set: ErrorSet }>, second: { file: string, set: ErrorSet } | undefined) {
  const described = (s: ErrorSet) => ({ name: s.header.name, version: s.header.version, density: s.header.density ?? null })
  const issues = slotIssues(spec.kernel, sets.map(s => described(s.set)), second ? described(second.set) : null)
  if (!issues.length) return
  const where = (path: Array<string | number>) => (path[0] === 'setIds' ? sets[path[1] as number]!.file : second ? `--second ${second.file}` : '--second')
  throw new BadInputError(issues.map(i => `${where(i.path)}: ${i.message.replace(/^[^:]+: /, '')}`).join('\n'))
}

/** Runs `compute`; returns the exit code. */
export function runCompute(argv: readonly string[], io: CliIo): number {
  const args = parseVerbArgs(computeVerb, argv)
  if (args.help) { io.stdout(`${computeVerb.help}\n`); return 0 }
  const format = outputFormat('compute', args)
  const outside = stringOption(args, 'outside') ?? 'error'
  if (outside !== 'error' && outside !== 'freeze') throw new UsageError(`compute: --outside must be error or freeze, got '${outside}'.`)
  const table = stringOption(args, 'table') ?? 'bands'
  if (table !== 'bands' && table !== 'values') throw new UsageError(`compute: --table must be bands or values, got '${table}'.`)

  const [studyFile, ...setFiles] = args.positionals as [string, ...string[]]
  const spec = loadStudy(io, studyFile)
  const secondFile = stringOption(args, 'second')
  const second = secondFile === undefined ? undefined : { file: secondFile, set: loadSet(io, secondFile) }
  const loaded = setFiles.map(file => ({ file, set: loadSet(io, file) }))
  checkSlots(spec, loaded, second)
  const sets = loaded.map(({ file, set }) => computeSet(spec, file, set, outside, second))

  if (format === 'csv') {
    // Sets are named by their header; when two share a name, their file tells them apart.
    const names = sets.map(s => s.set)
    const label = (s: ComputedSet) => (names.filter(n => n === s.set).length > 1 ? `${s.set} [${s.file}]` : s.set)
    if (table === 'bands') io.stdout(toCsv(BAND_CSV_HEADER, sets.flatMap(s => (s.bands ? bandCsvRows(label(s), s.bands) : []))))
    else io.stdout(toCsv(['set', 'member', 'bin', 'value'], sets.flatMap(s => s.values.flatMap((row, m) => row.map((v, b) => [label(s), m, b + 1, v])))))
    return 0
  }
  const study = {
    title: spec.title,
    kernel: spec.kernel,
    unit: resultUnit(spec),
    quadratureOrder: spec.quadratureOrder,
    bins: spec.bins.map((row, b) => ({ bin: b + 1, ...row }))
  }
  io.stdout(toJson({ study, sets }))
  return 0
}
