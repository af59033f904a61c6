import { beforeAll, describe, expect, it } from 'vitest'
import { peakRssBytes, pidListeningOn, resetPeakRss, rssBytes } from '../support/app-process'
import { testEnv } from '../support/env'
import { ApiClient } from '../support/http'
import { sendLargeBody, type LargeBodyRequest } from '../support/large-body'
import { createWorkspace, type TestWorkspace } from '../support/users'
import { f2Spec } from './workflow/helpers'

// JSON bodies are read with a byte limit (1 MiB by default, 16 MiB for a study, 4 MiB for a
// measurement) and a nesting limit (64), enforced while the bytes arrive; see
// server/utils/json-body.ts.
const MiB = 1024 * 1024

function headersOf(client: ApiClient): Record<string, string> {
  const h: Record<string, string> = { 'x-forwarded-for': client.address }
  if (client.origin) h.origin = client.origin
  if (client.cookies.size) h.cookie = [...client.cookies].map(([k, v]) => `${k}=${v}`).join('; ')
  return h
}

/** A large body to `path` as `client`, with the app's peak memory growth while it was handled. */
async function sendWatched(client: ApiClient, path: string, body: Omit<LargeBodyRequest, 'url' | 'headers'>) {
  const pid = pidListeningOn(Number(new URL(testEnv().appUrl).port))
  if (!pid) throw new Error('the test app process was not found through /proc')
  const before = rssBytes(pid)
  resetPeakRss(pid)
  const answer = await sendLargeBody({ ...body, url: testEnv().appUrl + path, headers: headersOf(client) })
  return { ...answer, growth: peakRssBytes(pid) - before }
}

const signinBody = (totalBytes: number, declareLength = true) => ({
  head: '{"email":"big@tests.sheaf.test","password":"', tail: '"}', totalBytes, declareLength
})

describe('JSON body limits', () => {
  it('refuses a 64 MiB sign-in body from its Content-Length at once, without keeping it', async () => {
    const res = await sendWatched(new ApiClient(), '/api/auth/signin', signinBody(64 * MiB))
    expect(res.status).toBe(413)
    expect(res.body.statusMessage).toBe('The request body is larger than the limit of 1 MiB')
    expect(res.body.data).toEqual({ maxBytes: MiB })
    expect(res.uploadFinished).toBe(false)
    expect(res.bytesSent).toBeLessThan(64 * MiB)
    expect(res.growth).toBeLessThan(24 * MiB)
  })

  it('stops reading a 64 MiB sign-in body sent without a length as soon as it passes 1 MiB', async () => {
    const res = await sendWatched(new ApiClient(), '/api/auth/signin', signinBody(64 * MiB, false))
    expect(res.status).toBe(413)
    expect(res.body.statusMessage).toBe('The request body is larger than the limit of 1 MiB')
    expect(res.uploadFinished).toBe(false)
    expect(res.bytesSent).toBeLessThan(64 * MiB)
    expect(res.growth).toBeLessThan(24 * MiB)
  })

  it('reads a body just under the limit', async () => {
    // A password longer than the schema allows: the body was read and parsed, then checked.
    const res = await sendLargeBody({ ...signinBody(MiB - 1024), url: `${testEnv().appUrl}/api/auth/signin`, headers: headersOf(new ApiClient()) })
    expect(res.status).toBe(400)
    expect(res.body.data.fields.password).toBeTruthy()
  })

  const postRaw = (text: string) => fetch(`${testEnv().appUrl}/api/auth/signin`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'origin': testEnv().appUrl, 'x-forwarded-for': new ApiClient().address },
    body: text
  })

  it('refuses JSON nested deeper than 64 levels with 400, and reads 64', async () => {
    // The object plus `arrays` levels of arrays around the e-mail.
    const nested = (arrays: number) => `{"email":${'['.repeat(arrays)}"a@b.test"${']'.repeat(arrays)},"password":"x"}`
    const deep = await postRaw(nested(64))
    expect(deep.status).toBe(400)
    const body = await deep.json()
    expect(body.statusMessage).toBe('The JSON body is nested deeper than 64 levels of arrays and objects')
    expect(body.data).toEqual({ maxDepth: 64 })
    // Exactly 64 levels is read; the schema then refuses the e-mail.
    const ok = await postRaw(nested(63))
    expect(ok.status).toBe(400)
    expect((await ok.json()).data.fields.email).toBeTruthy()
  })

  it('refuses a body that is not JSON with 400 saying where', async () => {
    const res = await postRaw('{"email": "a@b.test"\n  "password": "x"}')
    expect(res.status).toBe(400)
    const body = await res.json()
    expect(body.statusMessage).toBe('The request body is not valid JSON')
    expect(body.data.issues[0]).toMatchObject({ line: 2, column: 3 })
  })
})

describe('route limits and guards before the body', () => {
  let ws: TestWorkspace
  let studyId: string
  const api = () => `/api/workspaces/${ws.id}`
  beforeAll(async () => {
    ws = await createWorkspace('Body limits')
    const study = await ws.analyst.client.post(`${api()}/studies`, { name: 'Limits', spec: f2Spec(4), setIds: [] })
    expect(study.status).toBe(201)
    studyId = study.body.id
  })

  const measurementBody = (totalBytes: number) => ({ head: '{"name":"big","csv":"', tail: '"}', totalBytes })

  it('answers a 50 MiB measurement JSON from outside the workspace by the guard, without reading it', async () => {
    const path = () => `${api()}/studies/${studyId}/measurements`
    const anonymous = await sendWatched(new ApiClient(), path(), measurementBody(50 * MiB))
    expect(anonymous.status).toBe(401)
    expect(anonymous.uploadFinished).toBe(false)
    expect(anonymous.growth).toBeLessThan(24 * MiB)
    const outsider = await sendWatched(ws.outsider.client, path(), measurementBody(50 * MiB))
    expect(outsider.status).toBe(404)
    expect(outsider.uploadFinished).toBe(false)
    const viewer = await sendWatched(ws.viewer.client, path(), measurementBody(50 * MiB))
    expect(viewer.status).toBe(403)
    expect(viewer.uploadFinished).toBe(false)
  })

  it('refuses a 50 MiB measurement JSON from an analyst with 413 at the multipart limit of 4 MiB', async () => {
    const res = await sendWatched(ws.analyst.client, `${api()}/studies/${studyId}/measurements`, measurementBody(50 * MiB))
    expect(res.status).toBe(413)
    expect(res.body.statusMessage).toBe('The request body is larger than the limit of 4 MiB')
    expect(res.uploadFinished).toBe(false)
    expect(res.growth).toBeLessThan(24 * MiB)
  })

  it('reads a 3 MiB measurement JSON (over the default limit, under the upload limit)', async () => {
    // 10 bytes a row once JSON escapes the newline.
    const rows = Math.floor((3 * MiB) / 10)
    const csv = `value,stat\n${'0.5,0.01\n'.repeat(rows)}`
    const res = await ws.analyst.client.post(`${api()}/studies/${studyId}/measurements`, { name: 'many', csv })
    expect(JSON.stringify({ name: 'many', csv }).length).toBeGreaterThan(2 * MiB)
    expect(res.status).toBe(422)
    expect(res.body.statusMessage).toMatch(new RegExp(`4 bins but the measurement has ${rows} points`))
  })

  it('reads a study of 2 MiB and refuses one over 16 MiB', async () => {
    const bins = (n: number) => Array.from({ length: n }, (_, i) => ({ label: `bin ${i + 1} of a long scan`, x: 1e-3 + i * 1e-8, q2: 10 + i * 1e-3 }))
    const draft = { spec: { kernel: 'dis-nc-f2', bins: bins(35_000) }, setIds: [] }
    expect(JSON.stringify(draft).length).toBeGreaterThan(2 * MiB)
    // Read and parsed whole (not refused as a body): the study's bin budget answers.
    const ok = await ws.viewer.client.post(`${api()}/studies/validate`, draft)
    expect(ok.status).toBe(413)
    expect(ok.body.statusMessage).not.toMatch(/request body/)
    expect(ok.body.statusMessage).toMatch(/has 35\D?000\b/)
    const big = await sendWatched(ws.analyst.client, `${api()}/studies`, { head: '{"name":"big","spec":{"kernel":"dis-nc-f2","bins":[]},"description":"', tail: '"}', totalBytes: 17 * MiB })
    expect(big.status).toBe(413)
    expect(big.body.statusMessage).toBe('The request body is larger than the limit of 16 MiB')
  })

  it('keeps the default limit of 1 MiB on other routes', async () => {
    const res = await sendWatched(ws.analyst.client, `${api()}/sets/builds`, { head: '{"input":"', tail: '"}', totalBytes: 2 * MiB })
    expect(res.status).toBe(413)
    expect(res.body.statusMessage).toBe('The request body is larger than the limit of 1 MiB')
  })
})
