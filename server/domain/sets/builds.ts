import { and, eq, inArray, sql } from 'drizzle-orm'
import type { DB } from '../../database/client'
import { tables as t } from '../../database/client'
import type { SetBuild } from '../../database/schema'
import { audit } from '../audit'
import { fail } from '../errors'
import { cancelRow, enqueueRow, type QueueSource } from '../jobs/queue'
import { formatBytes, formatCount, LIMITS, type Limits } from '../limits'
import { InputError, onlyPhysics, type InputIssue } from '../../../shared/physics/input/errors'
import { buildSize, memberIssues, type BuildSize } from '../../../shared/physics/input/feasibility'
import { compileInput, type InputModel } from '../../../shared/physics/input/model'
import { parseInputDocument } from '../../../shared/physics/input/parse'
import { BUILD_SET_QUEUE, type BuildSetPayload, type SetBuildRequest } from '../../../shared/queue/workflow'
import { resolveNuclei, type NucleusEntry } from './build-nuclei'
import { assertSetNameFree } from './library'
import { assertQuota } from './store'

/**
 * What the API shows of a set build. `queuePlace` (1 = next to start) while it waits on the
 * queue, else null; pass rows through `withQueuePlaces` to fill it.
 */
export const publicSetBuild = (b: SetBuild & { queuePlace?: number | null }) => ({
  id: b.id, name: b.name, state: b.state, phase: b.phase, progress: { done: b.progressDone, total: b.progressTotal },
  error: b.error, setId: b.setId, setIds: b.setIds?.length ? b.setIds : (b.setId ? [b.setId] : []),
  nuclei: b.request.nuclei ?? null, requestedBy: b.requestedBy, createdAt: b.createdAt,
  startedAt: b.startedAt, finishedAt: b.finishedAt, cancelRequested: b.cancelRequested,
  queuePlace: b.state === 'queued' ? (b.queuePlace ?? null) : null
})

/** 400 (malformed) or 422 (well-formed, but the engine cannot build it) for a refused document. */
function inputRejection(err: InputError): never {
  const n = err.issues.length
  const first = err.issues[0]!
  fail(onlyPhysics(err.issues) ? 422 : 400, `The ${err.source} document has ${n} problem${n > 1 ? 's' : ''}: ${first.path ? `${first.path}: ` : ''}${first.message}`, {
    issues: err.issues.map(i => ({ message: i.message, path: i.path, document: err.source, ...(i.kind ? { kind: i.kind } : {}) }))
  })
}

/**
 * The engine's model of a request (overrides applied), or 400/422 naming each JSON path; for a
 * family build, of the nucleus `nucleus` (its problems named with the entry's place).
 */
function modelOf(request: SetBuildRequest, nucleus?: { z: number, a: number, at: string }): InputModel {
  try {
    const doc = parseInputDocument(request.input, 'input')
    let baseline
    if (doc.kind === 'nuclear') {
      if (request.baseline === undefined) {
        throw new InputError('input', [{ path: 'baseline', message: 'a nuclear modification needs its baseline parametrised input in "baseline"' }])
      }
      baseline = parseInputDocument(request.baseline, 'baseline')
      if (baseline.kind !== 'parametrised') throw new InputError('baseline', [{ path: 'format', message: 'the baseline must be a sheaf.parametrised-input document' }])
    } else if (request.baseline !== undefined) {
      throw new InputError('request', [{ path: 'baseline', message: 'a baseline belongs only to a nuclear modification (sheaf.nuclear-modification); this input is a parametrised input' }])
    } else if (request.nuclei !== undefined || nucleus) {
      throw new InputError('request', [{ path: 'nuclei', message: 'nuclei belong only to a nuclear modification (sheaf.nuclear-modification); this input is a parametrised input' }])
    }
    // Compiling binds every parameter reference and checks every term at the central values.
    return compileInput(doc, baseline, nucleus ? `input for ${nucleus.at} (Z = ${nucleus.z}, A = ${nucleus.a})` : 'input', nucleus ? { nucleus } : {})
  } catch (err) {
    if (err instanceof InputError) inputRejection(err)
    if (err instanceof RangeError) fail(400, err.message, { issues: [{ message: err.message }] })
    throw err
  }
}

/** The models a request builds: one, or one per nucleus of a family build. */
function modelsOf(request: SetBuildRequest): InputModel[] {
  return request.nuclei ? request.nuclei.map((n, i) => modelOf(request, { z: n.z, a: n.a, at: `nuclei[${i}]` })) : [modelOf(request)]
}

/** The size of the set a checked request will write (for the budget and the quota); a family build's sets added up. */
export function requestedBuildSize(request: SetBuildRequest): BuildSize {
  return totalSize(modelsOf(request))
}

function totalSize(models: InputModel[]): BuildSize {
  const sizes = models.map(m => buildSize(m))
  return { ...sizes[0]!, members: sizes.reduce((n, z) => n + z.members, 0), values: sizes.reduce((n, z) => n + z.values, 0) }
}

/** About the bytes of a set file of `size` (8 per value; the header adds a few KiB). */
const fileBytes = (size: BuildSize) => 8 * size.values

/**
 * Checks a build request before anything is stored or queued, the members and grid overrides
 * applied first: the engine's input checks (400 for a malformed document, 422 for one the
 * evolution would refuse: divergent terms, grid, start scale, tolerance, covariance; each issue
 * with its JSON path in data.issues), the members block (400), the build budget (413: members ×
 * nodes × 13 flavours at most `limits.buildMaxValues`), then every member's parameters (422:
 * integrable terms, solvable sum rules, finite x·f at μ₀²). With `nuclei` (a nuclear
 * modification only, else 400 at `nuclei`) every check runs for every nucleus, the budget counts
 * all their sets, and each problem names its entry (`nuclei[i]`). Returns the set name to use.
 */
export function checkBuildRequest(body: { name?: string, input: unknown, baseline?: unknown, members?: unknown, grid?: unknown, nuclei?: NucleusEntry[] }, limits: Limits = LIMITS) {
  const request: SetBuildRequest = { input: withOverrides(body.input, body.members, body.grid), baseline: body.baseline, members: body.members, grid: body.grid }
  const model = modelOf(request)
  if (body.nuclei !== undefined) {
    if (model.baseline === undefined) {
      fail(400, 'nuclei: only a nuclear modification (sheaf.nuclear-modification) is built for a list of nuclei', { issues: [{ path: 'nuclei', message: 'this input is a parametrised input' }] })
    }
    request.nuclei = resolveNuclei(body.nuclei, body.name ?? model.name)
  }
  if (model.members === undefined) {
    fail(400, 'Say how to publish the spread: Hessian (tolerance) or replicas (count and seed)', { issues: [{ message: 'no members given in the request or the document', path: 'members' }] })
  }
  const models = modelsOf(request)
  const size = totalSize(models)
  if (size.values > limits.buildMaxValues) {
    const what = `${formatCount(size.members)} members × ${size.xNodes} x nodes × ${size.q2Nodes} Q² nodes × ${size.flavours} flavours = ${formatCount(size.values)} values (${formatBytes(fileBytes(size))})`
    fail(413, `This build is too large: ${what}; a build may hold at most ${formatCount(limits.buildMaxValues)} values (${formatBytes(8 * limits.buildMaxValues)}). Use fewer ${model.members.type === 'replicas' ? 'replicas' : 'parameters'} or a coarser grid`, {
      issues: [{ message: `at most ${formatCount(limits.buildMaxValues)} values; this build needs ${formatCount(size.values)}`, path: model.members.type === 'replicas' ? 'members.count' : 'grid' }],
      size, maxValues: limits.buildMaxValues
    })
  }
  models.forEach((m, i) => {
    const issues: InputIssue[] = memberIssues(m)
    const at = request.nuclei ? `input for nuclei[${i}] (Z = ${request.nuclei[i]!.z}, A = ${request.nuclei[i]!.a})` : 'input'
    if (issues.length > 0) inputRejection(new InputError(at, issues))
  })
  return { name: body.name ?? model.name, request }
}

/** The document with the request's `members` and `grid` in place of its own. */
export function withOverrides(input: unknown, members: unknown, grid: unknown) {
  if (input === null || typeof input !== 'object' || Array.isArray(input)) return input
  return { ...input, ...(members !== undefined ? { members } : {}), ...(grid !== undefined ? { grid } : {}) }
}

/**
 * The queue priority of build `buildId` (BullMQ: lower runs first): 1 + the builds of the same
 * workspace that were queued or running when it was requested (created before it and not
 * finished then). A workspace's second waiting build thus queues behind every other workspace's
 * first; within one priority, first come first served. Computed from the rows alone, so
 * `withQueuePlaces` derives the same order later.
 */
export async function buildPriority(db: DB, buildId: string): Promise<number> {
  const { rows } = await db.execute<{ priority: number }>(sql`
    select 1 + count(x.id)::int as priority
    from ${t.setBuilds} b join ${t.setBuilds} x
      on x.workspace_id = b.workspace_id and x.id <> b.id and x.created_at <= b.created_at
     and (x.finished_at is null or x.finished_at > b.created_at)
    where b.id = ${buildId}`)
  return Number(rows[0]?.priority ?? 1)
}

/** BullMQ's largest job priority. */
const MAX_PRIORITY = 2_097_152

/**
 * Each waiting build's place on the build queue (1 = next to start), across all workspaces:
 * ordered by buildPriority, then by request time, as BullMQ takes them.
 */
export async function queuePlaces(db: DB): Promise<Map<string, number>> {
  const { rows } = await db.execute<{ id: string, place: number }>(sql`
    with waiting as (
      select b.id, b.created_at, 1 + (
        select count(*) from ${t.setBuilds} x
        where x.workspace_id = b.workspace_id and x.id <> b.id and x.created_at <= b.created_at
          and (x.finished_at is null or x.finished_at > b.created_at)
      ) as priority
      from ${t.setBuilds} b
      where b.state = 'queued' and b.job_id is not null
    )
    select id, (row_number() over (order by least(priority, ${MAX_PRIORITY}), created_at, id))::int as place from waiting`)
  return new Map(rows.map(r => [r.id, Number(r.place)]))
}

/** The rows with their queue places (see publicSetBuild). */
export async function withQueuePlaces<T extends SetBuild>(db: DB, builds: T[]): Promise<Array<T & { queuePlace: number | null }>> {
  const places = builds.some(b => b.state === 'queued') ? await queuePlaces(db) : new Map<string, number>()
  return builds.map(b => ({ ...b, queuePlace: places.get(b.id) ?? null }))
}

/**
 * Inserts the build row with its audit event in one transaction, then (committed) queues the
 * build-set job (id = row id) at its fair priority (buildPriority). 413 when the set it will write
 * does not fit the workspace's storage quota. A failure before the commit leaves no row and no
 * job; a queue failure after it marks the row failed and answers 503 (enqueueRow). The row comes
 * back with its queue place.
 */
export async function startSetBuild(db: DB, queues: QueueSource, workspaceId: string, userId: string, name: string, request: SetBuildRequest, limits: Limits = LIMITS) {
  const model = modelOf(request)
  for (const setName of request.nuclei?.map(n => n.name) ?? [name]) await assertBuildNameFree(db, workspaceId, setName, model.version)
  const bytes = fileBytes(requestedBuildSize(request))
  await assertQuota(db, workspaceId, bytes, `the set this build writes (about ${formatBytes(bytes)})`, limits.workspaceQuotaBytes)
  const row = await db.transaction(async (tx) => {
    const [inserted] = await tx.insert(t.setBuilds).values({ workspaceId, name, request, requestedBy: userId }).returning()
    await audit(tx, { workspaceId, actorId: userId, action: 'set.build-queued', subjectType: 'set_build', subjectId: inserted!.id, detail: { name } })
    return inserted!
  })
  const payload: BuildSetPayload = { buildId: row.id }
  const priority = Math.min(MAX_PRIORITY, await buildPriority(db, row.id))
  await enqueueRow(db, queues, t.setBuilds, BUILD_SET_QUEUE, row.id, payload, { priority })
  const [queued] = await db.select().from(t.setBuilds).where(eq(t.setBuilds.id, row.id))
  const [withPlace] = await withQueuePlaces(db, [queued!])
  return withPlace!
}

/**
 * 409 before anything is queued when the set a build would write, `name` version `version`, is
 * already in the workspace's library or is being written by one of its queued or running builds
 * (a name taken only at the end would fail the build after all its work).
 */
async function assertBuildNameFree(db: DB, workspaceId: string, name: string, version: string) {
  await assertSetNameFree(db, workspaceId, name, version)
  const pending = await db.select({ id: t.setBuilds.id, name: t.setBuilds.name, request: t.setBuilds.request }).from(t.setBuilds)
    .where(and(eq(t.setBuilds.workspaceId, workspaceId), inArray(t.setBuilds.state, ['queued', 'running'])))
  // The sets a pending build writes: its name, or one per nucleus of a family build.
  const writes = (b: typeof pending[number]) => b.request.nuclei?.map(n => n.name) ?? [b.name]
  const clash = pending.find((b) => {
    if (!writes(b).includes(name)) return false
    try { return modelOf(b.request).version === version } catch { return false }
  })
  if (clash) {
    fail(409, `A build of ${name} version ${version} is already queued or running in this workspace (build ${clash.id}); wait for it or choose another name`, {
      fields: { name: `${name} version ${version} is already being built` }
    })
  }
}

/** Cancels a queued or running build (cancelRow, with its audit event); the row as it is now. */
export async function cancelSetBuild(db: DB, queues: QueueSource, b: SetBuild, actorId: string) {
  await cancelRow(db, queues, t.setBuilds, BUILD_SET_QUEUE, b, 'build', {
    workspaceId: b.workspaceId, actorId, action: 'set.build-cancel-requested', subjectType: 'set_build', subjectId: b.id, detail: { state: b.state }
  })
  const [row] = await db.select().from(t.setBuilds).where(eq(t.setBuilds.id, b.id))
  return row!
}
