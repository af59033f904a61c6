import { eq } from 'drizzle-orm'
import type { DB } from '../../database/client'
import { tables as t } from '../../database/client'
import type { SetBuild } from '../../database/schema'
import { audit } from '../audit'
import { fail } from '../errors'
import { cancelRow, enqueueRow, type QueueSource } from '../jobs/queue'
import { InputError } from '../../../shared/physics/input/errors'
import { compileInput } from '../../../shared/physics/input/model'
import { parseInputDocument } from '../../../shared/physics/input/parse'
import { BUILD_SET_QUEUE, type BuildSetPayload, type SetBuildRequest } from '../../../shared/queue/workflow'

/** What the API shows of a set build. */
export const publicSetBuild = (b: SetBuild) => ({
  id: b.id, name: b.name, state: b.state, progress: { done: b.progressDone, total: b.progressTotal },
  error: b.error, setId: b.setId, requestedBy: b.requestedBy, createdAt: b.createdAt,
  startedAt: b.startedAt, finishedAt: b.finishedAt, cancelRequested: b.cancelRequested
})

/**
 * Checks a build request with the engine's input parser (every problem with its JSON path, 400
 * data.issues), the members and grid overrides applied first; returns the set name to use.
 */
export function checkBuildRequest(body: { name?: string, input: unknown, baseline?: unknown, members?: unknown, grid?: unknown }) {
  const input = withOverrides(body.input, body.members, body.grid)
  let doc
  try {
    doc = parseInputDocument(input, 'input')
    let baseline
    if (doc.kind === 'nuclear') {
      if (body.baseline === undefined) {
        throw new InputError('input', [{ path: 'baseline', message: 'a nuclear modification needs its baseline parametrised input in "baseline"' }])
      }
      baseline = parseInputDocument(body.baseline, 'baseline')
      if (baseline.kind !== 'parametrised') throw new InputError('baseline', [{ path: 'format', message: 'the baseline must be a sheaf.parametrised-input document' }])
    }
    // Compiling binds every parameter reference: a problem shows now, not in the worker.
    compileInput(doc, baseline)
  } catch (err) {
    if (err instanceof InputError) {
      fail(400, `The ${err.source} document has ${err.issues.length} problem${err.issues.length > 1 ? 's' : ''}: ${err.issues[0]!.path ? `${err.issues[0]!.path}: ` : ''}${err.issues[0]!.message}`, { issues: err.issues.map(i => ({ message: i.message, path: i.path, document: err.source })) })
    }
    if (err instanceof RangeError) fail(400, err.message, { issues: [{ message: err.message }] })
    throw err
  }
  const members = (doc.doc as { members?: unknown }).members
  if (members === undefined) {
    fail(400, 'Say how to publish the spread: Hessian (tolerance) or replicas (count and seed)', { issues: [{ message: 'no members given in the request or the document', path: 'members' }] })
  }
  return { name: body.name ?? doc.doc.name, request: { input, baseline: body.baseline, members: body.members, grid: body.grid } satisfies SetBuildRequest }
}

/** The document with the request's `members` and `grid` in place of its own. */
export function withOverrides(input: unknown, members: unknown, grid: unknown) {
  if (input === null || typeof input !== 'object' || Array.isArray(input)) return input
  return { ...input, ...(members !== undefined ? { members } : {}), ...(grid !== undefined ? { grid } : {}) }
}

/**
 * Inserts the build row with its audit event in one transaction, then (committed) queues the
 * build-set job (id = row id). A failure before the commit leaves no row and no job; a queue
 * failure after it marks the row failed and answers 503 (enqueueRow).
 */
export async function startSetBuild(db: DB, queues: QueueSource, workspaceId: string, userId: string, name: string, request: SetBuildRequest) {
  const row = await db.transaction(async (tx) => {
    const [inserted] = await tx.insert(t.setBuilds).values({ workspaceId, name, request, requestedBy: userId }).returning()
    await audit(tx, { workspaceId, actorId: userId, action: 'set.build-queued', subjectType: 'set_build', subjectId: inserted!.id, detail: { name } })
    return inserted!
  })
  const payload: BuildSetPayload = { buildId: row.id }
  await enqueueRow(db, queues, t.setBuilds, BUILD_SET_QUEUE, row.id, payload)
  const [queued] = await db.select().from(t.setBuilds).where(eq(t.setBuilds.id, row.id))
  return queued!
}

/** Cancels a queued or running build (cancelRow, with its audit event); the row as it is now. */
export async function cancelSetBuild(db: DB, queues: QueueSource, b: SetBuild, actorId: string) {
  await cancelRow(db, queues, t.setBuilds, BUILD_SET_QUEUE, b, 'build', {
    workspaceId: b.workspaceId, actorId, action: 'set.build-cancel-requested', subjectType: 'set_build', subjectId: b.id, detail: { state: b.state }
  })
  const [row] = await db.select().from(t.setBuilds).where(eq(t.setBuilds.id, b.id))
  return row!
}
