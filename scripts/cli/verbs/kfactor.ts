/**
 * `sheaf kfactor <study.json|values.json> <set> --k-factors <file> [options]`: a study's bands
 * with per-bin K-factors, the K-factor uncertainty reported apart.
 */
import { kFactorErrors } from '../../../shared/physics/impact'
import { computeBands, isPrescription, PRESCRIPTIONS, prescriptionsFor, sigmaMultiple, type Prescription } from '../../../shared/physics/uncertainty'
import { numberOption, outputFormat, parseVerbArgs, stringOption, type VerbSpec } from '../args'
import { BadInputError, UsageError } from '../errors'
import type { CliIo } from '../io'
import { IMPACT_INPUT_HELP, IMPACT_INPUT_OPTIONS, kFactorReport, LO_CAUTION, studyValues } from '../impact-input'
import { toCsv, toJson } from '../output'
import { densityText } from '../../../shared/physics/sets/density-words'
import { loadSet } from '../set-file'

export const kfactorVerb: VerbSpec = {
  name: 'kfactor',
  summary: 'a study\'s bands with per-bin K-factors, their own uncertainty reported apart',
  help: `Usage: sheaf kfactor <study.json|values.json> <set> --k-factors <file> [options]

Multiplies every member's value in each bin by the bin's K-factor (from --k-factors, or the
study's own kFactors when its spec carries them), then computes the band
(the set's default prescription unless --prescription). The K-factor uncertainty,
δX = |X| δK/K at 68% CL, is reported in its own column and, with --add-k-error, also added in
quadrature to the band (brought to --cl). K-factors are the user's responsibility.

Options:
  --prescription <name>    ${PRESCRIPTIONS.join(', ')}
  --cl <percent>           CL of the band (default 68)
  --add-k-error            add the K-factor uncertainty in quadrature to the band
${IMPACT_INPUT_HELP}: one line per bin
  -h, --help               this text`,
  options: {
    ...IMPACT_INPUT_OPTIONS,
    'prescription': { type: 'string' },
    'cl': { type: 'string' },
    'add-k-error': { type: 'boolean' }
  },
  positionals: { min: 2, max: 2, what: 'files (a study or values file, a set)' }
}

/** Runs `kfactor`; returns the exit code. */
export function runKfactor(argv: readonly string[], io: CliIo): number {
  const args = parseVerbArgs(kfactorVerb, argv)
  if (args.help) { io.stdout(`${kfactorVerb.help}\n`); return 0 }
  const format = outputFormat('kfactor', args)
  const name = stringOption(args, 'prescription')
  if (name !== undefined && !isPrescription(name)) throw new UsageError(`kfactor: unknown prescription '${name}'; use one of: ${PRESCRIPTIONS.join(', ')}.`)
  const clText = stringOption(args, 'cl')
  const clTo = clText === undefined ? 68 : numberOption('kfactor', 'cl', clText, 'a percentage strictly between 0 and 100 (e.g. 68 or 90)', v => v > 0 && v < 100)
  const [studyFile, setFile] = args.positionals as [string, string]
  const set = loadSet(io, setFile)
  // studyValues has applied the K-factors already: the band below is that of the K-scaled members.
  const study = studyValues(io, studyFile, set, setFile, args)
  if (!study.kFactors) throw new UsageError('kfactor needs --k-factors <file>, or a study whose spec carries kFactors; see \'sheaf kfactor --help\'.')
  const k = study.kFactors
  const prescription: Prescription = name ?? prescriptionsFor(set.header.kind)[0]!
  const add = args.values['add-k-error'] === true || k.addErrorInQuadrature === true
  let result
  try {
    result = computeBands(study.matrix, { kind: set.header.kind, prescription, clFrom: set.header.confidenceLevelPercent, clTo, alphasMembers: set.header.alphasMembers })
  } catch (e) {
    throw new BadInputError(`${setFile}: ${(e as Error).message}`)
  }
  // δX at 68% CL, brought to the band's CL by the Gaussian multiple z(clTo).
  const kError = kFactorErrors(result.central, k)
  const factor = sigmaMultiple(clTo)
  const rows = Array.from(result.central, (central, b) => {
    const row = {
      bin: b + 1,
      k: k.values[b]!,
      central,
      plus: result.plus[b]!,
      minus: result.minus[b]!,
      kError: kError[b]! * factor,
      ...(add ? { totalPlus: Math.hypot(result.plus[b]!, kError[b]! * factor), totalMinus: Math.hypot(result.minus[b]!, kError[b]! * factor) } : {})
    }
    return row
  })
  if (format === 'csv') {
    const header = ['bin', 'k', 'central', 'plus', 'minus', 'kError', ...(add ? ['totalPlus', 'totalMinus'] : [])]
    io.stdout(toCsv(header, rows.map(r => header.map(h => (r as Record<string, number>)[h]!))))
    return 0
  }
  io.stdout(toJson({
    set: set.header.name,
    holds: densityText(set.header),
    study: study.title,
    prescription,
    clPercent: clTo,
    kErrorAddedInQuadrature: add,
    kFactors: kFactorReport(k),
    bins: rows,
    caution: LO_CAUTION
  }))
  return 0
}
