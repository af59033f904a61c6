// The resource budgets (server/domain/limits.ts, README "Limits"): studies over the bins or
// quadrature-points cap, runs over members × bins and builds over members × grid are refused
// with 413 and the cap in the message, storing nothing; a workspace's set files stay within its
// quota; the build queue is fair between workspaces; densities requests are de-duplicated and
// capped.
import { readFileSync } from 'node:fs'
import { Queue } from 'bullmq'
import { eq, inArray } from 'drizzle-orm'
import IORedis from 'ioredis'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DomainError } from '../../server/domain/errors'
import { DEFAULT_LIMITS, formatBytes, LIMITS } from '../../server/domain/limits'
import { buildPriority, checkBuildRequest, publicSetBuild, startSetBuild, withQueuePlaces } from '../../server/domain/sets/builds'
import { insertErrorSet, storedSetBytes } from '../../server/domain/sets/store'
import { tables as t, testDB } from '../support/db'
import { testEnv } from '../support/env'
import { createWorkspace, type TestWorkspace } from '../support/users'
import { toySetBytes, uploadSet } from './workflow/helpers'

const minimal = JSON.parse(readFileSync(new URL('../../samples/fits/minimal-input.json', import.meta.url), 'utf8'))
const smallGrid = { x: { count: 20, min: 1e-5, max: 0.98 }, q2: { count: 6, maxGeV2: 1e4 } }

let ws: TestWorkspace
beforeAll(async () => {
  ws = await createWorkspace('Limits')
})

const api = () => `/api/workspaces/${ws.id}`
const count = async (table: typeof t.studies | typeof t.setBuilds | typeof t.errorSets) =>
  (await testDB().select({ id: table.id }).from(table).where(eq(table.workspaceId, ws.id))).length

describe('the numbers', () => {
  it('runs with the documented defaults', () => {
    // scripts/test.sh sets none of the overrides, so the app and this process use the defaults.
    expect(LIMITS).toEqual(DEFAULT_LIMITS)
    expect(DEFAULT_LIMITS).toEqual({ studyMaxBins: 10_000, studyMaxPoints: 100_000, runMaxValues: 4_000_000, buildMaxValues: 8_388_608, workspaceQuotaBytes: 2 * 1024 ** 3 })
  })
})

describe('studies and runs', () => {
  it('refuses a study over the bins cap with 413 naming the cap, storing nothing', async () => {
    const bins = Array.from({ length: 10_001 }, (_, i) => ({ x: 0.001 + 0.4 * i / 10_001, q2: 10 }))
    const before = await count(t.studies)
    const res = await ws.analyst.client.post(`${api()}/studies`, { name: 'too many bins', spec: { kernel: 'dis-nc-f2', bins } })
    expect(res.status).toBe(413)
    expect(res.body.statusMessage).toMatch(/at most 10,000 bins; this one has 10,001/)
    expect(await count(t.studies)).toBe(before)
    const draft = await ws.analyst.client.post(`${api()}/studies/validate`, { spec: { kernel: 'dis-nc-f2', bins } })
    expect(draft.status).toBe(413)
  })

  it('refuses a study over the quadrature-points cap before expanding it', async () => {
    // 25 bins ranged in M and y, 64 Gauss–Legendre points each: 25 · 64 · 64 = 102 400 points.
    const bins = Array.from({ length: 25 }, (_, i) => ({ mMin: 60 + i, mMax: 61 + i, yMin: -1, yMax: 1 }))
    const res = await ws.analyst.client.post(`${api()}/studies`, { name: 'too many points', spec: { kernel: 'drell-yan', options: { sqrtSGeV: 13000 }, bins, quadratureOrder: 64 } })
    expect(res.status).toBe(413)
    expect(res.body.statusMessage).toMatch(/25 bins expand into 102,400 quadrature points; a study may have at most 100,000/)
  })

  it('refuses members × bins over the run budget when the set is added', async () => {
    // 400 replicas and their mean on 10 000 bins: 401 · 10 000 = 4 010 000 values > 4 000 000.
    const set = await uploadSet(ws.analyst.client, ws.id, toySetBytes({ name: 'many-replicas', kind: 'replicas', errorMembers: 400, nx: 10, nq: 6 }).bytes)
    const bins = Array.from({ length: 10_000 }, (_, i) => ({ x: 0.001 + 0.4 * i / 10_000, q2: 10 }))
    const before = await count(t.studies)
    const res = await ws.analyst.client.post(`${api()}/studies`, { name: 'too many values', spec: { kernel: 'dis-nc-f2', bins }, setIds: [set.id] })
    expect(res.status).toBe(413)
    expect(res.body.statusMessage).toMatch(/401 members; on 10,000 bins a run would hold 4,010,000 values, .*at most 4,000,000/)
    expect(await count(t.studies)).toBe(before)
  })
})

describe('set builds', () => {
  it('refuses a build over members × grid with 413 and the cap, queueing nothing', async () => {
    // 10 000 replicas + mean on 60 x × 22 Q² nodes × 13 flavours = 171 617 160 values.
    const before = await count(t.setBuilds)
    const res = await ws.analyst.client.post(`${api()}/sets/builds`, { input: minimal, members: { type: 'replicas', count: 10_000, seed: 1 } })
    expect(res.status).toBe(413)
    expect(res.body.statusMessage).toMatch(/10,001 members × 60 x nodes × 22 Q² nodes × 13 flavours = 171,617,160 values .*at most 8,388,608 values \(64 MiB\)/)
    expect(res.body.data.issues[0].path).toBe('members.count')
    expect(await count(t.setBuilds)).toBe(before)
  })
})

describe('the storage quota', () => {
  it('refuses a set file that does not fit, with the numbers, and stores nothing', async () => {
    const quotaWs = await createWorkspace('Quota')
    const { bytes } = toySetBytes({ name: 'quota-toy' })
    await uploadSet(quotaWs.analyst.client, quotaWs.id, bytes)
    const db = testDB()
    const used = await storedSetBytes(db, quotaWs.id)
    expect(used).toBe(bytes.byteLength)
    const second = { workspaceId: quotaWs.id, name: 'second', fileName: 'second.sheafset', bytes, origin: 'upload' as const, addedBy: quotaWs.analyst.id }
    // One byte short of room for a second copy.
    const quota = 2 * bytes.byteLength - 1
    const refused = await db.transaction(tx => insertErrorSet(tx, second, quota)).catch((e: unknown) => e)
    expect(refused).toBeInstanceOf(DomainError)
    expect((refused as DomainError).statusCode).toBe(413)
    expect((refused as DomainError).message).toContain(`stores ${formatBytes(used)} of set files and its quota is ${formatBytes(quota)}`)
    expect((refused as DomainError).data).toMatchObject({ quota: { usedBytes: used, addingBytes: bytes.byteLength, quotaBytes: quota } })
    expect(await storedSetBytes(db, quotaWs.id)).toBe(used)
    // Exactly enough room: stored.
    await db.transaction(tx => insertErrorSet(tx, second, quota + 1))
    expect(await storedSetBytes(db, quotaWs.id)).toBe(2 * bytes.byteLength)
  })

  it('refuses a build whose set would not fit before queueing it', async () => {
    const quotaWs = await createWorkspace('Build quota')
    const { request } = checkBuildRequest({ input: minimal, grid: smallGrid })
    const tiny = { ...LIMITS, workspaceQuotaBytes: 1024 }
    const refused = await startSetBuild(testDB(), () => { throw new Error('nothing may be queued') }, quotaWs.id, quotaWs.analyst.id, 'too big', request, tiny).catch((e: unknown) => e)
    expect((refused as DomainError).statusCode).toBe(413)
    expect((refused as DomainError).message).toMatch(/quota is 1 KiB: the set this build writes \(about .* KiB\) does not fit/)
    const rows = await testDB().select({ id: t.setBuilds.id }).from(t.setBuilds).where(eq(t.setBuilds.workspaceId, quotaWs.id))
    expect(rows).toHaveLength(0)
  })
})

describe('fairness on the build queue', () => {
  // A queue of its own that no worker reads, so the jobs stay where the priorities put them.
  const connection = new IORedis(testEnv().redisUrl, { maxRetriesPerRequest: null })
  const queue = new Queue(`build-set-fairness-${Date.now()}`, { connection })
  const made: string[] = []
  afterAll(async () => {
    if (made.length) await testDB().update(t.setBuilds).set({ state: 'cancelled', finishedAt: new Date() }).where(inArray(t.setBuilds.id, made))
    await queue.obliterate({ force: true })
    await queue.close()
    await connection.quit()
  })

  it('puts a workspace\'s second build behind another workspace\'s first', async () => {
    const [a, b] = [await createWorkspace('Busy'), await createWorkspace('Waiting')]
    const { request } = checkBuildRequest({ input: minimal, grid: smallGrid })
    const start = async (w: TestWorkspace, name: string) => {
      const row = await startSetBuild(testDB(), () => queue, w.id, w.analyst.id, name, request)
      made.push(row.id)
      return row
    }
    const a1 = await start(a, 'a-first')
    const a2 = await start(a, 'a-second')
    const b1 = await start(b, 'b-first')
    // Priority = 1 + the workspace's builds already queued or running when it was requested.
    expect([await buildPriority(testDB(), a1.id), await buildPriority(testDB(), a2.id), await buildPriority(testDB(), b1.id)]).toEqual([1, 2, 1])
    const jobs = await queue.getJobs(['prioritized'], 0, -1, true)
    expect(Object.fromEntries(jobs.map(j => [j.id, j.opts.priority]))).toEqual({ [a1.id]: 1, [a2.id]: 2, [b1.id]: 1 })
    // BullMQ's own order: lower priority first, then first come first served.
    expect(jobs.map(j => j.id)).toEqual([a1.id, b1.id, a2.id])
    // The public view reports the same order (places count every waiting build of the app).
    const [pa1, pa2, pb1] = (await withQueuePlaces(testDB(), [a1, a2, b1])).map(r => publicSetBuild(r).queuePlace ?? Number.NaN) as [number, number, number]
    expect(pb1).toBe(pa1 + 1)
    expect(pa2).toBe(pb1 + 1)
    const seen = await b.viewer.client.get(`/api/workspaces/${b.id}/sets/builds/${b1.id}`)
    expect(seen.body.queuePlace).toBe(pb1)
    const listed = await a.viewer.client.get(`/api/workspaces/${a.id}/sets`)
    expect(listed.body.builds.find((x: { id: string }) => x.id === a2.id).queuePlace).toBe(pa2)
  })
})

describe('densities queries', () => {
  it('computes a flavour named many times once, and caps the distinct flavours at 13', async () => {
    const set = await uploadSet(ws.analyst.client, ws.id, toySetBytes({ name: 'densities-toy' }).bytes)
    const url = `${api()}/sets/${set.id}/densities?q2=10&points=10`
    const repeated = await ws.viewer.client.get(`${url}&flavours=${Array.from({ length: 5000 }, () => '2').join(',')}`)
    expect(repeated.status).toBe(200)
    expect(repeated.body.flavours.map((f: { flavour: number }) => f.flavour)).toEqual([2])
    const fourteen = '1,2,3,4,5,6,-1,-2,-3,-4,-5,-6,21,uv'
    const many = await ws.viewer.client.get(`${url}&flavours=${fourteen}`)
    expect(many.status).toBe(400)
    expect(JSON.stringify(many.body.data)).toMatch(/at most 13 flavours at once; got 14/)
  })
})
