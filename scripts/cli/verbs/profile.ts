/**
 * `sheaf profile <study.json|values.json> <hessian-set> <measurement.csv> [options]`: Hessian
 * profiling of a set by a measurement, and optionally the profiled set written to a file.
 */
import { profile, profiledSet } from '../../../shared/physics/impact'
import { sigmaMultiple } from '../../../shared/physics/uncertainty'
import { ENGINE_VERSION } from '../../../shared/physics/version'
import { numberOption, outputFormat, parseVerbArgs, stringOption, type VerbSpec } from '../args'
import { BadInputError, UsageError } from '../errors'
import type { CliIo } from '../io'
import { IMPACT_INPUT_HELP, IMPACT_INPUT_OPTIONS, kFactorReport, LO_CAUTION, readMeasurement, studyValues } from '../impact-input'
import { toCsv, toJson } from '../output'
import { densityText } from '../../../shared/physics/sets/density-words'
import { loadSet, saveSet } from '../set-file'

export const profileVerb: VerbSpec = {
  name: 'profile',
  summary: 'profile a Hessian set by a measurement (shifts, χ² before/after), optionally write the profiled set',
  help: `Usage: sheaf profile <study.json|values.json> <hessian-set> <measurement.csv> [options]

Evaluates the study with every member of the Hessian set (or reads its values from a 'sheaf
compute' output), expands each bin in the eigenvector parameters z (members at z_k = ±1) and
minimises χ²(z) = (D − T(z))ᵀ C⁻¹ (D − T(z)) + T²·Σ z_k² with C the measurement's full
covariance and T the set's tolerance (arXiv:1402.6623). Prints the shifts z_k, χ² before and
after, every bin's prediction and 68% CL band before and after, and the eigenvalues of the
profiled Hessian. With --out, writes the profiled set: the new central member and new eigenvector
pairs at Δχ² = T² (α_s members are not carried over).

Options:
  --tolerance <T>          the set's tolerance (default: the Gaussian multiple of the set's CL,
                           1 at 68%, 1.645 at 90%)
  --asymmetric             keep the quadratic term of each pair (arXiv:1806.07950)
  --out <file>             write the profiled set there (Sheaf's set format)
  --name <text>            name of the written set (default: '<parent>-profiled')
${IMPACT_INPUT_HELP}: the bins before and after
  -h, --help               this text`,
  options: {
    ...IMPACT_INPUT_OPTIONS,
    tolerance: { type: 'string' },
    asymmetric: { type: 'boolean' },
    out: { type: 'string' },
    name: { type: 'string' }
  },
  positionals: { min: 3, max: 3, what: 'files (a study or values file, a Hessian set, a measurement CSV)' }
}

/** Runs `profile`; returns the exit code. */
export function runProfile(argv: readonly string[], io: CliIo): number {
  const args = parseVerbArgs(profileVerb, argv)
  if (args.help) { io.stdout(`${profileVerb.help}\n`); return 0 }
  const format = outputFormat('profile', args)
  const out = stringOption(args, 'out')
  if (out === undefined && stringOption(args, 'name') !== undefined) throw new UsageError('profile: --name names the profiled set: give --out <file> too.')
  const [studyFile, setFile, measurementFile] = args.positionals as [string, string, string]
  const set = loadSet(io, setFile)
  const kind = set.header.kind
  if (kind === 'replicas') throw new BadInputError(`${setFile}: '${set.header.name}' is a replica set; profiling needs a Hessian set ('sheaf reweight' updates a replica set).`)
  const asymmetric = args.values.asymmetric === true
  if (asymmetric && kind !== 'hessian-pairs') throw new UsageError(`profile: --asymmetric needs eigenvector pairs; ${setFile} is ${kind}.`)
  const toleranceText = stringOption(args, 'tolerance')
  const cl = set.header.confidenceLevelPercent
  const tolerance = toleranceText === undefined ? sigmaMultiple(cl) : numberOption('profile', 'tolerance', toleranceText, 'a number > 0', v => v > 0)
  const study = studyValues(io, studyFile, set, setFile, args)
  const measurement = readMeasurement(io, measurementFile, args, study.matrix.bins)

  let result
  try {
    result = profile(study.matrix, measurement, { kind, tolerance, asymmetric, alphasMembers: set.header.alphasMembers, clPercent: cl })
  } catch (e) {
    throw new BadInputError(`${measurementFile}: ${(e as Error).message}`)
  }

  let written = null
  if (out !== undefined) {
    const name = stringOption(args, 'name') ?? `${set.header.name}-profiled`
    const shifts = Array.from(result.shifts, (z, k) => `z${k + 1} = ${z.toFixed(4)}`).join(', ')
    const provenance = `Profiled (arXiv:1402.6623${asymmetric ? ', quadratic pairs of arXiv:1806.07950' : ''}; tolerance T = ${tolerance.toPrecision(6)}) by the measurement ${measurementFile}`
      + ` (${result.points} points) on the study '${study.title}'${study.kFactors ? ` with K-factors${study.kFactors.source ? ` (${study.kFactors.source})` : ''}` : ''};`
      + ` χ² ${result.chi2Before.toFixed(3)} → ${result.chi2After.data.toFixed(3)}; shifts ${shifts}; ${ENGINE_VERSION}. ${LO_CAUTION}`
    const bytes = saveSet(io, out, profiledSet(set, result, { name, provenance }))
    written = { file: out, name, members: 1 + 2 * result.eigenvectors, bytes }
  }

  const rows = Array.from(result.predictionBefore, (_, b) => ({
    bin: b + 1,
    data: measurement.values[b]!,
    before: result.bandBefore.central[b]!,
    beforeError: result.bandBefore.plus[b]!,
    after: result.bandAfter.central[b]!,
    afterError: result.bandAfter.plus[b]!,
    shrinkage: result.bandBefore.plus[b]! > 0 ? result.bandAfter.plus[b]! / result.bandBefore.plus[b]! : null
  }))
  if (format === 'csv') {
    io.stdout(toCsv(['bin', 'data', 'before', 'beforeError', 'after', 'afterError', 'shrinkage'], rows.map(r => [r.bin, r.data, r.before, r.beforeError, r.after, r.afterError, r.shrinkage ?? Number.NaN])))
    return 0
  }
  io.stdout(toJson({
    set: set.header.name,
    holds: densityText(set.header),
    study: study.title,
    measurement: measurementFile,
    points: result.points,
    eigenvectors: result.eigenvectors,
    tolerance,
    asymmetric,
    iterations: result.iterations,
    chi2Before: result.chi2Before,
    chi2After: result.chi2After,
    shifts: Array.from(result.shifts, (z, k) => ({ eigenvector: k + 1, z })),
    hessianEigenvalues: result.eigenvalues,
    kFactors: kFactorReport(study.kFactors),
    bins: rows,
    written,
    caution: LO_CAUTION
  }))
  return 0
}
