// Inputs that used to answer 500 (some after changing data): text PostgreSQL cannot store, user-
// kernel words every JavaScript object inherits and wrong argument counts, names too long for
// the unique index, two requests racing for one name, deep nesting and numbers beyond the
// double range; and the all-or-nothing writes: a request that fails leaves no row and queues no
// job.
import { Queue } from 'bullmq'
import { and, count, eq, sql } from 'drizzle-orm'
import IORedis from 'ioredis'
import { readFileSync } from 'node:fs'
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import { DomainError } from '../../server/domain/errors'
import type { QueueSource } from '../../server/domain/jobs/queue'
import { whileSetNameFree } from '../../server/domain/sets/library'
import { startSetBuild } from '../../server/domain/sets/builds'
import { insertErrorSet } from '../../server/domain/sets/store'
import { startRuns } from '../../server/domain/studies/runs'
import { BUILD_SET_QUEUE } from '../../shared/queue/workflow'
import { tables as t, testDB } from '../support/db'
import { testEnv } from '../support/env'
import { createWorkspace, type TestWorkspace } from '../support/users'
import { f2Spec, postForm, toySetBytes, uploadSet } from './workflow/helpers'

let ws: TestWorkspace
let redis: IORedis
let buildQueue: Queue
const api = () => `/api/workspaces/${ws.id}`

beforeAll(async () => {
  ws = await createWorkspace('Bad input')
  redis = new IORedis(testEnv().redisUrl, { maxRetriesPerRequest: null })
  buildQueue = new Queue(BUILD_SET_QUEUE, { connection: redis })
})

afterAll(async () => {
  await buildQueue.close()
  redis.disconnect()
})

/** Rows of the workspace a refused request must not add to. */
async function rowCounts() {
  const { rows } = await testDB().execute(sql`select
    (select count(*) from error_sets where workspace_id = ${ws.id})::int as sets,
    (select count(*) from studies where workspace_id = ${ws.id})::int as studies,
    (select count(*) from set_builds where workspace_id = ${ws.id})::int as builds,
    (select count(*) from audit_events where workspace_id = ${ws.id})::int as audit`)
  return rows[0]
}

/** Every job the build-set queue holds in any state. */
const buildJobs = async () => Object.values(await buildQueue.getJobCounts()).reduce((a, b) => a + b, 0)

describe('a NUL or a lone surrogate in stored text is a 400 naming the field', () => {
  it.each([['NUL', '\u0000'], ['lone high surrogate', '\uD800'], ['lone low surrogate', '\uDC00']])('%s', async (_what, bad) => {
    const set = await uploadSet(ws.analyst.client, ws.id, toySetBytes({ name: `text-${bad.charCodeAt(0)}` }).bytes)
    const before = await rowCounts()
    const study = await ws.analyst.client.post(`${api()}/studies`, { name: `F2 ${bad}`, spec: f2Spec(2), setIds: [set.id] })
    expect(study.status).toBe(400)
    expect(study.body.data.fields.name).toMatch(/character 4/)
    const spec = await ws.analyst.client.post(`${api()}/studies`, { name: 'F2', spec: { ...f2Spec(2), title: `F${bad}2` } })
    expect(spec.status).toBe(400)
    expect(spec.body.data.fields['spec.title']).toMatch(/^The text holds a (NUL|lone UTF-16 surrogate)/)
    const rename = await ws.analyst.client.patch(`${api()}/sets/${set.id}`, { name: `renamed${bad}` })
    expect(rename.status).toBe(400)
    expect(rename.body.data.fields.name).toMatch(/character 8/)
    expect((await ws.viewer.client.get(`${api()}/sets/${set.id}`)).body.name).toBe(set.name)
    const build = await ws.analyst.client.post(`${api()}/sets/builds`, { name: `built${bad}`, input: { format: 'sheaf.parametrised-input' } })
    expect(build.status).toBe(400)
    expect(build.body.data.fields.name).toBeDefined()
    const profile = await ws.viewer.client.patch('/api/auth/me', { name: `Viewer ${bad}` })
    expect(profile.status).toBe(400)
    expect(profile.body.data.fields.name).toBeDefined()
    expect(await rowCounts()).toEqual(before)
  })

  it('locates it by line and column in a measurement CSV', async () => {
    const study = await ws.analyst.client.post(`${api()}/studies`, { name: 'for points', spec: f2Spec(2) })
    const res = await ws.analyst.client.post(`${api()}/studies/${study.body.id}/measurements`, { name: 'points', csv: 'value,stat\n1,0.1\n2,0\u0000.2\n' })
    expect(res.status).toBe(400)
    expect(res.body.data.fields.csv).toMatch(/NUL character \(U\+0000\) at line 3, column 4/)
  })

  it('refuses it in a multipart name and in the header of a set file', async () => {
    const before = await rowCounts()
    const { bytes } = toySetBytes({ name: 'multipart-name' })
    const named = await postForm(ws.analyst.client, `${api()}/sets`, { file: { bytes, name: 'a.sheafset' }, name: 'bad\u0000name' })
    expect(named.status).toBe(400)
    expect(named.body.data.fields.name).toMatch(/NUL/)
    const header = toySetBytes({ name: 'header\u0000name' })
    const inFile = await postForm(ws.analyst.client, `${api()}/sets`, { file: { bytes: header.bytes, name: 'header.sheafset' } })
    expect(inFile.status).toBe(400)
    expect(inFile.body.statusMessage).toMatch(/header\.sheafset .*set\.name/)
    expect(inFile.body.data.issues[0].path).toEqual(['set', 'name'])
    expect(await rowCounts()).toEqual(before)
  })
})

describe('user-kernel expressions', () => {
  const userSpec = (expression: string) => ({ kernel: 'user', options: { mode: 'dis', expression, weights: [{ a: 2, w: 1 }] }, bins: [{ x: 0.01, q2: 10 }] })

  it.each(['constructor', 'x * toString', '__proto__ + 1'])('refuses the inherited name in %s as an unknown name', async (expression) => {
    const set = await uploadSet(ws.analyst.client, ws.id, toySetBytes({ name: `kernel ${expression}` }).bytes)
    const res = await ws.analyst.client.post(`${api()}/studies`, { name: 'user kernel', spec: userSpec(expression), setIds: [set.id] })
    expect(res.status).toBe(400)
    expect(res.body.data.issues[0]).toMatchObject({ column: 'options.expression', path: ['options', 'expression'] })
    expect(res.body.data.issues[0].message).toMatch(/unknown name "(constructor|toString|__proto__)"/)
  })

  it.each([
    ['sin(x, q2)', 'column 1: sin takes 1 argument, not 2'],
    ['sqrt()', 'column 1: sqrt takes 1 argument, not 0'],
    ['x * pow(q2)', 'column 5: pow takes 2 arguments, not 1']
  ])('refuses %s naming the function and its argument count', async (expression, message) => {
    const set = await uploadSet(ws.analyst.client, ws.id, toySetBytes({ name: `arity ${expression}` }).bytes)
    const before = await rowCounts()
    const validate = await ws.viewer.client.post(`${api()}/studies/validate`, { spec: userSpec(expression), setIds: [set.id] })
    expect(validate.status).toBe(400)
    expect(validate.body.data.issues[0]).toMatchObject({ message, path: ['options', 'expression'] })
    const create = await ws.analyst.client.post(`${api()}/studies`, { name: 'arity', spec: userSpec(expression), setIds: [set.id] })
    expect(create.status).toBe(400)
    expect(await rowCounts()).toEqual(before)
  })
})

describe('names and the unique index', () => {
  it('refuses a 5000-character upload name, rename or file name with 400 and takes the longest allowed one', async () => {
    const before = await rowCounts()
    const { bytes } = toySetBytes({ name: 'long-names' })
    const upload = await postForm(ws.analyst.client, `${api()}/sets`, { file: { bytes, name: 'a.sheafset' }, name: 'n'.repeat(5000) })
    expect(upload.status).toBe(400)
    expect(upload.body.data.fields.name).toMatch(/under 200 characters/)
    const file = await postForm(ws.analyst.client, `${api()}/sets`, { file: { bytes, name: `${'f'.repeat(5000)}.sheafset` } })
    expect(file.status).toBe(400)
    expect(file.body.data.fields.fileName).toMatch(/under 255 characters/)
    expect(await rowCounts()).toEqual(before)
    // 200 characters of three UTF-8 bytes each: 600 bytes, well inside the index entry limit.
    const longest = await postForm(ws.analyst.client, `${api()}/sets`, { file: { bytes, name: 'a.sheafset' }, name: '€'.repeat(200) })
    expect(longest.status).toBe(201)
    const rename = await ws.analyst.client.patch(`${api()}/sets/${longest.body.id}`, { name: 'r'.repeat(5000) })
    expect(rename.status).toBe(400)
    expect(rename.body.data.fields.name).toMatch(/under 200 characters/)
  })

  it('answers one of two concurrent uploads under one name with 201 and the other with 409', async () => {
    const { bytes } = toySetBytes({ name: 'concurrent-upload' })
    for (let round = 0; round < 4; round++) {
      const name = `same name ${round}`
      const answers = await Promise.all([0, 1].map(() => postForm(ws.analyst.client, `${api()}/sets`, { file: { bytes, name: 'same.sheafset' }, name })))
      expect(answers.map(a => a.status).sort()).toEqual([201, 409])
      expect(answers.find(a => a.status === 409)!.body.data.fields.name).toMatch(/already in this workspace/)
      const stored = await testDB().select({ n: count() }).from(t.errorSets).where(and(eq(t.errorSets.workspaceId, ws.id), eq(t.errorSets.name, name)))
      expect(stored[0]!.n).toBe(1)
    }
  })

  it('answers one of two concurrent renames to one name with 200 and the other with 409', async () => {
    for (let round = 0; round < 4; round++) {
      const [a, b] = await Promise.all(['a', 'b'].map(s => uploadSet(ws.analyst.client, ws.id, toySetBytes({ name: `rename-race-${round}-${s}` }).bytes)))
      const name = `raced ${round}`
      const answers = await Promise.all([a!, b!].map(s => ws.analyst.client.patch(`${api()}/sets/${s.id}`, { name })))
      expect(answers.map(r => r.status).sort()).toEqual([200, 409])
      const audits = await testDB().select({ n: count() }).from(t.auditEvents)
        .where(and(eq(t.auditEvents.workspaceId, ws.id), eq(t.auditEvents.action, 'set.renamed')))
      expect(audits[0]!.n).toBe(round + 1)
    }
  })

  it('turns a unique violation of the set name that slipped past the check into a 409', async () => {
    const { bytes } = toySetBytes({ name: 'slipped' })
    const row = { workspaceId: ws.id, name: 'slipped', fileName: 'slipped.sheafset', bytes, origin: 'upload' as const, addedBy: ws.analyst.id }
    await insertErrorSet(testDB(), row)
    const again = whileSetNameFree('slipped', '1', () => insertErrorSet(testDB(), row))
    await expect(again).rejects.toBeInstanceOf(DomainError)
    await expect(again).rejects.toMatchObject({ statusCode: 409, data: { fields: { name: 'slipped version 1 is already in this workspace' } } })
  })
})

describe('deep nesting and numbers beyond the double range', () => {
  it('refuses a spec nested 100000 levels deep', async () => {
    const text = `{"spec":${'['.repeat(100_000)}${']'.repeat(100_000)}}`
    const res = await fetch(`${ws.viewer.client.baseUrl}${api()}/studies/validate`, {
      method: 'POST', body: text,
      headers: { 'content-type': 'application/json', 'origin': ws.viewer.client.origin!, 'x-forwarded-for': ws.viewer.client.address, 'cookie': [...ws.viewer.client.cookies].map(([k, v]) => `${k}=${v}`).join('; ') }
    })
    // The body reader refuses it while it arrives, before anything parses it.
    expect(res.status).toBe(400)
    const body = await res.json() as { statusMessage: string, data: { maxDepth: number } }
    expect(body.statusMessage).toBe('The JSON body is nested deeper than 64 levels of arrays and objects')
    expect(body.data.maxDepth).toBe(64)
  })

  it.each([
    ['clPercent', `{"name":"big","spec":${JSON.stringify(f2Spec(1))},"clPercent":1e309}`, 'clPercent'],
    ['a bin', '{"name":"big","spec":{"kernel":"dis-nc-f2","bins":[{"x":1e309,"q2":10}]}}', 'spec.bins.0.x']
  ])('refuses 1e309 in %s', async (_what, text, field) => {
    const c = ws.analyst.client
    const res = await fetch(`${c.baseUrl}${api()}/studies`, {
      method: 'POST', body: text,
      headers: { 'content-type': 'application/json', 'origin': c.origin!, 'x-forwarded-for': c.address, 'cookie': [...c.cookies].map(([k, v]) => `${k}=${v}`).join('; ') }
    })
    expect(res.status).toBe(400)
    const body = await res.json() as { data: { fields: Record<string, string> } }
    expect(body.data.fields[field]).toBeDefined()
  })
})

/** A small fit the up-front checks accept (samples/fits/minimal-input.json), as a build request. */
const minimalRequest = () => ({
  input: JSON.parse(readFileSync(new URL('../../samples/fits/minimal-input.json', import.meta.url), 'utf8')),
  grid: { x: { count: 40, min: 1e-5, max: 0.98 }, q2: { count: 12, maxGeV2: 1e4 } }
})

describe('a request that fails leaves no row and queues no job', () => {
  it('a build whose audit event cannot be written leaves no build row and queues nothing', async () => {
    const before = await rowCounts()
    const jobs = await buildJobs()
    const add = vi.fn(async () => ({}))
    const queues = (() => ({ add })) as unknown as QueueSource
    // A lone surrogate passes a text column (it is stored as U+FFFD) but not the audit event's
    // jsonb detail: the insert and the audit event must fail together.
    await expect(startSetBuild(testDB(), queues, ws.id, ws.analyst.id, 'lone \uD800 surrogate', minimalRequest())).rejects.toThrow()
    expect(add).not.toHaveBeenCalled()
    expect(await rowCounts()).toEqual(before)
    expect(await buildJobs()).toBe(jobs)
  })

  it('a build request refused over HTTP queues nothing', async () => {
    const before = await rowCounts()
    const jobs = await buildJobs()
    const res = await ws.analyst.client.post(`${api()}/sets/builds`, { name: 'lone \uDC00', input: { format: 'sheaf.parametrised-input' } })
    expect(res.status).toBe(400)
    expect(await rowCounts()).toEqual(before)
    expect(await buildJobs()).toBe(jobs)
  })

  it('when the queue is down, a build and a run answer 503 and their rows say why', async () => {
    const down = (() => ({ add: async () => { throw new Error('connect ECONNREFUSED') } })) as unknown as QueueSource
    const build = startSetBuild(testDB(), down, ws.id, ws.analyst.id, 'queue down', minimalRequest())
    await expect(build).rejects.toMatchObject({ statusCode: 503 })
    const [row] = await testDB().select().from(t.setBuilds).where(and(eq(t.setBuilds.workspaceId, ws.id), eq(t.setBuilds.name, 'queue down')))
    expect(row).toMatchObject({ state: 'failed', error: 'The job queue is unavailable', jobId: null })

    const sets = await Promise.all(['a', 'b'].map(s => uploadSet(ws.analyst.client, ws.id, toySetBytes({ name: `queue-down-${s}` }).bytes)))
    const created = await ws.analyst.client.post(`${api()}/studies`, { name: 'queue down', spec: f2Spec(1), setIds: sets.map(s => s.id) })
    const [study] = await testDB().select().from(t.studies).where(eq(t.studies.id, created.body.id))
    await expect(startRuns(testDB(), down, study!, study!.setIds, ws.analyst.id)).rejects.toMatchObject({ statusCode: 503 })
    const results = await testDB().select().from(t.results).where(eq(t.results.studyId, study!.id))
    expect(results.map(r => [r.state, r.error])).toEqual([['failed', 'The job queue is unavailable'], ['failed', 'The job queue is unavailable']])
  })
})
