// Running one study on one set (a `results` row) in ONE function, used by the worker, the seed
// and the command line alike. Phases, named in the row's progress: "evaluating members" (every
// member through the engine's precomputed plan, on every core of the evaluation pool when the
// work is large, in chunks with progress (members done / total)), "combining" (the bands of every
// prescription of the set's kind at the study's CL; the scale variation of the central members
// ran beside the members; with K-factors in the spec both are K-scaled first), "storing" (values,
// scale variation and bands in one transaction).
// The cancel flag is watched all along (lifecycle.ts watchCancel). A large run may instead be
// evaluated as member chunks by any number of workers (evaluateRunChunk, the chunk jobs of a
// BullMQ flow) and combined here from their values (`memberValues`). Idempotent: a retry of a
// finished result does nothing, a retry of an unfinished one recomputes and overwrites the same
// rows (result_values keyed by result id). Bad physics input (a RangeError) fails at once.
import { and, eq, inArray, sql } from 'drizzle-orm'
import type { DB } from '../../database/client'
import { tables as t } from '../../database/client'
import type { Result, ScaleVariationJson, StoredBands } from '../../database/schema'
import type { Plan } from '../../../shared/physics/study/plan'
import { parseStudySpec, type StudySpec } from '../../../shared/physics/study/spec'
import { applyKFactors, applyKFactorsToRows } from '../../../shared/physics/impact/k-factors'
import type { ErrorSet, SetHeader } from '../../../shared/physics/types'
import { splitApart } from '../../../shared/physics/uncertainty/two-sets'
import type { MemberValues } from '../../../shared/physics/uncertainty'
import { prescriptionsFor, type Prescription } from '../../../shared/physics/uncertainty/bands'
import { ENGINE_VERSION } from '../../../shared/physics/version'
import type { JobPhase, JobProgress } from '../../../shared/queue/workflow'
import { type CancelWatch, isCancel, JobCancelled, ONLY_ATTEMPT, runQueuedWork, watchCancel } from '../jobs/lifecycle'
import { notifyRunEnded } from '../mail/job-ended'
import { apartStoredBands, storedBands, bandsFromValues, memberSourceOf } from '../results/bands'
import { float64ToBytes } from '../results/float64'
import type { RunOptions } from '../sets/build'
import { loadErrorSet } from '../sets/store'
import { pairRoles, runSizeProblem, runVariation, studySizeProblem, type RunVariation } from './check'
import { bandsOnPool, evaluateOnPool, planOnPool, poolThreads, scaleOnPool, shared, sharedDeep, sharedMembers } from './pool'
import { type MemberAlphas, planOf, runMembers } from './pool-task'
import { scaleVariationOf } from './scale'

/** Members per inline chunk: progress is reported and the cancel flag read after each chunk. */
const chunkSize = (members: number) => Math.max(1, Math.min(25, Math.ceil(members / 20)))

/**
 * Work (members × quadrature points) from which the pool is used: below it (about 0.1 s on one
 * core) handing the work to threads costs more than it saves.
 */
export const POOL_MIN_WORK = 1_000_000

export interface StudyRunOptions extends RunOptions {
  /** 'auto' (default): the pool for large work when the machine has more than one core; false: inline. */
  pool?: 'auto' | boolean
  /** Member values evaluated elsewhere (the chunks of a flow), members × bins; skips the evaluation. */
  memberValues?: () => Promise<Float64Array>
}

/** Runs result `resultId` to its end (see the file comment). */
export function runStudy(db: DB, resultId: string, o: StudyRunOptions = {}) {
  return runQueuedWork<Result, { members: number, bins: number }>(db, o.attempt ?? ONLY_ATTEMPT, {
    table: t.results, id: resultId,
    resetProgress: o.memberValues ? { phase: 'combining' } : { membersDone: 0, phase: 'evaluating members' },
    work: (row, cancel) => compute(db, row, o, cancel),
    ended: o.mail ? () => notifyRunEnded(db, o.mail!, resultId) : undefined
  })
}

/** What a run needs before evaluating: the spec, both sets in their roles, how they vary, and the plan. */
export interface Prepared {
  spec: StudySpec
  set: ErrorSet
  roles: ReturnType<typeof pairRoles<ErrorSet>>
  /** The study's second set (the result's set's partner), or null. */
  partner: ErrorSet | null
  variation: RunVariation
  /** The plan in shared memory (the pool reads it where it is). */
  plan: Plan
  /** Member rows of the run (variation.rows). */
  members: number
}

const prepared = new Map<string, Promise<Prepared>>()

/**
 * Studies from this many bins have their plan built on a pool thread: on the main thread it
 * would hold up the renewal of the job's lock for seconds.
 */
export const PLAN_ON_POOL_BINS = 2000

/** The spec, sets and plan of a result, kept for the last few results (a worker's chunk jobs share them). */
function prepare(db: DB, result: Result, pool: StudyRunOptions['pool']): Promise<Prepared> {
  let hit = prepared.get(result.id)
  if (!hit) {
    hit = (async () => {
      const snapshot = result.specSnapshot
      const spec = parseStudySpec(snapshot.spec)
      // Runs queued before the budgets existed (or under larger ones) fail at once, before loading.
      const tooLarge = studySizeProblem(spec) ?? runSizeProblem(spec, snapshot.set)
      if (tooLarge) throw new RangeError(tooLarge.message)
      const set = await loadErrorSet(db, result.setId)
      const second = result.secondSetId ? await loadErrorSet(db, result.secondSetId) : null
      return prepareRun(spec, set, second, pool)
    })()
    prepared.set(result.id, hit)
    hit.catch(() => prepared.delete(result.id))
    while (prepared.size > 4) prepared.delete(prepared.keys().next().value!)
  }
  return hit
}

/** A run's roles, variation and plan from its spec and sets (no database: tests and the benchmark call it too). */
export async function prepareRun(spec: StudySpec, set: ErrorSet, second: ErrorSet | null, pool: StudyRunOptions['pool'] = false): Promise<Prepared> {
  const roles = pairRoles(set, second)
  const variation = runVariation(spec, set, second)
  const plan = pool !== false && spec.bins.length >= PLAN_ON_POOL_BINS
    ? await planOnPool(spec, roles.main, roles.second)
    : sharedDeep(planOf(spec, roles.main, roles.second))
  return { spec, set, roles, partner: second, variation, plan, members: variation.rows }
}

/**
 * Every row of a prepared run (inline or on the pool) and its combination, without a database
 * row: the numbers runStudy stores. For tests and the benchmark.
 */
export async function computeRun(p: Prepared, clPercent: number, pool = false): Promise<CombinedRun> {
  const values = await evaluateRows(p, 0, p.members, pool)
  return combineRun(p.spec, p.set, p.partner ? p.roles : null, values, clPercent, { pool, apart: apartOf(p) })
}

/** Rows m0…m1 of a prepared run, as a chunk job evaluates them (no database, no cancel flag). */
export function evaluateRows(p: Prepared, m0: number, m1: number, pool = false): Promise<Float64Array> {
  const watch: CancelWatch = { signal: new AbortController().signal, check: () => {}, readNow: async () => {}, stop: () => {} }
  return evaluateRange(p, m0, m1, pool, watch, async () => {})
}

const usePool = (pool: StudyRunOptions['pool'], members: number, plan: Plan) =>
  pool === true || (pool !== false && poolThreads() > 1 && members * Math.max(1, plan.points) >= POOL_MIN_WORK)

async function setPhase(db: DB, id: string, phase: JobPhase, done: number, total: number, onProgress: RunOptions['onProgress']) {
  await db.update(t.results).set({ phase }).where(eq(t.results.id, id))
  await onProgress?.({ done, total, phase })
}

async function compute(db: DB, result: Result, o: StudyRunOptions, cancel: CancelWatch) {
  const p = await prepare(db, result, o.pool)
  const pool = usePool(o.pool, p.members, p.plan)
  const { main, second } = p.roles
  // The scale variation needs only the central members: it runs beside the member evaluation.
  const scale = pool ? scaleOnPool(p.spec, main, second, cancel.signal) : null
  scale?.catch(() => {})
  const values = o.memberValues
    ? await o.memberValues()
    : await evaluateMembers(db, result, p, pool, o.onProgress, cancel)
  if (values.length !== p.members * p.plan.nBins) throw new Error(`Member values of ${values.length} numbers for ${p.members} members × ${p.plan.nBins} bins`)
  cancel.check()
  await setPhase(db, result.id, 'combining', p.members, p.members, o.onProgress)
  const combined = await combineRun(p.spec, p.set, second ? p.roles : null, values, result.specSnapshot.clPercent, { pool, signal: cancel.signal, scale, apart: apartOf(p) })
  cancel.check()
  await setPhase(db, result.id, 'storing', p.members, p.members, o.onProgress)
  await storeRun(db, result, combined, cancel)
  prepared.delete(result.id)
  return { members: p.members, bins: p.plan.nBins }
}

/** Everything a finished run stores. */
export interface CombinedRun {
  members: number
  bins: number
  values: Float64Array
  scale: ScaleVariationJson | null
  bands: StoredBands[]
}

/** What combineRun needs of an apart run's second set (two-sets.ts): its header and the result's set's member count. */
export interface ApartInput {
  setMembers: number
  second: { header: SetHeader }
}

/** The apart input of a prepared run, or null when it is not an apart run. */
function apartOf(p: Prepared): ApartInput | null {
  return p.variation.variation === 'apart' && p.partner ? { setMembers: p.variation.setMembers, second: p.partner } : null
}

/**
 * The after-phase's computing: the bands of every prescription of the set's kind (on the pool's
 * threads in parallel, or inline) and the scale variation (awaited when it already runs on the
 * pool, else computed here). `roles` carries the second set when the study reads two. An apart
 * run (`o.apart`; values = the set's members then the second set's members 1…) stores for each
 * prescription the combination in quadrature with both parts (apartStoredBands).
 */
export async function combineRun(spec: StudySpec, set: ErrorSet, roles: { main: ErrorSet, second: ErrorSet | null } | null, values: Float64Array, clPercent: number,
  o: { pool: boolean, signal?: AbortSignal, scale?: Promise<ScaleVariationJson | null> | null, apart?: ApartInput | null }): Promise<CombinedRun> {
  // With K-factors every member's value is K-scaled first: the stored values, the bands and all
  // that is later computed from them (other prescriptions, matrices, comparisons) are K-scaled.
  const rows = o.apart ? o.apart.setMembers + o.apart.second.header.memberCount - 1 : set.members.length
  const matrix = withKFactors(spec, { members: rows, bins: spec.bins.length, values })
  const source = memberSourceOf(set.header)
  const main = roles?.main ?? set
  const second = roles?.second ?? null
  const bandsOf = prescriptionBands(matrix, source, clPercent, o)
  const pending = prescriptionsFor(set.header.kind).map(bandsOf)
  // A given or pooled scale variation runs beside the bands; inline it follows them.
  const scaleNow = o.scale ?? (o.pool ? scaleOnPool(spec, main, second, o.signal) : null)
  const bands = await Promise.all(pending)
  const scale = scaleNow ? await scaleNow : scaleVariationOf(spec, main, second)
  return { members: matrix.members, bins: matrix.bins, values: matrix.values, scale: scaleWithKFactors(spec, scale), bands }
}

/**
 * How combineRun makes one prescription's stored bands: on the pool's threads or inline, and for
 * an apart run from both parts of the matrix (the set's members, then the second set's 1…).
 */
function prescriptionBands(matrix: MemberValues, source: ReturnType<typeof memberSourceOf>, clPercent: number,
  o: { pool: boolean, signal?: AbortSignal, apart?: ApartInput | null }): (p: Prescription) => StoredBands | Promise<StoredBands> {
  if (o.apart) {
    const h = o.apart.second.header
    const parts = splitApart(matrix, o.apart.setMembers, h.memberCount)
    const secondSource = { ...memberSourceOf(h), name: h.name, version: h.version }
    if (!o.pool) return p => apartStoredBands(parts, { set: source, second: secondSource }, p, clPercent)
    const secondPart = { matrix: { ...parts.second, values: shared(parts.second.values) }, source: secondSource }
    const mainPart = { ...parts.main, values: shared(parts.main.values) }
    return p => bandsOnPool(mainPart, source, p, clPercent, o.signal, secondPart)
  }
  if (!o.pool) return p => storedBands(bandsFromValues(matrix, source, p, clPercent))
  const sharedMatrix = { ...matrix, values: shared(matrix.values) }
  return p => bandsOnPool(sharedMatrix, source, p, clPercent, o.signal)
}

/** The members K-scaled by the engine when the study has K-factors; else the same matrix. */
function withKFactors(spec: StudySpec, matrix: MemberValues): MemberValues {
  return spec.kFactors ? applyKFactors(matrix, spec.kFactors) : matrix
}

/** The scale variation of the K-scaled prediction (the same K at every scale). */
function scaleWithKFactors(spec: StudySpec, scale: ScaleVariationJson | null): ScaleVariationJson | null {
  if (!scale || !spec.kFactors) return scale
  const [nominal, up, down, ...values] = applyKFactorsToRows([scale.nominal, scale.up, scale.down, ...scale.values], spec.kFactors)
  return { ...scale, nominal: nominal!, up: up!, down: down!, values }
}

/** The storing phase: values, scale variation, bands, state and audit event in one transaction. */
export async function storeRun(db: DB, result: Result, c: CombinedRun, cancel?: CancelWatch) {
  await db.transaction(async (tx) => {
    const [current] = await tx.select({ cancel: t.results.cancelRequested }).from(t.results).where(eq(t.results.id, result.id)).for('update')
    if (!current || current.cancel) throw new JobCancelled()
    cancel?.check()
    const row = { resultId: result.id, memberCount: c.members, binCount: c.bins, values: float64ToBytes(c.values), scale: c.scale }
    await tx.insert(t.resultValues).values(row).onConflictDoUpdate({ target: t.resultValues.resultId, set: row })
    await tx.delete(t.resultBands).where(eq(t.resultBands.resultId, result.id))
    await tx.insert(t.resultBands).values(c.bands.map(b => ({ resultId: result.id, prescription: b.prescription, clPercent: result.specSnapshot.clPercent, bands: b })))
    await tx.update(t.results).set({
      state: 'done', membersDone: c.members, finishedAt: new Date(), error: null, engineVersion: ENGINE_VERSION
    }).where(eq(t.results.id, result.id))
    const [study] = await tx.select({ workspaceId: t.studies.workspaceId }).from(t.studies).where(eq(t.studies.id, result.studyId))
    await tx.insert(t.auditEvents).values({
      workspaceId: study?.workspaceId ?? null, actorId: result.requestedBy, action: 'result.ran', subjectType: 'result', subjectId: result.id,
      detail: { members: c.members, bins: c.bins, ms: Date.now() - (result.startedAt?.getTime() ?? Date.now()) }
    })
  })
}

/** One stretch of a run's rows: members of one set, with the other set's central member or its paired members. */
interface Segment {
  /** The evaluated set's members of this stretch (all of them, not yet sliced for the pool). */
  members: readonly Float64Array[]
  role: 'main' | 'second'
  fixed: Float64Array | null
  partner: readonly Float64Array[] | null
  alphas: MemberAlphas | null
  /** The first row of the run this stretch fills. */
  row: number
}

/**
 * The rows m0…m1 of a run as stretches (see two-sets.ts): rows < the set's member count are the
 * result's set's members (the partner at its central member, or — paired — its member of the same
 * index); an apart run's later rows are the partner's members 1… with the result's set at its
 * central member.
 */
function segmentsOf(p: Prepared, m0: number, m1: number): Segment[] {
  const { roles, partner, variation } = p
  const setRole = roles.varyingRole
  const partnerRole = setRole === 'main' ? 'second' : 'main'
  const n = variation.setMembers
  const out: Segment[] = []
  // Kernels with α_s (gg → H) run each member of a varying main set with its own α_s(M_Z).
  const alphasOf = (set: ErrorSet, role: 'main' | 'second', first: number): MemberAlphas | null => {
    const h = set.header
    return role === 'main' && p.plan.alphas
      ? { header: { alphasMz: h.alphasMz, alphasMzCentral: h.alphasMzCentral, scheme: h.scheme, memberCount: set.members.length }, first }
      : null
  }
  if (m0 < n) {
    const hi = Math.min(m1, n)
    const paired = variation.variation === 'paired' && partner ? partner.members.slice(m0, hi) : null
    out.push({
      members: p.set.members.slice(m0, hi), role: setRole, fixed: partner && !paired ? partner.members[0]! : null,
      partner: paired, alphas: alphasOf(p.set, setRole, m0), row: m0
    })
  }
  if (variation.variation === 'apart' && partner && m1 > n) {
    const lo = Math.max(m0, n)
    // Row r (≥ n) is the partner's member r − n + 1.
    out.push({
      members: partner.members.slice(lo - n + 1, m1 - n + 1), role: partnerRole, fixed: p.set.members[0]!,
      partner: null, alphas: alphasOf(partner, partnerRole, lo - n + 1), row: lo
    })
  }
  return out
}

/**
 * members m0…m1 × bins values of the run's rows, member-major, with progress and cancel checks
 * (segmentsOf says which set varies in which rows). `progress(n)` records n more members.
 */
async function evaluateRange(p: Prepared, m0: number, m1: number, pool: boolean, cancel: CancelWatch, progress: (n: number, done: number) => Promise<void>) {
  const out = new Float64Array((m1 - m0) * p.plan.nBins)
  let done = 0
  for (const segment of segmentsOf(p, m0, m1)) {
    const values = await evaluateSegment(p, segment, pool, cancel, async (n) => {
      done += n
      await progress(n, done)
    })
    out.set(values, (segment.row - m0) * p.plan.nBins)
  }
  return out
}

/** One stretch of rows on the pool or inline (see evaluateRange). */
async function evaluateSegment(p: Prepared, input: Segment, pool: boolean, cancel: CancelWatch, progress: (n: number) => Promise<void>) {
  const count = input.members.length
  if (pool) {
    const members = sharedMembers(input.members)
    const step = Math.max(1, Math.ceil(count / (poolThreads() * 4)))
    let reported = 0
    try {
      return await evaluateOnPool({
        plan: p.plan, members, fixed: input.fixed ? shared(input.fixed) : null, partner: input.partner ? sharedMembers(input.partner) : null,
        varying: input.role, alphas: input.alphas, step, signal: cancel.signal,
        onTaskDone: async (done) => {
          const n = done - reported
          reported = done
          await progress(n)
        }
      })
    } catch (err) {
      if (cancel.signal.aborted) throw new JobCancelled()
      throw err
    }
  }
  const values = new Float64Array(count * p.plan.nBins)
  const step = chunkSize(count)
  for (let k = 0; k < count; k += step) {
    const k1 = Math.min(count, k + step)
    runMembers({
      plan: p.plan, members: input.members.slice(k, k1), fixed: input.fixed, partner: input.partner ? input.partner.slice(k, k1) : null,
      varying: input.role, out: values, m0: k, alphas: input.alphas ? { ...input.alphas, first: input.alphas.first + k } : null
    })
    await progress(k1 - k)
    cancel.check()
  }
  return values
}

async function evaluateMembers(db: DB, result: Result, p: Prepared, pool: boolean, onProgress: RunOptions['onProgress'], cancel: CancelWatch) {
  const total = p.members
  return evaluateRange(p, 0, total, pool, cancel, async (_n, done) => {
    const [row] = await db.update(t.results).set({ membersDone: done }).where(eq(t.results.id, result.id))
      .returning({ cancel: t.results.cancelRequested })
    const progress: JobProgress = { done, total, phase: 'evaluating members' }
    await onProgress?.(progress)
    if (!row || row.cancel) throw new JobCancelled()
  })
}

/**
 * One chunk of a run spread over workers (members m0…m1 of the varying set), for the parent step
 * that combines the chunks (runStudy with `memberValues`). The first chunk to start marks the row
 * running; each adds its members to the progress. Null when the row has ended or is cancelled
 * (nothing to compute). Idempotent: running a chunk twice gives the same values.
 */
export async function evaluateRunChunk(db: DB, resultId: string, m0: number, m1: number, o: { pool?: StudyRunOptions['pool'] } = {}): Promise<Float64Array | null> {
  const [result] = await db.update(t.results)
    .set({ state: 'running', phase: 'evaluating members', startedAt: sql`coalesce(${t.results.startedAt}, now())` })
    .where(and(eq(t.results.id, resultId), inArray(t.results.state, ['queued', 'running']), eq(t.results.cancelRequested, false)))
    .returning()
  if (!result) return null
  const p = await prepare(db, result, o.pool)
  if (m0 < 0 || m1 > p.members || m0 >= m1) throw new RangeError(`Members ${m0}…${m1} are not within the set's ${p.members} members`)
  const watch = watchCancel(db, t.results, resultId)
  try {
    return await evaluateRange(p, m0, m1, usePool(o.pool, m1 - m0, p.plan), watch, async (n) => {
      const [row] = await db.update(t.results).set({ membersDone: sql`least(${t.results.membersTotal}, ${t.results.membersDone} + ${n})` })
        .where(eq(t.results.id, resultId)).returning({ cancel: t.results.cancelRequested })
      if (!row || row.cancel) throw new JobCancelled()
    })
  } catch (err) {
    if (isCancel(err, watch)) return null
    throw err
  } finally {
    watch.stop()
  }
}
