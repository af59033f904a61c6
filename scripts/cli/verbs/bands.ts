/**
 * `sheaf bands <values.json> [--prescription <name>] [--cl <percent>] [--format json|csv]`:
 * the band of every set in a member-values document.
 */
import { basename } from 'node:path'
import { computeBands, isPrescription, PRESCRIPTIONS, prescriptionsFor, type Prescription } from '../../../shared/physics/uncertainty'
import { numberOption, outputFormat, parseVerbArgs, stringOption, type VerbSpec } from '../args'
import { BAND_CSV_HEADER, bandCsvRows, bandReport } from '../band-report'
import { BadInputError, UsageError } from '../errors'
import { readJson, type CliIo } from '../io'
import { toCsv, toJson } from '../output'
import { readValuesDocument } from '../values-file'

export const bandsVerb: VerbSpec = {
  name: 'bands',
  summary: 'uncertainty bands from member values (compute\'s output or { kind, clPercent, values })',
  help: `Usage: sheaf bands <values.json> [--prescription <name>] [--cl <percent>] [--format json|csv]

Applies an uncertainty prescription to members × bins values and prints, per set and bin,
central, plus, minus (the band runs from central − minus to central + plus) and the relative
half-widths. values.json is either what 'sheaf compute' prints (every set in it is used) or
  { "kind": "hessian-pairs" | "hessian-one-sided" | "replicas",
    "clPercent": 68, "alphasMembers": [i, j], "values": [[member 0 bins…], [member 1 bins…], …] }
with member 0 the central member; clPercent (default 68) is the CL of the members' spread and
alphasMembers (optional) the α_s down/up members, added in quadrature.

Options:
  --prescription <name>  ${PRESCRIPTIONS.join(', ')}
                         (default: the first one valid for the set's kind)
  --cl <percent>         CL of the band, e.g. 68 or 90 (default 68); a set at another CL is
                         rescaled by the ratio of Gaussian quantiles
  --format json|csv      json (default) or one CSV line per set and bin (bins from 1)
  -h, --help             this text`,
  options: {
    prescription: { type: 'string' },
    cl: { type: 'string' },
    format: { type: 'string' }
  },
  positionals: { min: 1, max: 1, what: 'values file' }
}

/** Runs `bands`; returns the exit code. */
export function runBands(argv: readonly string[], io: CliIo): number {
  const args = parseVerbArgs(bandsVerb, argv)
  if (args.help) { io.stdout(`${bandsVerb.help}\n`); return 0 }
  const format = outputFormat('bands', args)
  const name = stringOption(args, 'prescription')
  if (name !== undefined && !isPrescription(name)) {
    throw new UsageError(`bands: unknown prescription '${name}'; use one of: ${PRESCRIPTIONS.join(', ')}.`)
  }
  const clText = stringOption(args, 'cl')
  const clTo = clText === undefined ? 68 : numberOption('bands', 'cl', clText, 'a percentage strictly between 0 and 100 (e.g. 68 or 90)', v => v > 0 && v < 100)
  const file = args.positionals[0]!
  const entries = readValuesDocument(readJson(io, file), file, basename(file).replace(/\.json$/i, ''))

  const sets = entries.map((e) => {
    const prescription: Prescription = name ?? prescriptionsFor(e.kind)[0]!
    try {
      const result = computeBands(e.matrix, { kind: e.kind, prescription, clFrom: e.clPercent, clTo, alphasMembers: e.alphasMembers })
      return { set: e.set, kind: e.kind, members: e.matrix.members, bins: e.matrix.bins, bands: bandReport(result) }
    } catch (err) {
      throw new BadInputError(`${file}: set '${e.set}': ${(err as Error).message}`)
    }
  })

  if (format === 'csv') io.stdout(toCsv(BAND_CSV_HEADER, sets.flatMap(s => bandCsvRows(s.set, s.bands))))
  else io.stdout(toJson({ sets }))
  return 0
}
