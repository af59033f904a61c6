/**
 * `sheaf members <input.json> --hessian T | --replicas N [--seed S] --out <set-file>`: an error
 * set from a fit's parameters and covariance, every member LO-evolved (timelike for a
 * fragmentation input).
 */
import jStat from 'jstat'
import { buildErrorSet, type MemberRequest } from '../../../shared/physics/evolution'
import { nucleusProblem, type InputModel } from '../../../shared/physics/input'
import { nucleusSetName, usualNucleus } from '../../../shared/physics/nuclei'
import { numberOption, parseVerbArgs, stringOption, type VerbSpec } from '../args'
import { BadInputError, UsageError } from '../errors'
import type { CliIo } from '../io'
import { loadModel } from '../input-file'
import { toJson } from '../output'
import { saveSet } from '../set-file'

export const membersVerb: VerbSpec = {
  name: 'members',
  summary: 'Hessian eigenvector pairs or Monte-Carlo replicas of a fit, evolved, as a set file',
  help: `Usage: sheaf members <input.json> (--hessian <T> | --replicas <N> [--seed <S>]) --out <set-file> [options]

Builds an error set from the input's parameters and covariance and LO-evolves every member onto
the grid the input asks for:
  --hessian T    eigenvector pairs p_k± = p₀ ± T√λ_k e_k of the covariance (Δχ² = T²), kind
                 hessian-pairs, 1 + 2n members for n parameters
  --replicas N   N replicas p₀ + L z (Cholesky C = L Lᵀ, z standard normal from the seeded
                 Philox4x32-10 stream: the same seed gives the same replicas on any machine);
                 member 0 is the replica mean, kind replicas
Without either, the input's own "members" block is used. Prints a JSON summary of what it wrote.
An input that declares "density": { "type": "fragmentation", "hadron": … } describes
fragmentation functions z·D_i^h: every member is checked (z·D ≥ 0 on the grid, ∫ z·D dz ≤ 1 per
parton) and evolved with the LO timelike kernels, and the set's header says which hadron.

Options:
  --seed S           replica seed, a whole number ≥ 0 (default: the input's members.seed, else 1)
  --cl <percent>     CL the members stand for (default: for --hessian, the input's
                     members.confidenceLevelPercent when its tolerance is the same T, else the
                     Gaussian coverage of ±T, 68 for T = 1; for --replicas 68)
  --out <set-file>   the set file to write (required)
  --baseline <file>  baseline input of a nuclear modification (default: its "baseline.file")
  --nucleus <N>      build a nuclear modification (family) for this nucleus instead of its own
                     target: a symbol of a usual target (C, Ar, Fe, Pb, D …) or Z:A (26:56); the
                     set is named <input name>-<symbol><A>
  -h, --help         this text`,
  options: {
    hessian: { type: 'string' },
    replicas: { type: 'string' },
    seed: { type: 'string' },
    cl: { type: 'string' },
    out: { type: 'string' },
    baseline: { type: 'string' },
    nucleus: { type: 'string' }
  },
  positionals: { min: 1, max: 1, what: 'input file' }
}

/**
 * CL in percent of Hessian members at tolerance T when nothing says otherwise: the two-sided
 * Gaussian coverage 100·(2Φ(T) − 1), read as 68 (one sigma) for T = 1 (common practice).
 * @example hessianClPercent(1.6448536269514722) // 90.000…
 */
export function hessianClPercent(tolerance: number): number {
  if (tolerance === 1) return 68
  return 100 * (2 * jStat.normal.cdf(tolerance, 0, 1) - 1)
}

/** --nucleus: a usual target's symbol or Z:A. */
function nucleusOption(text: string): { z: number, a: number } {
  const za = /^(\d+):(\d+)$/.exec(text.trim())
  const nucleus = za ? { z: Number(za[1]), a: Number(za[2]) } : usualNucleus(text.trim())
  if (!nucleus) throw new UsageError(`members: --nucleus "${text}" is neither Z:A (e.g. 26:56) nor a usual target symbol (C, Ar, Fe, Pb, D, …).`)
  const problem = nucleusProblem(nucleus)
  if (problem) throw new UsageError(`members: --nucleus ${text}: ${problem}.`)
  return nucleus
}

function memberRequest(args: ReturnType<typeof parseVerbArgs>, model: InputModel): MemberRequest {
  const hessian = stringOption(args, 'hessian')
  const replicas = stringOption(args, 'replicas')
  const seedText = stringOption(args, 'seed')
  const clText = stringOption(args, 'cl')
  const cl = clText === undefined ? undefined : numberOption('members', 'cl', clText, 'a percentage strictly between 0 and 100', v => v > 0 && v < 100)
  if (hessian !== undefined && replicas !== undefined) throw new UsageError(`members: give --hessian or --replicas, not both.`)
  if (hessian !== undefined && seedText !== undefined) throw new UsageError(`members: --seed applies to --replicas only.`)
  const own = model.members
  if (hessian !== undefined) {
    const tolerance = numberOption('members', 'hessian', hessian, 'a tolerance T > 0 (Δχ² = T²)', v => v > 0)
    const fromInput = own?.type === 'hessian' && own.tolerance === tolerance ? own.confidenceLevelPercent : undefined
    return { type: 'hessian', tolerance, confidenceLevelPercent: cl ?? fromInput ?? hessianClPercent(tolerance) }
  }
  if (replicas !== undefined) {
    const count = numberOption('members', 'replicas', replicas, 'a whole number of replicas ≥ 2', v => Number.isInteger(v) && v >= 2)
    const seed = seedText === undefined
      ? (own?.type === 'replicas' ? own.seed : 1)
      : numberOption('members', 'seed', seedText, 'a whole number ≥ 0', v => Number.isSafeInteger(v) && v >= 0)
    return { type: 'replicas', count, seed, confidenceLevelPercent: cl ?? 68 }
  }
  if (seedText !== undefined) throw new UsageError(`members: --seed needs --replicas N.`)
  if (own === undefined) throw new UsageError(`members needs --hessian T or --replicas N (the input has no "members" block); see 'sheaf members --help'.`)
  if (own.type === 'hessian') return { type: 'hessian', tolerance: own.tolerance, confidenceLevelPercent: cl ?? own.confidenceLevelPercent }
  return { type: 'replicas', count: own.count, seed: own.seed, confidenceLevelPercent: cl ?? own.confidenceLevelPercent }
}

/** Runs `members`; returns the exit code. */
export async function runMembers(argv: readonly string[], io: CliIo): Promise<number> {
  const args = parseVerbArgs(membersVerb, argv)
  if (args.help) { io.stdout(`${membersVerb.help}\n`); return 0 }
  const out = stringOption(args, 'out')
  if (out === undefined) throw new UsageError(`members needs --out <set-file>; see 'sheaf members --help'.`)
  const file = args.positionals[0]!
  const nucleusText = stringOption(args, 'nucleus')
  const nucleus = nucleusText === undefined ? undefined : nucleusOption(nucleusText)
  const loaded = loadModel(io, file, stringOption(args, 'baseline'), nucleus)
  const model = nucleus ? { ...loaded, name: nucleusSetName(loaded.name, nucleus) } : loaded
  const request = memberRequest(args, model)
  let set
  try {
    set = await buildErrorSet(model, request)
  } catch (e) {
    throw new BadInputError(`${file}: ${(e as Error).message}`)
  }
  const bytes = saveSet(io, out, set)
  const { header } = set
  io.stdout(toJson({
    written: {
      out,
      set: header.name,
      kind: header.kind,
      members: header.memberCount,
      clPercent: header.confidenceLevelPercent,
      ...(header.density ? { density: header.density } : {}),
      grid: { nx: set.x.length, nq2: set.q2.length, nf: set.flavours.length },
      bytes,
      provenance: header.provenance
    }
  }))
  return 0
}
