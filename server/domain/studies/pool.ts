// The evaluation pool of a worker process: one piscina worker thread per core (SHEAF_EVAL_THREADS
// to change it), kept warm for the life of the process. Plans, set members and member values are
// put in SharedArrayBuffers once, so a task carries only views: a thread reads the plan and the
// members where they are and writes its members' values straight into the shared output.
// The engine (shared/physics) stays free of node: modules; the threads live here.
import { createHash } from 'node:crypto'
import { existsSync, mkdirSync, readdirSync, readFileSync, renameSync, statSync } from 'node:fs'
import { availableParallelism, tmpdir } from 'node:os'
import { dirname, join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { buildSync } from 'esbuild'
import { Piscina } from 'piscina'
import type { Plan } from '../../../shared/physics/study/plan'
import type { StudySpec } from '../../../shared/physics/study/spec'
import type { ErrorSet } from '../../../shared/physics/types'
import type { Prescription } from '../../../shared/physics/uncertainty'
import type { ScaleVariationJson, StoredBands } from '../../database/schema'
import type { MemberSource } from '../results/bands'
import type { BandsTask, MemberAlphas, MembersTask, PlanTask, PoolTask, ScaleTask } from './pool-task'

/** Threads of the pool: SHEAF_EVAL_THREADS, else one per core the process may use. */
export function poolThreads(): number {
  const wanted = Number(process.env.SHEAF_EVAL_THREADS)
  return Number.isInteger(wanted) && wanted >= 1 ? wanted : availableParallelism()
}

let pool: Piscina<PoolTask, unknown> | null = null

/**
 * The threads' code: pool-task.ts and what it imports bundled into one ES module in the
 * temporary folder (esbuild; once per state of the sources, the machine's workers share it), so
 * a thread loads plain JavaScript at once. Through
 * tsx's loader (pool-thread.mjs, the fallback) each thread took over 10 s to start on a busy
 * 2-core machine.
 */
function threadFile(): { filename: string, execArgv?: string[] } {
  try {
    const entry = fileURLToPath(new URL('./pool-task.ts', import.meta.url))
    // One bundle per state of the sources, shared by the worker processes of this machine.
    const dir = join(tmpdir(), `sheaf-pool-${sourcesKey(resolve(dirname(entry), '../../..'))}`)
    const outfile = join(dir, 'pool-task.mjs')
    if (!existsSync(outfile)) {
      mkdirSync(dir, { recursive: true })
      const partial = `${outfile}.${process.pid}`
      buildSync({
        entryPoints: [entry], outfile: partial,
        bundle: true, platform: 'node', format: 'esm', target: 'node20', logLevel: 'silent',
        // CommonJS packages bundled into ESM still call require(): give them one.
        banner: { js: 'import { createRequire as __sheafRequire } from "node:module"; const require = __sheafRequire(import.meta.url);' }
      })
      renameSync(partial, outfile)
    }
    // Plain JavaScript: the threads need none of the parent's loaders (tsx's would start its own esbuild).
    return { filename: outfile, execArgv: [] }
  } catch (err) {
    console.error(`[pool] bundling the thread code failed, loading it through tsx: ${(err as Error).message.split('\n')[0]}`)
    return { filename: fileURLToPath(new URL('./pool-thread.mjs', import.meta.url)) }
  }
}

/** A short hash of the names, sizes and times of the sources a thread may load, and of the Node version. */
function sourcesKey(root: string): string {
  const hash = createHash('sha256').update(process.version)
  const walk = (dir: string) => {
    for (const entry of readdirSync(dir, { withFileTypes: true }).sort((a, b) => a.name.localeCompare(b.name))) {
      const path = join(dir, entry.name)
      if (entry.isDirectory()) walk(path)
      else if (/\.(ts|mjs|js|json)$/.test(entry.name)) {
        const st = statSync(path)
        hash.update(`${path}:${st.size}:${st.mtimeMs}\n`)
      }
    }
  }
  for (const dir of ['server/domain', 'server/database/schema', 'shared']) walk(join(root, dir))
  hash.update(readFileSync(join(root, 'package-lock.json')))
  return hash.digest('hex').slice(0, 16)
}

/** The process's pool, started on first use. */
export function evaluationPool(): Piscina<PoolTask, unknown> {
  const threads = poolThreads()
  pool ??= new Piscina<PoolTask, unknown>({
    ...threadFile(),
    minThreads: threads, maxThreads: threads, idleTimeout: Number.POSITIVE_INFINITY,
    // A task may wait behind all member chunks of a large run; never refuse one.
    maxQueue: Number.POSITIVE_INFINITY
  })
  return pool
}

/** Stops the pool's threads (the worker's shutdown, the benchmark's end). */
export async function closePool() {
  const p = pool
  pool = null
  await p?.close({ force: true })
}

type Typed = Float64Array | Int32Array

/** A copy of `a` in shared memory (the same array when it already is). */
export function shared<T extends Typed>(a: T): T {
  if (a.buffer instanceof SharedArrayBuffer) return a
  const Ctor = a.constructor as new (buffer: SharedArrayBuffer) => T
  const copy = new Ctor(new SharedArrayBuffer(a.byteLength))
  copy.set(a as never)
  return copy
}

/** Every typed array of `value` (a plan: nested plain objects and arrays) moved into shared memory. */
export function sharedDeep<T>(value: T): T {
  if (value instanceof Float64Array || value instanceof Int32Array) return shared(value) as T
  if (ArrayBuffer.isView(value)) return value
  if (Array.isArray(value)) return value.map(v => sharedDeep(v)) as T
  if (value && typeof value === 'object') {
    return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, sharedDeep(v)])) as T
  }
  return value
}

/** Members m0…m1 of `members` packed into one shared buffer, as one view per member. */
export function sharedMembers(members: readonly Float64Array[], m0 = 0, m1 = members.length): Float64Array[] {
  const per = members[0]?.length ?? 0
  const all = new Float64Array(new SharedArrayBuffer(Math.max(8, (m1 - m0) * per * 8)))
  const views: Float64Array[] = []
  for (let m = m0; m < m1; m++) {
    const view = all.subarray((m - m0) * per, (m - m0 + 1) * per)
    view.set(members[m]!)
    views.push(view)
  }
  return views
}

/** A set with its members (and grid) in shared memory, for tasks that read whole sets. */
export function sharedSet(set: ErrorSet, members = set.members): ErrorSet {
  return { header: set.header, x: shared(set.x), q2: shared(set.q2), flavours: set.flavours, members: sharedMembers(members) }
}

export interface PoolEvaluation {
  /** The plan, in shared memory (sharedDeep). */
  plan: Plan
  /** The varying set's members (already shared, see sharedMembers), first member m0. */
  members: Float64Array[]
  m0?: number
  fixed: Float64Array | null
  /** A paired run: the other set's members (shared, same count as `members`), member k with member k. */
  partner?: Float64Array[] | null
  varying: 'main' | 'second'
  /** Per-member α_s of the varying main set (first = the set index of members[0]). */
  alphas?: MemberAlphas | null
  /** Members per task; progress is reported as each task ends. */
  step: number
  onTaskDone?: (membersDone: number) => unknown
  signal?: AbortSignal
}

/**
 * members × bins values (member-major, shared memory) of the varying set's members, evaluated
 * in tasks of `step` members on every thread of the pool. Aborting `signal` drops the waiting
 * tasks and stops the running ones.
 */
export async function evaluateOnPool(e: PoolEvaluation): Promise<Float64Array> {
  const p = evaluationPool()
  const out = new Float64Array(new SharedArrayBuffer(Math.max(8, e.members.length * e.plan.nBins * 8)))
  const values = out.subarray(0, e.members.length * e.plan.nBins)
  let done = 0
  const tasks: Promise<unknown>[] = []
  for (let k = 0; k < e.members.length; k += e.step) {
    const members = e.members.slice(k, k + e.step)
    const partner = e.partner ? e.partner.slice(k, k + e.step) : null
    const alphas = e.alphas ? { header: e.alphas.header, first: e.alphas.first + k } : null
    const task: MembersTask = { op: 'members', plan: e.plan, members, fixed: e.fixed, partner, varying: e.varying, out: values, m0: k, alphas }
    tasks.push(p.run(task, e.signal ? { signal: e.signal } : {}).then(async (n) => {
      done += n as number
      await e.onTaskDone?.(done)
    }))
  }
  await Promise.all(tasks)
  return values
}

/** The stored bands of one prescription (with an apart run's second part, if given), computed on a pool thread. */
export function bandsOnPool(matrix: BandsTask['matrix'], source: MemberSource, prescription: Prescription, clPercent: number, signal?: AbortSignal, second?: BandsTask['second']) {
  const task: BandsTask = { op: 'bands', matrix, source, prescription, clPercent, second }
  return evaluationPool().run(task, signal ? { signal } : {}) as Promise<StoredBands>
}

/** The scale variation of the central members, computed on a pool thread. */
export function scaleOnPool(spec: StudySpec, main: ErrorSet, second: ErrorSet | null, signal?: AbortSignal) {
  const task: ScaleTask = { op: 'scale', spec, main: sharedSet(main, main.members.slice(0, 1)), second: second ? sharedSet(second, second.members.slice(0, 1)) : null }
  return evaluationPool().run(task, signal ? { signal } : {}) as Promise<ScaleVariationJson | null>
}

/**
 * The plan built on a pool thread (a large study's plan takes seconds; the worker's main thread
 * must stay free to renew its job locks), returned in shared memory.
 */
export async function planOnPool(spec: StudySpec, main: ErrorSet, second: ErrorSet | null): Promise<Plan> {
  const axes = (s: ErrorSet) => ({ header: s.header, x: s.x, q2: s.q2, flavours: s.flavours })
  const task: PlanTask = { op: 'plan', spec, main: axes(main), second: second ? axes(second) : null }
  return sharedDeep(await evaluationPool().run(task) as Plan)
}

/** Starts every thread (each loads the engine once), so the first run does not wait for it. */
export async function warmPool() {
  const p = evaluationPool()
  const plan: Plan = { kernel: 'none', nBins: 0, unit: 'pb', parts: [], outsideBins: [], points: 0 }
  await Promise.all(Array.from({ length: p.options.maxThreads }, () => p.run({ op: 'members', plan, members: [], fixed: null, varying: 'main', out: new Float64Array(0), m0: 0 } as MembersTask).catch(() => 0)))
}
