/**
 * `sheaf evolve <input.json> [--x <list>] [--q2 <list>] [--out <set-file>]`: LO evolution of a
 * parametrised input at the central values of its parameters.
 */
import { buildErrorSet, evolveModel, interpolateLogX, planForModel } from '../../../shared/physics/evolution'
import type { InputModel } from '../../../shared/physics/input'
import type { ErrorSet } from '../../../shared/physics/types'
import { numberList, outputFormat, parseVerbArgs, stringOption, type VerbSpec } from '../args'
import { BadInputError, UsageError } from '../errors'
import type { CliIo } from '../io'
import { loadModel } from '../input-file'
import { toCsv, toJson } from '../output'
import { saveSet } from '../set-file'

export const evolveVerb: VerbSpec = {
  name: 'evolve',
  summary: 'LO-evolve a parametrised input (central parameters): x·f at points, or a one-member set file',
  help: `Usage: sheaf evolve <input.json> (--x <list> --q2 <list> | --out <set-file>) [options]

Evolves the input (see the README's input format) at the central values of its parameters with
the engine's LO x-space DGLAP evolution, from its starting scale μ₀² upwards. A fragmentation
input ("density": fragmentation) is evolved with the timelike kernels; its values are z·D at z = x.

With --x and --q2, prints x·f(x, Q²) of every flavour at every combination of the two lists
(Q² outer, x inner, in the order given) as
  { "points": [ { "x": …, "q2": …, "xf": { "<PDG code>": value, … } }, … ] }
The Q² values are nodes of the evolution itself and x·f at x is read from the evolution's own
piecewise Lagrange representation in ln x, so no interpolation in Q² is involved.
With --out, writes a one-member set file (kind hessian-pairs with no eigenvectors) on the grid
the input asks for (its "grid" block, else the engine's default grid). Both may be given.

Options:
  --x <list>           comma-separated x values in (0, 1), e.g. 1e-4,0.01,0.1,0.5
  --q2 <list>          comma-separated Q² values in GeV², each ≥ μ₀², e.g. 10,100,1e4
  --out <set-file>     write the evolved central member as a set file
  --baseline <file>    baseline input of a nuclear modification (default: the file its
                       "baseline.file" names, next to the input)
  --format json|csv    for the points: json (default) or CSV with columns x, q2 and one per flavour
  -h, --help           this text`,
  options: {
    x: { type: 'string' },
    q2: { type: 'string' },
    out: { type: 'string' },
    baseline: { type: 'string' },
    format: { type: 'string' }
  },
  positionals: { min: 1, max: 1, what: 'input file' }
}

/** One output point of `evolve --x --q2`. */
export interface EvolvedPoint {
  x: number
  q2: number
  /** x·f by PDG code (as a string key), every flavour of the evolution (−6…6 without 0, and 21). */
  xf: Record<string, number>
}

/**
 * x·f of every flavour at every (x, Q²) combination (Q² outer, x inner), from one evolution of
 * the central member whose Q² nodes are exactly the requested values; x·f at x comes from the
 * evolution's own piecewise Lagrange representation in ln x (interpolateLogX, same degree).
 * @param q2GeV2 values ≥ μ₀² (GeV²); x values in [first x node, 1].
 * @throws RangeError (from the engine) for an x below the grid's first node.
 * @example evolvedPoints(model, [0.1], [100])[0].xf['21'] // x·g(0.1, 100 GeV²)
 */
export function evolvedPoints(model: InputModel, x: readonly number[], q2GeV2: readonly number[]): EvolvedPoint[] {
  // The evolution starts at μ₀² whatever the first node; distinct values in increasing order.
  const nodes = [...new Set(q2GeV2)].sort((a, b) => a - b)
  const plan = planForModel(model, { q2: { nodesGeV2: nodes } })
  const member = evolveModel(model, plan)
  const nx = plan.x.length
  const nf = plan.flavours.length
  const degree = plan.setup.interpolationDegree ?? 7
  const points: EvolvedPoint[] = []
  for (const q2 of q2GeV2) {
    // A threshold appears twice among the nodes; both copies hold the same values at LO.
    const iq = plan.q2.lastIndexOf(q2)
    const columns = plan.flavours.map((_, f) => {
      const column = new Float64Array(nx)
      for (let ix = 0; ix < nx; ix++) column[ix] = member.values[(iq * nx + ix) * nf + f]!
      return interpolateLogX(plan.x, column, x, degree)
    })
    x.forEach((xv, p) => {
      const xf: Record<string, number> = {}
      plan.flavours.forEach((pdg, f) => { xf[String(pdg)] = columns[f]![p]! })
      points.push({ x: xv, q2, xf })
    })
  }
  return points
}

/**
 * The central member alone as an error set (kind hessian-pairs with no eigenvectors) on the
 * grid the input asks for, with the header and provenance buildErrorSet gives.
 * @example centralSet(model).members.length // 1
 */
export async function centralSet(model: InputModel): Promise<ErrorSet> {
  return buildErrorSet(model, {
    type: 'parameters',
    kind: 'hessian-pairs',
    confidenceLevelPercent: 68,
    vectors: [model.central],
    description: 'central member only (parameters at their central values), no error members'
  })
}

/** Runs `evolve`; returns the exit code. */
export async function runEvolve(argv: readonly string[], io: CliIo): Promise<number> {
  const args = parseVerbArgs(evolveVerb, argv)
  if (args.help) { io.stdout(`${evolveVerb.help}\n`); return 0 }
  const format = outputFormat('evolve', args)
  const xText = stringOption(args, 'x')
  const q2Text = stringOption(args, 'q2')
  const out = stringOption(args, 'out')
  if ((xText === undefined) !== (q2Text === undefined)) throw new UsageError(`evolve: --x and --q2 go together (all combinations of the two lists are printed); see 'sheaf evolve --help'.`)
  if (xText === undefined && out === undefined) throw new UsageError(`evolve needs --x and --q2 (points to print), or --out (a set file to write); see 'sheaf evolve --help'.`)
  const x = xText === undefined ? [] : numberList('evolve', 'x', xText)
  const q2 = q2Text === undefined ? [] : numberList('evolve', 'q2', q2Text)
  x.forEach((v) => { if (!(v > 0 && v < 1)) throw new UsageError(`evolve: --x value ${v} is not in (0, 1).`) })
  q2.forEach((v) => { if (!(v > 0)) throw new UsageError(`evolve: --q2 value ${v} is not a positive number of GeV².`) })

  const file = args.positionals[0]!
  const model = loadModel(io, file, stringOption(args, 'baseline'))
  const low = q2.find(v => v < model.startScaleGeV2)
  if (low !== undefined) {
    throw new BadInputError(`evolve: --q2 value ${low} GeV² lies below the starting scale μ₀² = ${model.startScaleGeV2} GeV² of ${file}; the evolution runs upwards only.`)
  }

  let written: Record<string, unknown> | undefined
  if (out !== undefined) {
    let set: ErrorSet
    try {
      set = await centralSet(model)
    } catch (e) {
      throw new BadInputError(`${file}: ${(e as Error).message}`)
    }
    const bytes = saveSet(io, out, set)
    written = { out, set: set.header.name, members: 1, grid: { nx: set.x.length, nq2: set.q2.length, nf: set.flavours.length }, bytes }
  }
  if (xText === undefined) {
    io.stdout(toJson({ written }))
    return 0
  }
  let points: EvolvedPoint[]
  try {
    points = evolvedPoints(model, x, q2)
  } catch (e) {
    throw new BadInputError(`evolve: ${file}: ${(e as Error).message}`)
  }
  if (format === 'csv') {
    const flavours = Object.keys(points[0]!.xf).sort((a, b) => Number(a) - Number(b))
    io.stdout(toCsv(['x', 'q2', ...flavours], points.map(p => [p.x, p.q2, ...flavours.map(f => p.xf[f])])))
  } else {
    io.stdout(toJson({ points }))
  }
  return 0
}
