/**
 * `sheaf reweight <study.json|values.json> <replica-set> <measurement.csv> [options]`: Bayesian
 * reweighting of a replica set by a measurement, and optionally the unweighted set written to a
 * file.
 */
import { chi2Profile, effectiveReplicas, reweight, unweightedCopies, unweightedSet, unweightingErrors, WEIGHT_FORMS, type WeightForm } from '../../../shared/physics/impact'
import { withoutMembers } from '../../../shared/physics/uncertainty'
import { ENGINE_VERSION } from '../../../shared/physics/version'
import { numberOption, outputFormat, parseVerbArgs, stringOption, type VerbSpec } from '../args'
import { BadInputError, UsageError } from '../errors'
import type { CliIo } from '../io'
import { IMPACT_INPUT_HELP, IMPACT_INPUT_OPTIONS, kFactorReport, LO_CAUTION, readMeasurement, studyValues } from '../impact-input'
import { toCsv, toJson } from '../output'
import { densityText } from '../../../shared/physics/sets/density-words'
import { loadSet, saveSet } from '../set-file'

/** The α grid of the printed χ² profile: 0.2 to 4 in steps of 0.02. */
const PROFILE_ALPHAS = Array.from({ length: 191 }, (_, i) => Math.round((0.2 + 0.02 * i) * 100) / 100)

export const reweightVerb: VerbSpec = {
  name: 'reweight',
  summary: 'reweight a replica set by a measurement (N_eff, bands before/after), optionally write the unweighted set',
  help: `Usage: sheaf reweight <study.json|values.json> <replica-set> <measurement.csv> [options]

Evaluates the study with every replica of the set (or reads its values from a 'sheaf compute'
output), takes each replica's χ² against the measurement with its full experimental covariance,
and weighs the replicas by w_k ∝ χ_k^(n−1) e^(−χ_k²/2) (arXiv:1012.0836; --weights likelihood
for e^(−χ_k²/2), hep-ph/9803393), normalised to Σ w_k = N. Prints the effective number of
replicas N_eff = exp{(1/N) Σ w_k ln(N/w_k)} (with a warning when it is small compared with N),
the χ² of the mean prediction before and after, every bin's mean ± sd before and after, the
weights and the χ² profile P(α). With --out, writes the unweighted replica set (arXiv:1108.1758)
of --replicas replicas. The measurement CSV has one line per bin (value, stat, syst, shift:<name>).

Options:
  --weights chi2-pdf|likelihood  the weight formula (default chi2-pdf)
  --out <file>             write the unweighted replica set there (Sheaf's set format)
  --replicas <N'>          replicas of the unweighted set (default: the parent's N)
  --seed <S>               seed of the unweighting's random offset (default: none, the
                           deterministic positions j/N' of arXiv:1108.1758)
  --name <text>            name of the written set (default: '<parent>-reweighted')
${IMPACT_INPUT_HELP}: the bins before and after
  -h, --help               this text`,
  options: {
    ...IMPACT_INPUT_OPTIONS,
    weights: { type: 'string' },
    out: { type: 'string' },
    replicas: { type: 'string' },
    seed: { type: 'string' },
    name: { type: 'string' }
  },
  positionals: { min: 3, max: 3, what: 'files (a study or values file, a replica set, a measurement CSV)' }
}

/** Runs `reweight`; returns the exit code. */
export function runReweight(argv: readonly string[], io: CliIo): number {
  const args = parseVerbArgs(reweightVerb, argv)
  if (args.help) { io.stdout(`${reweightVerb.help}\n`); return 0 }
  const format = outputFormat('reweight', args)
  const form = stringOption(args, 'weights') ?? 'chi2-pdf'
  if (!(WEIGHT_FORMS as readonly string[]).includes(form)) throw new UsageError(`reweight: --weights must be ${WEIGHT_FORMS.join(' or ')}, got '${form}'.`)
  const replicasText = stringOption(args, 'replicas')
  const seedText = stringOption(args, 'seed')
  const out = stringOption(args, 'out')
  if (out === undefined && (replicasText !== undefined || seedText !== undefined || stringOption(args, 'name') !== undefined)) {
    throw new UsageError('reweight: --replicas, --seed and --name describe the unweighted set: give --out <file> too.')
  }
  const [studyFile, setFile, measurementFile] = args.positionals as [string, string, string]
  const set = loadSet(io, setFile)
  if (set.header.kind !== 'replicas') throw new BadInputError(`${setFile}: '${set.header.name}' is a Hessian set (${set.header.kind}); reweighting needs replicas ('sheaf profile' updates a Hessian set).`)
  const study = studyValues(io, studyFile, set, setFile, args)
  const measurement = readMeasurement(io, measurementFile, args, study.matrix.bins)
  const alphas = set.header.alphasMembers
  const matrix = alphas === undefined ? study.matrix : withoutMembers(study.matrix, alphas)

  let result
  try {
    result = reweight(matrix, measurement, { form: form as WeightForm })
  } catch (e) {
    throw new BadInputError(`${measurementFile}: ${(e as Error).message}`)
  }
  const profile = chi2Profile(result.chi2, result.points, PROFILE_ALPHAS)

  let written = null
  if (out !== undefined) {
    const count = replicasText === undefined ? result.replicas : numberOption('reweight', 'replicas', replicasText, 'a whole number ≥ 2', v => Number.isInteger(v) && v >= 2)
    const seed = seedText === undefined ? undefined : numberOption('reweight', 'seed', seedText, 'a whole number from 0 to 2^53 − 1', v => Number.isSafeInteger(v) && v >= 0)
    const copies = unweightedCopies(result.weights, count, seed === undefined ? {} : { seed })
    const name = stringOption(args, 'name') ?? `${set.header.name}-reweighted`
    const provenance = `Reweighted (${form} weights) by the measurement ${measurementFile} (${result.points} points) on the study '${study.title}'`
      + `${study.kFactors ? ` with K-factors${study.kFactors.source ? ` (${study.kFactors.source})` : ''}` : ''}; N_eff = ${result.effectiveReplicas.toFixed(1)} of ${result.replicas};`
      + ` unweighted to ${count} replicas (arXiv:1108.1758${seed === undefined ? '' : `, seed ${seed}`}); ${ENGINE_VERSION}. ${LO_CAUTION}`
    const newSet = unweightedSet(set, copies, { name, provenance })
    const bytes = saveSet(io, out, newSet)
    const errors = unweightingErrors(matrix, result.weights, count)
    written = {
      file: out,
      name,
      replicas: count,
      distinctReplicas: Array.from(copies).filter(c => c > 0).length,
      effectiveReplicasOfCopies: effectiveReplicas(copies),
      seed: seed ?? null,
      bytes,
      statisticalError: { mean: errors.mean, variance: errors.variance }
    }
  }

  const rows = Array.from(result.before.central, (_, b) => ({
    bin: b + 1,
    data: measurement.values[b]!,
    before: result.before.central[b]!,
    beforeSd: result.before.plus[b]!,
    after: result.after.central[b]!,
    afterSd: result.after.plus[b]!,
    shrinkage: result.before.plus[b]! > 0 ? result.after.plus[b]! / result.before.plus[b]! : null
  }))
  if (format === 'csv') {
    io.stdout(toCsv(['bin', 'data', 'before', 'beforeSd', 'after', 'afterSd', 'shrinkage'], rows.map(r => [r.bin, r.data, r.before, r.beforeSd, r.after, r.afterSd, r.shrinkage ?? Number.NaN])))
    if (result.warning) io.stderr(`sheaf: warning: ${result.warning}\n`)
    return 0
  }
  io.stdout(toJson({
    set: set.header.name,
    holds: densityText(set.header),
    study: study.title,
    measurement: measurementFile,
    weights: form,
    points: result.points,
    replicas: result.replicas,
    effectiveReplicas: result.effectiveReplicas,
    warning: result.warning,
    chi2Before: result.chi2Before,
    chi2After: result.chi2After,
    kFactors: kFactorReport(study.kFactors),
    bins: rows,
    replicaChi2: result.chi2,
    replicaWeights: result.weights,
    chi2Profile: { alpha: profile.alpha, density: profile.density, mostProbableAlpha: profile.mostProbableAlpha },
    written,
    caution: LO_CAUTION
  }))
  return 0
}
