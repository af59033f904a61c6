// The run-study job end to end on the real PostgreSQL and Redis: a BullMQ worker of this test
// process runs the worker's runStudyJob on its own queue; the stored member values and bands are compared
// with the engine called directly (evaluateDirect, an evaluation path independent of the plan).
import { randomUUID } from 'node:crypto'
import { Queue, QueueEvents, Worker } from 'bullmq'
import IORedis from 'ioredis'
import { count, eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { testDB, tables as t } from '../../support/db'
import { testEnv } from '../../support/env'
import { waitForMail } from '../../support/outbox'
import { createUser } from '../../support/users'
import { bytesToFloat64 } from '../../../server/domain/results/float64'
import { insertErrorSet } from '../../../server/domain/sets/store'
import { readSettings } from '../../../server/domain/settings'
import { runStudy } from '../../../server/domain/studies/run'
import { runStudyJob } from '../../../workers/handlers'
import { evaluateDirect } from '../../../shared/physics/study/direct'
import { parseStudySpec } from '../../../shared/physics/study/spec'
import { writeSetFile } from '../../../shared/physics/sets/write'
import { computeBands, prescriptionsFor } from '../../../shared/physics/uncertainty/bands'
import type { ErrorSet } from '../../../shared/physics/types'
import { f2Spec, toySetBytes } from '../workflow/helpers'

const db = testDB()
let connection: IORedis
let queue: Queue
let events: QueueEvents
let worker: Worker
const queueName = `run-study-test-${randomUUID().slice(0, 8)}`
let user: Awaited<ReturnType<typeof createUser>>
let workspaceId: string

/** Relative agreement of two numbers, scaled by the larger magnitude. */
const close = (a: number, b: number, rel: number) => Math.abs(a - b) <= rel * Math.max(Math.abs(a), Math.abs(b), 1e-300)

async function storedSet(kind: 'hessian-pairs' | 'replicas', errorMembers: number) {
  const { set, bytes } = toySetBytes({ kind, errorMembers, name: `worker-${kind}-${randomUUID().slice(0, 6)}` })
  const setId = await insertErrorSet(db, { workspaceId, name: set.header.name, fileName: 'toy.sheafset', bytes, origin: 'upload', addedBy: user.id })
  return { set, setId }
}

async function newResult(setId: string, set: ErrorSet, specInput: unknown, clPercent = 68, secondSetId: string | null = null) {
  const spec = parseStudySpec(specInput)
  const [study] = await db.insert(t.studies).values({ workspaceId, name: 'worker test', spec, setIds: [setId], secondSetId, clPercent, createdBy: user.id }).returning()
  const [result] = await db.insert(t.results).values({
    studyId: study!.id, setId, secondSetId, version: 1, studyRevision: 1,
    specSnapshot: { studyName: 'worker test', spec, prescription: 'auto', clPercent, set: { id: setId, name: set.header.name, version: set.header.version, family: set.header.family, kind: set.header.kind, memberCount: set.members.length, confidenceLevelPercent: set.header.confidenceLevelPercent }, second: null },
    membersTotal: set.members.length, binCount: spec.bins.length, requestedBy: user.id
  }).returning()
  return { spec, result: result! }
}

/** Enqueues the result on the test queue and waits until the worker has finished with it. */
async function runOnQueue(resultId: string) {
  const job = await queue.add('run', { resultId }, { jobId: resultId, attempts: 2 })
  return job.waitUntilFinished(events, 30_000).catch(e => e as Error)
}

const resultRow = async (id: string) => (await db.select().from(t.results).where(eq(t.results.id, id)))[0]!

beforeAll(async () => {
  process.env.SHEAF_MAIL_AFTER_MS = '0'
  connection = new IORedis(testEnv().redisUrl, { maxRetriesPerRequest: null })
  queue = new Queue(queueName, { connection })
  events = new QueueEvents(queueName, { connection: connection.duplicate() })
  await events.waitUntilReady()
  worker = new Worker(queueName, job => runStudyJob(db, readSettings(), job), { connection: connection.duplicate(), concurrency: 1 })
  user = await createUser({ tag: 'worker', signIn: false })
  const [ws] = await db.insert(t.workspaces).values({ name: 'worker tests', createdBy: user.id }).returning()
  workspaceId = ws!.id
  await db.insert(t.memberships).values({ workspaceId, userId: user.id, role: 'owner' })
})

afterAll(async () => {
  await worker?.close()
  await events?.close()
  await queue?.obliterate({ force: true }).catch(() => {})
  await queue?.close()
  await connection?.quit()
})

describe('run-study job on PostgreSQL and Redis', () => {
  it('stores every member and the bands the engine gives when called directly', async () => {
    const { set, setId } = await storedSet('hessian-pairs', 6)
    const { spec, result } = await newResult(setId, set, f2Spec(6), 90)
    const outcome = await runOnQueue(result.id)
    expect(outcome).toMatchObject({ state: 'done', members: 13, bins: 6 })

    const row = await resultRow(result.id)
    expect(row).toMatchObject({ state: 'done', membersDone: 13, membersTotal: 13, error: null })
    const [values] = await db.select().from(t.resultValues).where(eq(t.resultValues.resultId, result.id))
    const stored = bytesToFloat64(values!.values)
    const direct = evaluateDirect(spec, set)
    expect(stored.length).toBe(direct.length)
    for (let i = 0; i < direct.length; i++) expect(close(stored[i]!, direct[i]!, 1e-10), `value ${i}: ${stored[i]} vs ${direct[i]}`).toBe(true)

    const bands = await db.select().from(t.resultBands).where(eq(t.resultBands.resultId, result.id))
    expect(bands.map(b => b.prescription).sort()).toEqual([...prescriptionsFor('hessian-pairs')].sort())
    for (const b of bands) {
      expect(b.clPercent).toBe(90)
      const expected = computeBands({ members: 13, bins: 6, values: direct }, { kind: 'hessian-pairs', prescription: b.prescription as 'hessian-symmetric', clFrom: set.header.confidenceLevelPercent, clTo: 90 })
      const got = b.bands
      for (let i = 0; i < 6; i++) {
        expect(close(got.central[i]!, expected.central[i]!, 1e-10)).toBe(true)
        expect(close(got.plus[i]!, expected.plus[i]!, 1e-8)).toBe(true)
        expect(close(got.minus[i]!, expected.minus[i]!, 1e-8)).toBe(true)
      }
    }
    // The scale variation is the central member at μ_F × ½, 1, 2, kept apart from the members.
    const scale = values!.scale!
    expect(scale.kappas).toEqual([0.5, 1, 2])
    const half = evaluateDirect({ ...spec, scaleFactor: 0.5 }, { ...set, members: [set.members[0]!] })
    for (let i = 0; i < 6; i++) {
      expect(close(scale.values[0]![i]!, half[i]!, 1e-10)).toBe(true)
      expect(close(scale.nominal[i]!, direct[i]!, 1e-10)).toBe(true)
    }
  })

  it('varies the nuclear set of a nuclear ratio with the proton set held at its central member', async () => {
    const proton = await storedSet('hessian-pairs', 2)
    const { set: nuclear } = toySetBytes({ kind: 'hessian-pairs', errorMembers: 3, name: `worker-lead-${randomUUID().slice(0, 6)}` })
    nuclear.header = { ...nuclear.header, target: { type: 'nucleus', z: 82, a: 208 } }
    const nuclearId = await insertErrorSet(db, { workspaceId, name: nuclear.header.name, fileName: 'lead.sheafset', bytes: writeSetFile(nuclear), origin: 'upload', addedBy: user.id })
    const specInput = { kernel: 'nuclear-ratio', options: { base: 'dis-nc-f2', nucleus: { z: 82, a: 208 } }, bins: [{ x: 0.01, q2: 10 }, { x: 0.1, q2: 50 }] }
    const { spec, result } = await newResult(nuclearId, nuclear, specInput, 68, proton.setId)
    expect(await runOnQueue(result.id)).toMatchObject({ state: 'done', members: 7, bins: 2 })
    const stored = bytesToFloat64((await db.select().from(t.resultValues).where(eq(t.resultValues.resultId, result.id)))[0]!.values)
    const direct = evaluateDirect(spec, { ...proton.set, members: [proton.set.members[0]!] }, { second: nuclear })
    expect(stored.length).toBe(7 * 2)
    for (let i = 0; i < stored.length; i++) expect(close(stored[i]!, direct[i]!, 1e-10), `value ${i}`).toBe(true)
  })

  it('leaves exactly one result when the job runs again (retry or re-run of a stalled job)', async () => {
    const { set, setId } = await storedSet('replicas', 20)
    const { result } = await newResult(setId, set, f2Spec(4))
    await runOnQueue(result.id)
    const first = bytesToFloat64((await db.select().from(t.resultValues).where(eq(t.resultValues.resultId, result.id)))[0]!.values)
    // A finished result is left alone by a retry …
    const again = await runStudy(db, result.id)
    expect(again).toMatchObject({ skipped: true, state: 'done' })
    // … and a result whose worker died mid-run (state still running) is recomputed in place.
    await db.update(t.results).set({ state: 'running' }).where(eq(t.results.id, result.id))
    expect(await runStudy(db, result.id)).toMatchObject({ state: 'done', members: 21 })
    const results = (await db.select({ n: count() }).from(t.results).where(eq(t.results.studyId, result.studyId)))[0]!.n
    const valueRows = (await db.select({ n: count() }).from(t.resultValues).where(eq(t.resultValues.resultId, result.id)))[0]!.n
    const bandRows = await db.select().from(t.resultBands).where(eq(t.resultBands.resultId, result.id))
    expect([results, valueRows, bandRows.length]).toEqual([1, 1, prescriptionsFor('replicas').length])
    const second = bytesToFloat64((await db.select().from(t.resultValues).where(eq(t.resultValues.resultId, result.id)))[0]!.values)
    expect(Array.from(second)).toEqual(Array.from(first))
  })

  it('names each phase in the progress and the row, in order', async () => {
    const { set, setId } = await storedSet('replicas', 30)
    const { result } = await newResult(setId, set, f2Spec(3))
    const phases: string[] = []
    const rowPhases: string[] = []
    const outcome = await runStudy(db, result.id, {
      onProgress: async (p) => {
        phases.push(p.phase ?? '')
        rowPhases.push((await resultRow(result.id)).phase)
      }
    })
    expect(outcome).toMatchObject({ state: 'done' })
    const order = [...new Set(phases)]
    expect(order).toEqual(['evaluating members', 'combining', 'storing'])
    expect(rowPhases).toEqual(phases)
  })

  it('reports progress per chunk and stops at the cancel flag without storing values', async () => {
    const { set, setId } = await storedSet('replicas', 60)
    const { result } = await newResult(setId, set, f2Spec(3))
    const seen: Array<{ done: number, total: number }> = []
    const outcome = await runStudy(db, result.id, {
      onProgress: async (p) => {
        seen.push(p)
        if (seen.length === 1) await db.update(t.results).set({ cancelRequested: true }).where(eq(t.results.id, result.id))
      }
    })
    expect(outcome).toMatchObject({ state: 'cancelled' })
    // The flag set after the first chunk is read at the end of the second chunk at the latest.
    expect(seen.length).toBeGreaterThanOrEqual(1)
    expect(seen.length).toBeLessThanOrEqual(2)
    expect(seen[0]!.total).toBe(61)
    expect(seen[0]!.done).toBeLessThan(61)
    const row = await resultRow(result.id)
    expect(row.state).toBe('cancelled')
    expect(await db.select().from(t.resultValues).where(eq(t.resultValues.resultId, result.id))).toHaveLength(0)
  })

  it('fails at once with the reason when a bin is out of the set\'s reach, and mails the requester', async () => {
    const { set, setId } = await storedSet('hessian-pairs', 2)
    // Q² = 1e6 GeV² lies above the TOY grid (which ends at 1e5 GeV²).
    const { result } = await newResult(setId, set, { kernel: 'dis-nc-f2', bins: [{ x: 0.01, q2: 1e6 }] })
    const since = new Date()
    const outcome = await runOnQueue(result.id)
    expect(outcome).toBeInstanceOf(Error)
    const row = await resultRow(result.id)
    expect(row.state).toBe('failed')
    expect(row.error).toMatch(/Q²|μ_F²/)
    expect(row.error).toMatch(/bin 1/)
    const mail = await waitForMail(user.email, /failed/, since)
    expect(mail.textBody).toContain(row.error!.slice(0, 40))
    expect(mail.textBody).toContain(`/studies/${result.studyId}?result=${result.id}`)
  })
})
