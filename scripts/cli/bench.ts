/**
 * The engine's speed benchmark, run by `npm run bench`: in one process,
 * (a) 1000 replicas × 1000 Drell–Yan bins, each integrated over a rapidity bin with 8
 * Gauss–Legendre points, through the precomputed plan; (b) the same by direct per-point
 * interpolation; (c) one member's LO evolution on 100 x × 40 Q² nodes. A measurement: it
 * prints times and PASS/MISS against the targets and always exits 0.
 */
import { cpus, loadavg } from 'node:os'
import { parseArgs } from 'node:util'
import { buildErrorSet, evolveModel, planForModel } from '../../shared/physics/evolution'
import { benchmarkSpec, buildPlan, evaluateDirect, evaluatePlan } from '../../shared/physics/study'
import { normalStream } from '../../shared/physics/random'
import { hessianToReplicas } from '../../shared/physics/uncertainty'
import type { InputModel } from '../../shared/physics/input'
import { describeFailure, UsageError } from './errors'
import type { CliIo } from './io'
import { loadModel } from './input-file'

/**
 * The project's speed targets on its 2-core machine: the precomputed plan (shared/physics/README.md
 * §19 Study evaluation) and one member's x-space evolution (§8.3 x-space method).
 */
export const BENCH_TARGETS = { planMs: 2000, ratio: 10, evolutionMs: 100 } as const

/** What the benchmark measures; all times in milliseconds. */
export interface BenchOptions {
  /** Fit the replicas come from (default samples/fits/brindle-mc-1.json). */
  fit: string
  replicas: number
  /** Members timed by direct interpolation; the time is scaled linearly to all members. */
  directMembers: number
  seed: number
  /** Evolve every parameter replica (the full fit path, ~30 ms per member) instead of Hessian → replicas on the grids. */
  evolveReplicas: boolean
}

const DEFAULTS: BenchOptions = { fit: 'samples/fits/brindle-mc-1.json', replicas: 1000, directMembers: 20, seed: 1, evolveReplicas: false }

const ms = (t: number) => (t >= 10_000 ? `${(t / 1000).toFixed(1)} s` : t >= 100 ? `${t.toFixed(0)} ms` : `${t.toFixed(1)} ms`)
const verdict = (ok: boolean) => (ok ? 'PASS' : 'MISS')

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b)
  const mid = Math.floor(s.length / 2)
  return s.length % 2 === 1 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2
}

/** A replica set as the study functions take it, and how it was made. */
interface BenchSet {
  x: Float64Array
  q2: Float64Array
  flavours: number[]
  members: Float64Array[]
  how: string
}

/** The fit's Hessian pairs (T = 1) evolved by the engine, then Hessian → replicas on the grids. */
async function hessianReplicas(model: InputModel, o: BenchOptions): Promise<BenchSet> {
  const hessian = await buildErrorSet(model, { type: 'hessian', tolerance: 1, confidenceLevelPercent: 68 })
  const perMember = hessian.members[0]!.length
  const matrix = { members: hessian.members.length, bins: perMember, values: new Float64Array(hessian.members.length * perMember) }
  hessian.members.forEach((m, k) => matrix.values.set(m, k * perMember))
  const values = hessianToReplicas(matrix, 'hessian-pairs', o.replicas, normalStream(o.seed, { purpose: 'synthetic', index: 0 })).values
  const members = Array.from({ length: o.replicas + 1 }, (_, k) => values.subarray(k * perMember, (k + 1) * perMember))
  const pairs = (hessian.members.length - 1) / 2
  return {
    x: hessian.x, q2: hessian.q2, flavours: hessian.flavours, members,
    how: `its ${pairs} Hessian eigenvector pairs at T = 1 LO-evolved by the engine, then X_r = X0 + Σ_k ½(X_k+ − X_k−) R_kr on the grids (Watt–Thorne, arXiv:1205.4024; seeded normals, seed ${o.seed})`
  }
}

/** The full fit path: every parameter replica LO-evolved by the engine. */
async function evolvedReplicas(model: InputModel, o: BenchOptions): Promise<BenchSet> {
  const set = await buildErrorSet(model, { type: 'replicas', count: o.replicas, seed: o.seed })
  return { ...set, how: `${o.replicas} parameter replicas (Cholesky, Philox seed ${o.seed}), each LO-evolved by the engine` }
}

/**
 * Runs the benchmark and prints its report line by line to `io.stdout`.
 * The replica set, by default: the fit's Hessian eigenvector pairs (T = 1) are built and
 * LO-evolved by the engine, then turned into `replicas` replicas on the grids,
 * X_r = X₀ + Σ_k ½(X_k⁺ − X_k⁻) R_kr with seeded standard normals (Watt & Thorne,
 * arXiv:1205.4024; LO evolution is linear in the densities, so this equals evolving the
 * linearised parameter replicas). Evolving 1000 parameter replicas one by one (`evolveReplicas`)
 * takes about half a minute and is not what is being measured.
 * @returns the exit code, always 0.
 */
export async function runBench(options: Partial<BenchOptions>, io: CliIo): Promise<number> {
  const o = { ...DEFAULTS, ...options }
  const say = (line = '') => io.stdout(`${line}\n`)
  const load = loadavg().map(v => v.toFixed(2)).join(' ')
  say(`Sheaf engine benchmark — Node ${process.version}, ${cpus().length} CPUs, load average ${load} at start`)

  const model = loadModel(io, o.fit)

  // (c) first, before the large replica arrays exist, so their garbage collection does not
  // land in it: one member on 100 x × 40 Q² nodes, from scratch (evolution plan and convolution
  // matrices built), then with the plan prepared (median of 5).
  const g = model.grid
  const grid = {
    x: { count: 100, min: g?.x?.min ?? 1e-6, max: g?.x?.max ?? 0.99 },
    q2: { count: 40, maxGeV2: g?.q2?.maxGeV2 ?? 1e8 }
  }
  let t0 = performance.now()
  const evolution = planForModel(model, grid)
  const evolutionPlanMs = performance.now() - t0
  evolveModel(model, evolution)
  const coldMs = performance.now() - t0
  const warmMs = median(Array.from({ length: 5 }, () => {
    const t = performance.now()
    evolveModel(model, evolution)
    return performance.now() - t
  }))

  // The replica set (not timed against the targets).
  t0 = performance.now()
  const set = o.evolveReplicas ? await evolvedReplicas(model, o) : await hessianReplicas(model, o)
  const setMs = performance.now() - t0
  const members = set.members
  say(`Replicas: ${o.replicas} (+ member 0) from ${o.fit} (${model.name}): ${set.how}`)
  say(`  grid ${set.x.length} x × ${set.q2.length} Q² × ${set.flavours.length} flavours; built in ${ms(setMs)} (not timed below)`)

  const spec = benchmarkSpec(40, 25, 8)
  say(`Study: ${spec.bins.length} Drell–Yan bins (40 masses 20–1000 GeV × 25 rapidity bins over |y| ≤ 2.5, √s = 13 TeV), ${spec.quadratureOrder} Gauss–Legendre points per bin`)

  // (a) precomputed plan. A two-member run first lets the JIT compile the loops.
  t0 = performance.now()
  const plan = buildPlan(spec, set)
  const buildMs = performance.now() - t0
  evaluatePlan(plan, members.slice(0, 2))
  t0 = performance.now()
  const planValues = evaluatePlan(plan, members)
  const evalMs = performance.now() - t0
  const aMs = buildMs + evalMs
  say(`(a) precomputed plan: build ${ms(buildMs)} + evaluate ${members.length} members ${ms(evalMs)} = ${ms(aMs)}   target < ${BENCH_TARGETS.planMs / 1000} s: ${verdict(aMs < BENCH_TARGETS.planMs)}`)

  // (b) direct per-point interpolation on a subset, scaled linearly.
  const subset = Math.min(o.directMembers, members.length)
  t0 = performance.now()
  const direct = evaluateDirect(spec, { ...set, members: members.slice(0, subset) })
  const directMeasured = performance.now() - t0
  const bMs = (directMeasured * members.length) / subset
  let maxRel = 0
  for (let i = 0; i < direct.length; i++) maxRel = Math.max(maxRel, Math.abs(planValues[i]! - direct[i]!) / Math.abs(direct[i]!))
  const scaled = subset < members.length ? `, scaled linearly to ${members.length} members: ${ms(bMs)}` : ''
  say(`(b) direct interpolation: ${subset} members in ${ms(directMeasured)}${scaled} (timed on a subset of ${subset} members)`)
  const ratio = bMs / aMs
  say(`    ratio (b)/(a) = ${ratio.toFixed(1)} (against the plan's evaluation alone: ${(bMs / evalMs).toFixed(1)})   target ≥ ${BENCH_TARGETS.ratio}: ${verdict(ratio >= BENCH_TARGETS.ratio)}`)
  say(`    plan vs direct on those members: largest relative difference ${maxRel.toExponential(1)}`)

  const distinct = new Set(evolution.q2).size
  say(`(c) LO evolution of one member, ${evolution.x.length} x × ${distinct} Q² nodes (${evolution.q2.length} with thresholds doubled): ${ms(coldMs)} from scratch (of which evolution plan and matrices ${ms(evolutionPlanMs)}), ${ms(warmMs)} with the plan prepared (median of 5)`)
  say(`    target < ${BENCH_TARGETS.evolutionMs} ms: ${verdict(coldMs < BENCH_TARGETS.evolutionMs)} from scratch, ${verdict(warmMs < BENCH_TARGETS.evolutionMs)} with the plan prepared`)
  return 0
}

/**
 * `npm run bench [-- --replicas N --direct-members M --fit file --seed S --evolve-replicas]`.
 * @returns the exit code: 0, 1 when the fit cannot be read, 2 for a usage error.
 */
export async function benchMain(argv: readonly string[], io: CliIo): Promise<number> {
  let values
  try {
    values = parseArgs({
      args: [...argv],
      options: {
        'fit': { type: 'string' },
        'replicas': { type: 'string' },
        'direct-members': { type: 'string' },
        'seed': { type: 'string' },
        'evolve-replicas': { type: 'boolean' },
        'help': { type: 'boolean', short: 'h' }
      },
      strict: true
    }).values
  } catch (e) {
    io.stderr(`bench: ${(e as Error).message.split('. ')[0]}\n`)
    return 2
  }
  if (values.help) {
    io.stdout(`Usage: npm run bench [-- --replicas N] [--direct-members M] [--fit <input.json>] [--seed S] [--evolve-replicas]

Defaults: 1000 replicas from samples/fits/brindle-mc-1.json (Hessian pairs evolved, then Hessian →
replicas on the grids; --evolve-replicas evolves every parameter replica instead), direct
interpolation timed on 20 members and scaled linearly, seed 1. Always exits 0 after measuring.
`)
    return 0
  }
  const int = (text: string | undefined, name: string, min: number): number | undefined => {
    if (text === undefined) return undefined
    const v = Number(text)
    if (!Number.isInteger(v) || v < min) throw new UsageError(`--${name} must be a whole number ≥ ${min}, got '${text}'`)
    return v
  }
  try {
    const options: Partial<BenchOptions> = {}
    if (values.fit !== undefined) options.fit = values.fit
    const replicas = int(values.replicas, 'replicas', 2)
    const direct = int(values['direct-members'], 'direct-members', 1)
    const seed = int(values.seed, 'seed', 0)
    if (replicas !== undefined) options.replicas = replicas
    if (direct !== undefined) options.directMembers = direct
    if (seed !== undefined) options.seed = seed
    if (values['evolve-replicas'] === true) options.evolveReplicas = true
    return await runBench(options, io)
  } catch (e) {
    const { code, message } = describeFailure(e)
    io.stderr(`bench: ${message}\n`)
    return code
  }
}
