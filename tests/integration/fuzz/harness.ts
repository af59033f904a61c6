// The harness of the entry-path fuzz suite: a workspace with a set, a study with a finished
// result and a measurement to aim at; raw requests (JSON text that JSON.stringify cannot write,
// hand-built multipart); the state of the rows a refused request must not change; the check of
// one refusal and the tally printed at the end.
import { sql } from 'drizzle-orm'
import { expect } from 'vitest'
import { testDB } from '../../support/db'
import type { ApiClient, ApiResponse } from '../../support/http'
import { createUser, createWorkspace, type TestUser, type TestWorkspace } from '../../support/users'
import { f2Spec, postForm, toySetBytes, uploadSet, waitForResult } from '../workflow/helpers'

/** The fixed seed of every property (SHEAF_FUZZ_SEED replays another run). */
export const SEED = Number(process.env.SHEAF_FUZZ_SEED ?? 20_250_611)

export interface Target {
  ws: TestWorkspace
  /** A signed-in user of its own, for the profile and password bodies. */
  account: TestUser
  setId: string
  /** The bytes of that set's file: uploading them again under its name is a conflict. */
  setBytes: Uint8Array
  setName: string
  /** A second set, whose name a rename of the first may not take. */
  otherSetName: string
  studyId: string
  resultId: string
  measurementId: string
  base: string
}

/** Three bins of F₂ inside the TOY set's grid, and a measurement of three points for them. */
export const BINS = 3
export const POINTS_CSV = 'value,stat,syst\n0.42,0.01,0.02\n0.51,0.01,0.02\n0.55,0.02,0.02\n'

export async function setUpTarget(): Promise<Target> {
  const ws = await createWorkspace('Fuzz target')
  const account = await createUser({ tag: 'fuzz-account' })
  const base = `/api/workspaces/${ws.id}`
  const { bytes, set } = toySetBytes({ name: 'fuzz-set', nx: 30, nq: 10 })
  const uploaded = await uploadSet(ws.analyst.client, ws.id, bytes)
  const other = await uploadSet(ws.analyst.client, ws.id, bytes, 'fuzz-other')
  const study = await ws.analyst.client.post(`${base}/studies`, { name: 'Fuzz study', spec: f2Spec(BINS), setIds: [uploaded.id] })
  if (study.status !== 201) throw new Error(`study creation answered ${study.status}: ${JSON.stringify(study.body)}`)
  const run = await ws.analyst.client.post(`${base}/studies/${study.body.id}/run`, {})
  if (run.status !== 202) throw new Error(`run answered ${run.status}: ${JSON.stringify(run.body)}`)
  const resultId = run.body.results[0].id as string
  const ended = await waitForResult(ws.viewer.client, ws.id, resultId)
  if (ended.state !== 'done') throw new Error(`the result ended ${ended.state}: ${ended.error}`)
  const measurement = await ws.analyst.client.post(`${base}/studies/${study.body.id}/measurements`, { name: 'Fuzz points', csv: POINTS_CSV })
  if (measurement.status !== 201) throw new Error(`measurement answered ${measurement.status}: ${JSON.stringify(measurement.body)}`)
  return {
    ws, account, setId: uploaded.id, setBytes: bytes, setName: set.header.name, otherSetName: other.name, studyId: study.body.id,
    resultId, measurementId: measurement.body.id, base
  }
}

/**
 * What a refused request must leave as it was: the row counts of the workspace's sets, studies,
 * results, measurements, set builds and audit events, the accounts' users, tokens and audit
 * events, and a digest of the rows a PATCH could change (set names, study revisions, result
 * states, the fuzzing account's name and password hash).
 */
export async function rowState(t: Target) {
  const wid = t.ws.id
  const { rows } = await testDB().execute(sql`select
    (select count(*) from error_sets where workspace_id = ${wid})::int as sets,
    (select count(*) from studies where workspace_id = ${wid})::int as studies,
    (select count(*) from results r join studies s on s.id = r.study_id where s.workspace_id = ${wid})::int as results,
    (select count(*) from measurements m join studies s on s.id = m.study_id where s.workspace_id = ${wid})::int as measurements,
    (select count(*) from set_builds where workspace_id = ${wid})::int as set_builds,
    (select count(*) from audit_events where workspace_id = ${wid})::int as audit_events,
    (select count(*) from users)::int as users,
    (select count(*) from auth_tokens)::int as auth_tokens,
    (select count(*) from invitations where workspace_id = ${wid})::int as invitations,
    (select count(*) from workspaces)::int as workspaces,
    (select count(*) from memberships)::int as memberships,
    (select md5(coalesce(string_agg(user_id::text || role, ',' order by user_id), '')) from memberships where workspace_id = ${wid}) as roles,
    (select count(*) from audit_events where workspace_id is null)::int as account_audit_events,
    (select md5(coalesce(string_agg(id::text || name || version, ',' order by id), '')) from error_sets where workspace_id = ${wid}) as set_names,
    (select md5(coalesce(string_agg(id::text || name || revision::text || description, ',' order by id), '')) from studies where workspace_id = ${wid}) as study_revisions,
    (select md5(coalesce(string_agg(r.id::text || r.state || r.review_state, ',' order by r.id), '')) from results r join studies s on s.id = r.study_id where s.workspace_id = ${wid}) as result_states,
    (select md5(name || password_hash) from users where id = ${t.account.id}) as account`)
  return rows[0] as Record<string, number | string>
}

/** A response body of an error as Nitro sends it. */
interface ErrorBody { statusMessage?: string, message?: string, data?: { fields?: Record<string, string>, issues?: Array<Record<string, unknown>> } }

/** Every place an error body names: field keys, issue paths, columns, lines, files, byte offsets. */
export function placesIn(body: unknown): string[] {
  const data = (body as ErrorBody | null)?.data
  if (!data || typeof data !== 'object') return []
  const places = Object.keys(data.fields ?? {}).filter(k => k !== '_')
  for (const issue of Array.isArray(data.issues) ? data.issues : []) {
    if (Array.isArray(issue.path) && issue.path.length) places.push(issue.path.join('.'))
    else if (typeof issue.path === 'string' && issue.path) places.push(issue.path)
    for (const key of ['column', 'field', 'file', 'document']) if (typeof issue[key] === 'string' && issue[key]) places.push(issue[key] as string)
    for (const key of ['line', 'bin', 'byteOffset', 'member', 'node', 'row']) if (typeof issue[key] === 'number') places.push(`${key} ${issue[key]}`)
  }
  return places
}

/**
 * Where a refusal must point: a field or path fragment that one of the places must contain
 * ('spec.bins', 'line 3'), '*' for "some place", or null when the input has no field (a
 * malformed id, a stranger's id).
 */
export type Where = string | '*' | null

export const tally = { cases: 0, refused: 0, located: 0, mustLocate: 0, serverErrors: 0 }

export interface Attempt { describe: string, send: () => Promise<ApiResponse>, where: Where }

/**
 * Sends one bad input and checks the answer: a 4xx (never a 5xx, never a success) with a
 * non-empty statusMessage that, where the input has a field, line or cell, names it in
 * data.fields / data.issues; and no row changed.
 */
export async function refused(t: Target, attempt: Attempt) {
  const before = await rowState(t)
  const res = await attempt.send()
  const after = await rowState(t)
  tally.cases++
  const body = res.body as ErrorBody | null
  const places = placesIn(body)
  const where = attempt.where
  // A body nested past the reader's depth limit is refused while it arrives, before any field
  // exists; the answer then names the limit (data.maxDepth) instead of a field.
  const tooDeep = typeof (body?.data as { maxDepth?: unknown } | undefined)?.maxDepth === 'number'
  const located = tooDeep || (where === null ? places.length > 0 : where === '*' ? places.length > 0 : places.some(p => p.includes(where)))
  if (res.status >= 500) tally.serverErrors++
  if (res.status >= 400 && res.status < 500) tally.refused++
  if (where !== null) tally.mustLocate++
  if (located) tally.located++
  const context = `${attempt.describe} → ${res.status} ${JSON.stringify(body).slice(0, 600)}`
  expect(res.status, context).toBeGreaterThanOrEqual(400)
  expect(res.status, context).toBeLessThan(500)
  expect(typeof body?.statusMessage === 'string' && body.statusMessage.trim().length > 0, `no statusMessage: ${context}`).toBe(true)
  if (where !== null) expect(located, `expected a place containing ${JSON.stringify(where)} among ${JSON.stringify(places)}: ${context}`).toBe(true)
  expect(after, `rows changed: ${context}`).toEqual(before)
}

/** JSON text of `value` in which the strings INF and DEEP become 1e309 and a 200-level nest. */
export const INF = '@@INF@@'
export const DEEP = '@@DEEP@@'
export function jsonText(value: unknown): string {
  return JSON.stringify(value)
    .replaceAll(`"${INF}"`, '1e309')
    .replaceAll(`"${DEEP}"`, `${'['.repeat(200)}1${']'.repeat(200)}`)
}

/** A request with a raw body (JSON text or bytes) and the client's cookies, Origin and address. */
export async function rawRequest(client: ApiClient, method: string, path: string, body: string | Uint8Array, contentType = 'application/json'): Promise<ApiResponse> {
  const headers: Record<string, string> = { 'x-forwarded-for': client.address, 'content-type': contentType }
  if (client.origin) headers.origin = client.origin
  if (client.cookies.size) headers.cookie = [...client.cookies].map(([k, v]) => `${k}=${v}`).join('; ')
  const res = await fetch(client.baseUrl + path, { method, headers, body: body as BodyInit })
  const text = await res.text()
  let parsed: unknown = text
  try {
    parsed = text ? JSON.parse(text) : null
  } catch { /* keep the text */ }
  return { status: res.status, body: parsed, headers: res.headers }
}

/** A JSON request whose body is `jsonText(value)` (so INF and DEEP are sent as such). */
export const sendJson = (client: ApiClient, method: string, path: string, value: unknown) =>
  rawRequest(client, method, path, jsonText(value))

export interface Part { name: string, filename?: string, data: string | Uint8Array }

/** A multipart/form-data body built by hand, so that a file name can hold any character. */
export function multipart(parts: Part[]): { body: Uint8Array, type: string } {
  const boundary = `----sheaf-fuzz-${Math.random().toString(16).slice(2)}`
  const chunks: Buffer[] = []
  for (const p of parts) {
    const file = p.filename === undefined ? '' : `; filename="${p.filename.replace(/["\\\r\n]/g, '_')}"`
    chunks.push(Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="${p.name}"${file}\r\n`
      + (p.filename === undefined ? '' : 'Content-Type: application/octet-stream\r\n') + '\r\n'))
    chunks.push(typeof p.data === 'string' ? Buffer.from(p.data) : Buffer.from(p.data))
    chunks.push(Buffer.from('\r\n'))
  }
  chunks.push(Buffer.from(`--${boundary}--\r\n`))
  return { body: new Uint8Array(Buffer.concat(chunks)), type: `multipart/form-data; boundary=${boundary}` }
}

export const sendForm = (client: ApiClient, path: string, parts: Part[]) => {
  const { body, type } = multipart(parts)
  return rawRequest(client, 'POST', path, body, type)
}

export { postForm }

/** The tally as the lead quotes it. */
export function tallyLine() {
  return `fuzz totals (seed ${SEED}): ${tally.cases} bad inputs, ${tally.refused} answered 4xx, `
    + `${tally.located} with a located message (${tally.mustLocate} had a field, line or cell to name), ${tally.serverErrors} answered 5xx`
}
