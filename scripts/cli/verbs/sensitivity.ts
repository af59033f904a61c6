/**
 * `sheaf sensitivity <study.json|values.json> <set> [<measurement.csv>] [options]`: the correlation
 * cos φ between each bin and x·f(x, Q²) of each flavour over x, and the sensitivity when a
 * measurement is given.
 */
import { correlationMap, densityValues, predictionErrors, sensitivityMap } from '../../../shared/physics/impact'
import { isPartonCode, partonName, PARTON_CODES_TEXT } from '../../../shared/physics/partons'
import { numberList, numberOption, outputFormat, parseVerbArgs, stringOption, type VerbSpec } from '../args'
import { BadInputError, UsageError } from '../errors'
import type { CliIo } from '../io'
import { IMPACT_INPUT_HELP, IMPACT_INPUT_OPTIONS, kFactorReport, LO_CAUTION, readMeasurement, studyValues } from '../impact-input'
import { toCsv, toJson } from '../output'
import { densityText } from '../../../shared/physics/sets/density-words'
import { fractionAxisOf } from '../../../shared/physics/sets/header'
import { loadSet } from '../set-file'

/** Default Q² of the map, GeV² (our choice: a scale inside every demo grid). */
const DEFAULT_Q2_GEV2 = 100

export const sensitivityVerb: VerbSpec = {
  name: 'sensitivity',
  summary: 'cos φ between each bin and x·f of each flavour over x (and the sensitivity with a measurement)',
  help: `Usage: sheaf sensitivity <study.json|values.json> <set> [<measurement.csv>] [options]

Evaluates the study with every member of the set (or reads its values from a 'sheaf compute'
output) and prints, for each flavour, the correlation cos φ between every bin and x·f(x, Q²) at
every x: the Hessian formula of arXiv:0802.0007 for Hessian sets, the sample correlation for
replicas. With a measurement, also the sensitivity cos φ · ΔX/δD (arXiv:1803.02777), ΔX the
bin's PDF uncertainty at 68% CL and δD the data's total error.

Options:
  --flavours <list>        PDG codes, e.g. 2,1,-2,21 (default: every flavour of the set);
                           ${PARTON_CODES_TEXT}
  --q2 <GeV²>              the scale of the densities (default ${DEFAULT_Q2_GEV2})
  --x <list>               the x values (default: the set's x nodes)
${IMPACT_INPUT_HELP}: one line per flavour, bin and x
  -h, --help               this text`,
  options: {
    ...IMPACT_INPUT_OPTIONS,
    flavours: { type: 'string' },
    q2: { type: 'string' },
    x: { type: 'string' }
  },
  positionals: { min: 2, max: 3, what: 'files (a study or values file, a set, optionally a measurement CSV)' }
}

/** Runs `sensitivity`; returns the exit code. */
export function runSensitivity(argv: readonly string[], io: CliIo): number {
  const args = parseVerbArgs(sensitivityVerb, argv)
  if (args.help) { io.stdout(`${sensitivityVerb.help}\n`); return 0 }
  const format = outputFormat('sensitivity', args)
  const [studyFile, setFile, measurementFile] = args.positionals as [string, string, string | undefined]
  const set = loadSet(io, setFile)
  const flavoursText = stringOption(args, 'flavours')
  const flavours = flavoursText === undefined ? [...set.flavours] : numberList('sensitivity', 'flavours', flavoursText)
  flavours.forEach((f) => {
    if (!isPartonCode(f)) throw new UsageError(`sensitivity: --flavours: ${f} is not a parton code; use ${PARTON_CODES_TEXT}.`)
  })
  const q2Text = stringOption(args, 'q2')
  const q2 = q2Text === undefined ? DEFAULT_Q2_GEV2 : numberOption('sensitivity', 'q2', q2Text, 'a scale in GeV² > 0', v => v > 0)
  const xText = stringOption(args, 'x')
  const xs = xText === undefined ? Array.from(set.x) : numberList('sensitivity', 'x', xText)
  xs.forEach((x) => {
    if (!(x > 0 && x < 1)) throw new UsageError(`sensitivity: --x: ${x} is not in (0, 1).`)
  })
  const study = studyValues(io, studyFile, set, setFile, args)
  const kind = set.header.kind
  const alphas = set.header.alphasMembers
  const measurement = measurementFile === undefined ? undefined : readMeasurement(io, measurementFile, args, study.matrix.bins)
  let errors: Float64Array
  try {
    errors = predictionErrors(study.matrix, kind, set.header.confidenceLevelPercent, alphas)
  } catch (e) {
    throw new BadInputError(`${setFile}: ${(e as Error).message}`)
  }

  const maps = flavours.map((flavour) => {
    let densities
    try {
      densities = densityValues(set, flavour, q2, xs)
    } catch (e) {
      throw new BadInputError(`${setFile}: at Q² = ${q2} GeV²: ${(e as Error).message}`)
    }
    const map = correlationMap(study.matrix, densities, kind, alphas)
    const sensitivity = measurement === undefined ? null : sensitivityMap(map, errors, measurement)
    return { flavour, name: partonName(flavour), map, sensitivity }
  })

  const bins = study.matrix.bins
  const points = xs.length
  if (format === 'csv') {
    const rows = maps.flatMap(m => Array.from({ length: bins * points }, (_, i) => {
      const b = Math.floor(i / points)
      const p = i % points
      return [m.flavour, b + 1, xs[p]!, m.map.cosPhi[i]!, m.sensitivity === null ? Number.NaN : m.sensitivity[i]!]
    }))
    // A fragmentation set's momentum fraction is z (the --x values are read as z).
    io.stdout(toCsv(['flavour', 'bin', fractionAxisOf(set.header.density), 'cosPhi', 'sensitivity'], rows))
    return 0
  }
  const rowsOf = (values: Float64Array) => Array.from({ length: bins }, (_, b) => values.subarray(b * points, (b + 1) * points))
  io.stdout(toJson({
    set: set.header.name,
    holds: densityText(set.header),
    kind,
    study: study.title,
    measurement: measurementFile ?? null,
    q2GeV2: q2,
    [fractionAxisOf(set.header.density)]: xs,
    predictionError68: errors,
    kFactors: kFactorReport(study.kFactors),
    flavours: maps.map(m => ({
      flavour: m.flavour,
      name: m.name,
      cosPhi: rowsOf(m.map.cosPhi),
      ...(m.sensitivity === null ? {} : { sensitivity: rowsOf(m.sensitivity) })
    })),
    caution: LO_CAUTION
  }))
  return 0
}
