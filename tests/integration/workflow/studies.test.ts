// Studies through the API: create and edit with the engine's validation, run on the queue with
// live progress, bands recomputed per prescription and CL, matrices, eigenvector contributions,
// versions, cancel, failures, export with provenance, review with mails, comparison and χ².
import { eq } from 'drizzle-orm'
import { beforeAll, describe, expect, it } from 'vitest'
import { testDB, tables as t } from '../../support/db'
import { waitForMail } from '../../support/outbox'
import { createWorkspace, type TestWorkspace } from '../../support/users'
import { bytesToFloat64 } from '../../../server/domain/results/float64'
import { RESULT_CAUTION } from '../../../shared/export/caution'
import { f2Spec, postForm, toySetBytes, uploadSet, waitForResult } from './helpers'

let ws: TestWorkspace
let hessian: string
let replicas: string
const api = () => `/api/workspaces/${ws.id}`

beforeAll(async () => {
  ws = await createWorkspace('Study desk')
  hessian = (await uploadSet(ws.analyst.client, ws.id, toySetBytes({ name: 'study-h', errorMembers: 5 }).bytes)).id
  replicas = (await uploadSet(ws.analyst.client, ws.id, toySetBytes({ name: 'study-r', kind: 'replicas', errorMembers: 40 }).bytes)).id
})

async function createStudy(body: Record<string, unknown>) {
  const res = await ws.analyst.client.post(`${api()}/studies`, { name: 'a study', ...body })
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return res.body as { id: string, revision: number }
}

/** The stored values of a finished result, as (member, 0-based bin) => value. */
async function storedValues(resultId: string) {
  const [row] = await testDB().select().from(t.resultValues).where(eq(t.resultValues.resultId, resultId))
  const values = bytesToFloat64(row!.values)
  return (member: number, bin: number) => values[member * row!.binCount + bin]!
}

async function runAndWait(studyId: string, setIds?: string[]) {
  const run = await ws.analyst.client.post(`${api()}/studies/${studyId}/run`, setIds ? { setIds } : {})
  expect(run.status, JSON.stringify(run.body)).toBe(202)
  const results = run.body.results as Array<{ id: string, setId: string, version: number }>
  for (const r of results) expect((await waitForResult(ws.analyst.client, ws.id, r.id)).state).toBe('done')
  return results
}

describe('creating and editing studies', () => {
  it('creates a study with the spec completed by the engine', async () => {
    const res = await ws.analyst.client.post(`${api()}/studies`, { name: 'F2 scan', spec: f2Spec(4), setIds: [hessian], clPercent: 90 })
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({ name: 'F2 scan', setIds: [hessian], prescription: 'auto', clPercent: 90, revision: 1, unit: '1' })
    expect(res.body.spec).toMatchObject({ kernel: 'dis-nc-f2', quadratureOrder: 8, scaleFactor: 1 })
    const list = await ws.viewer.client.get(`${api()}/studies`)
    expect(list.body.studies.find((s: { id: string }) => s.id === res.body.id)).toMatchObject({ binCount: 4, latestResults: [] })
  })

  it('names the bin row and column of each problem (400), and unknown kernels', async () => {
    const bad = await ws.analyst.client.post(`${api()}/studies`, {
      name: 'bad bins', setIds: [hessian],
      spec: { kernel: 'dis-nc-f2', bins: [{ x: 0.01, q2: 10 }, { x: 1.2, q2: 10 }, { xMin: 0.2, xMax: 0.1, q2: 5 }] }
    })
    expect(bad.status).toBe(400)
    const issues = bad.body.data.issues
    expect(issues).toContainEqual(expect.objectContaining({ bin: 2, column: 'x', message: expect.stringMatching(/^bin 2, column x: x must be in \(0, 1\)/) }))
    expect(issues).toContainEqual(expect.objectContaining({ bin: 3, column: 'xMax' }))
    const kernel = await ws.analyst.client.post(`${api()}/studies`, { name: 'k', spec: { kernel: 'no-such', bins: [{ x: 0.1 }] } })
    expect(kernel.status).toBe(400)
    expect(kernel.body.statusMessage).toMatch(/unknown kernel "no-such"/)
    const fields = await ws.analyst.client.post(`${api()}/studies`, { spec: f2Spec(1), clPercent: 120 })
    expect(fields.status).toBe(400)
    expect(fields.body.data.fields).toMatchObject({ name: expect.any(String), clPercent: expect.stringMatching(/below 100%/) })
  })

  it('refuses bins outside a set\'s grid (422) naming the set and the bin', async () => {
    const res = await ws.analyst.client.post(`${api()}/studies`, { name: 'far', spec: { kernel: 'dis-nc-f2', bins: [{ x: 0.01, q2: 10 }, { x: 0.01, q2: 1e7 }] }, setIds: [hessian] })
    expect(res.status).toBe(422)
    expect(res.body.data.issues).toEqual([expect.objectContaining({ bin: 2, setId: hessian, message: expect.stringMatching(/study-h .*bin 2/) })])
    // The same check without saving, for the grid's messages.
    const draft = await ws.viewer.client.post(`${api()}/studies/validate`, { spec: { kernel: 'dis-nc-f2', bins: [{ x: 0.01, q2: 1e7 }] }, setIds: [hessian] })
    expect(draft.status).toBe(422)
    const ok = await ws.viewer.client.post(`${api()}/studies/validate`, { spec: f2Spec(2), setIds: [hessian] })
    expect(ok.body).toMatchObject({ ok: true, spec: { kernel: 'dis-nc-f2' } })
  })

  it('compiles a user kernel\'s expression once, with or without sets (400 at options.expression)', async () => {
    const spec = (expression: string) => ({ kernel: 'user', options: { mode: 'dis', expression, weights: [{ a: 2, w: 4 / 9 }, { a: -2, w: 4 / 9 }] }, bins: [{ x: 0.01, q2: 10 }] })
    const at = (message: RegExp) => [{ message: expect.stringMatching(message), column: 'options.expression', path: ['options', 'expression'] }]
    // "foo" starts at the 5th character of "x * foo"; the DIS-like mode without √s knows x and q2 only.
    for (const setIds of [[], [hessian, replicas]]) {
      const res = await ws.viewer.client.post(`${api()}/studies/validate`, { spec: spec('x * foo'), setIds })
      expect(res.status, JSON.stringify(setIds)).toBe(400)
      expect(res.body.data.issues).toEqual(at(/^column 5: unknown name "foo"/))
    }
    const ok = await ws.viewer.client.post(`${api()}/studies/validate`, { spec: spec('x * q2'), setIds: [] })
    expect(ok.status).toBe(200)
    // "x *" ends after 3 characters, so the parser stops at column 4.
    const create = await ws.analyst.client.post(`${api()}/studies`, { name: 'broken kernel', spec: spec('x *'), setIds: [] })
    expect(create.status).toBe(400)
    expect(create.body.data.issues).toEqual(at(/^column 4: syntax error/))
    const study = await createStudy({ spec: spec('1'), setIds: [hessian] })
    const edit = await ws.analyst.client.patch(`${api()}/studies/${study.id}`, { spec: spec('x * foo') })
    expect(edit.status).toBe(400)
    expect(edit.body.data.issues).toEqual(at(/^column 5: unknown name "foo"/))
    expect((await ws.viewer.client.get(`${api()}/studies/${study.id}`)).body).toMatchObject({ revision: 1, spec: { options: { expression: '1' } } })
  })

  it('counts the revision up on each save and refuses a stale one (409)', async () => {
    const study = await createStudy({ spec: f2Spec(2), setIds: [hessian] })
    const edit = await ws.analyst.client.patch(`${api()}/studies/${study.id}`, { description: 'more bins', spec: f2Spec(3), revision: 1 })
    expect(edit.status).toBe(200)
    expect(edit.body).toMatchObject({ revision: 2, description: 'more bins' })
    const stale = await ws.analyst.client.patch(`${api()}/studies/${study.id}`, { name: 'late', revision: 1 })
    expect(stale.status).toBe(409)
    const badEdit = await ws.analyst.client.patch(`${api()}/studies/${study.id}`, { spec: { kernel: 'dis-nc-f2', bins: [] } })
    expect(badEdit.status).toBe(400)
    expect(badEdit.body.data.issues[0].message).toMatch(/at least one bin/)
  })
})

describe('running a study', () => {
  it('runs one job per set with progress to 100 %, and stores bands for each prescription', async () => {
    const study = await createStudy({ spec: f2Spec(5), setIds: [hessian, replicas], clPercent: 68 })
    const run = await ws.analyst.client.post(`${api()}/studies/${study.id}/run`, {})
    expect(run.status).toBe(202)
    expect(run.body.results).toHaveLength(2)
    expect(run.body.results.map((r: { version: number }) => r.version)).toEqual([1, 1])
    const progressSeen: number[] = []
    for (const r of run.body.results) {
      const end = await waitForResult(ws.analyst.client, ws.id, r.id)
      progressSeen.push(end.progress.percent)
      expect(end).toMatchObject({ state: 'done', error: null })
    }
    expect(progressSeen).toEqual([100, 100])
    const [h] = run.body.results
    const res = await ws.viewer.client.get(`${api()}/results/${h.id}`)
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ state: 'done', frozen: false, reviewState: 'draft', reporting: { prescription: 'hessian-symmetric', clPercent: 68, available: ['hessian-symmetric', 'hessian-asymmetric'] }, caution: RESULT_CAUTION })
    expect(res.body.bands.central).toHaveLength(5)
    expect(res.body.scaleVariation).toMatchObject({ kappas: [0.5, 1, 2], nominal: res.body.bands.central })
    expect(res.body.trail.events.map((e: { action: string }) => e.action)).toEqual(expect.arrayContaining(['result.created', 'result.ran']))
  })

  it('streams progress as server-sent events until the result has finished', async () => {
    const study = await createStudy({ spec: f2Spec(3), setIds: [replicas] })
    const run = await ws.analyst.client.post(`${api()}/studies/${study.id}/run`, {})
    const c = ws.viewer.client
    const res = await fetch(`${c.baseUrl}${api()}/results/${run.body.results[0].id}/events`, {
      headers: { 'cookie': [...c.cookies].map(([k, v]) => `${k}=${v}`).join('; '), 'x-forwarded-for': c.address }
    })
    expect(res.headers.get('content-type')).toMatch(/text\/event-stream/)
    const text = await res.text() // the server closes the stream once the result has ended
    const events = text.split('\n').filter(l => l.startsWith('data: ')).map(l => JSON.parse(l.slice(6)))
    expect(events.length).toBeGreaterThanOrEqual(1)
    expect(events.at(-1)).toMatchObject({ state: 'done', progress: { done: 41, total: 41, percent: 100 } })
    const percents = events.map(e => e.progress.percent)
    expect([...percents].sort((a, b) => a - b)).toEqual(percents)
  })

  it('recomputes bands for another prescription and CL from the stored values, without a job', async () => {
    const study = await createStudy({ spec: f2Spec(3), setIds: [hessian] })
    const [r] = await runAndWait(study.id)
    const at68 = (await ws.viewer.client.get(`${api()}/results/${r!.id}?prescription=hessian-symmetric&cl=68`)).body.bands
    const at90 = (await ws.viewer.client.get(`${api()}/results/${r!.id}?prescription=hessian-symmetric&cl=90`)).body.bands
    // A Gaussian band at 90% CL is z(0.95) = 1.6448536… times the 68% one (PDG review
    // "Statistics", table of Gaussian quantiles).
    at68.plus.forEach((p: number, i: number) => expect(at90.plus[i] / p).toBeCloseTo(1.6448536, 6))
    const asym = (await ws.viewer.client.get(`${api()}/results/${r!.id}?prescription=hessian-asymmetric`)).body
    expect(asym.reporting.prescription).toBe('hessian-asymmetric')
    expect(asym.bands.central).toEqual(at68.central)
    const rows = await testDB().select().from(t.results).where(eq(t.results.studyId, study.id))
    expect(rows).toHaveLength(1)
    const wrong = await ws.viewer.client.get(`${api()}/results/${r!.id}?prescription=replica-sd`)
    expect(wrong.status).toBe(400)
    const badCl = await ws.viewer.client.get(`${api()}/results/${r!.id}?cl=100`)
    expect(badCl.status).toBe(400)
  })

  it('gives the covariance and correlation matrices and the eigenvector contributions of a bin', async () => {
    const study = await createStudy({ spec: f2Spec(4), setIds: [hessian, replicas] })
    const [h, rep] = await runAndWait(study.id)
    const m = await ws.viewer.client.get(`${api()}/results/${h!.id}/matrices`)
    expect(m.status).toBe(200)
    expect(m.body.bins).toBe(4)
    const rho = m.body.correlation as number[][]
    for (let i = 0; i < 4; i++) {
      expect(rho[i]![i]).toBeCloseTo(1, 12)
      for (let j = 0; j < 4; j++) expect(rho[i]![j]).toBeCloseTo(rho[j]![i]!, 12)
    }
    const band = (await ws.viewer.client.get(`${api()}/results/${h!.id}`)).body.bands
    // The diagonal of the covariance is the square of the symmetric Hessian band.
    for (let i = 0; i < 4; i++) expect(m.body.covariance[i][i]).toBeCloseTo(band.plus[i] ** 2, 12)
    const c = await ws.viewer.client.get(`${api()}/results/${h!.id}/contributions?bin=2`)
    expect(c.status).toBe(200)
    expect(c.body.eigenvectors).toHaveLength(5)
    expect(c.body.eigenvectors.reduce((a: number, e: { fraction: number }) => a + e.fraction, 0)).toBeCloseTo(1, 12)
    expect(c.body.total).toBeCloseTo(band.plus[1], 12)
    expect((await ws.viewer.client.get(`${api()}/results/${h!.id}/contributions?bin=9`)).status).toBe(400)
    expect((await ws.viewer.client.get(`${api()}/results/${h!.id}/contributions?bin=0`)).status).toBe(400)
    const none = await ws.viewer.client.get(`${api()}/results/${rep!.id}/contributions?bin=1`)
    expect(none.status).toBe(422)
    expect(none.body.statusMessage).toMatch(/replica/i)
    // Each member's shift from the central value: members 2k−1 and 2k are X_k⁺ and X_k⁻ (see shared/physics/README.md, Hessian sets).
    const X = await storedValues(h!.id)
    c.body.eigenvectors.forEach((e: { eigenvector: number, signed: number, plus: number, minus: number }, i: number) => {
      const k = i + 1
      expect(e.eigenvector).toBe(k)
      expect(e.plus).toBeCloseTo(X(2 * k - 1, 1) - X(0, 1), 14)
      expect(e.minus).toBeCloseTo(X(2 * k, 1) - X(0, 1), 14)
      expect(e.signed).toBeCloseTo((e.plus - e.minus) / 2, 14)
    })
    // At 90% CL every shift is z(0.95) = 1.6448536… times the 68% one (PDG review "Statistics",
    // table of Gaussian quantiles).
    const c90 = await ws.viewer.client.get(`${api()}/results/${h!.id}/contributions?bin=2&cl=90`)
    expect(c90.body.clPercent).toBe(90)
    c90.body.eigenvectors.forEach((e: { plus: number, minus: number }, i: number) => {
      expect(e.plus / c.body.eigenvectors[i].plus).toBeCloseTo(1.6448536, 6)
      expect(e.minus / c.body.eigenvectors[i].minus).toBeCloseTo(1.6448536, 6)
    })
  })

  it('gives one-sided eigenvectors a plus shift X_k − X₀ and no minus member', async () => {
    const oneSided = (await uploadSet(ws.analyst.client, ws.id, toySetBytes({ name: 'study-1s', kind: 'hessian-one-sided', errorMembers: 3 }).bytes)).id
    const study = await createStudy({ spec: f2Spec(2), setIds: [oneSided] })
    const [r] = await runAndWait(study.id)
    const c = await ws.viewer.client.get(`${api()}/results/${r!.id}/contributions?bin=2`)
    expect(c.status).toBe(200)
    const X = await storedValues(r!.id)
    expect(c.body.eigenvectors).toHaveLength(3)
    c.body.eigenvectors.forEach((e: { signed: number, plus: number, minus: null }, i: number) => {
      expect(e.minus).toBeNull()
      expect(e.plus).toBeCloseTo(X(i + 1, 1) - X(0, 1), 14)
      expect(e.signed).toBe(e.plus)
    })
  })

  it('makes a new version on each run, keeping the old one, and refuses a double run', async () => {
    const study = await createStudy({ spec: f2Spec(2), setIds: [hessian] })
    const [v1] = await runAndWait(study.id)
    await ws.analyst.client.patch(`${api()}/studies/${study.id}`, { spec: f2Spec(3) })
    const run = await ws.analyst.client.post(`${api()}/studies/${study.id}/run`, {})
    expect(run.body.results[0].version).toBe(2)
    const twice = await ws.analyst.client.post(`${api()}/studies/${study.id}/run`, {})
    expect([202, 409]).toContain(twice.status) // 409 while version 2 is still queued or running
    if (twice.status === 409) expect(twice.body.statusMessage).toMatch(/Already queued or running/)
    await waitForResult(ws.analyst.client, ws.id, run.body.results[0].id)
    const detail = await ws.viewer.client.get(`${api()}/studies/${study.id}`)
    const versions = detail.body.results.map((r: { version: number, binCount: number }) => [r.version, r.binCount])
    expect(versions).toEqual(expect.arrayContaining([[1, 2], [2, 3]]))
    const old = await ws.viewer.client.get(`${api()}/results/${v1!.id}`)
    expect(old.body.bands.central).toHaveLength(2)
  })

  it('refuses to run a study without sets, or with a set it does not have', async () => {
    const study = await createStudy({ spec: f2Spec(2), setIds: [] })
    const none = await ws.analyst.client.post(`${api()}/studies/${study.id}/run`, {})
    expect(none.status).toBe(400)
    expect(none.body.statusMessage).toMatch(/Add at least one error set/)
    const other = await ws.analyst.client.post(`${api()}/studies/${study.id}/run`, { setIds: [hessian] })
    expect(other.status).toBe(400)
    expect(other.body.data.issues[0].message).toMatch(/not one of this study's sets/)
  })

  it('cancels a queued or running result and refuses to cancel a finished one', async () => {
    const big = (await uploadSet(ws.analyst.client, ws.id, toySetBytes({ name: 'cancel-me', kind: 'replicas', errorMembers: 200, nx: 50, nq: 16 }).bytes)).id
    const bins = Array.from({ length: 150 }, (_, i) => ({ m: 20 + i, yMin: -1, yMax: 1 }))
    const study = await createStudy({ spec: { kernel: 'drell-yan', options: { sqrtSGeV: 13000 }, bins, quadratureOrder: 16 }, setIds: [big] })
    const run = await ws.analyst.client.post(`${api()}/studies/${study.id}/run`, {})
    const rid = run.body.results[0].id
    const cancel = await ws.analyst.client.post(`${api()}/results/${rid}/cancel`, {})
    expect(cancel.status).toBe(200)
    expect(cancel.body.cancelRequested).toBe(true)
    const end = await waitForResult(ws.analyst.client, ws.id, rid)
    expect(end.state).toBe('cancelled')
    expect((await ws.analyst.client.post(`${api()}/results/${rid}/cancel`, {})).status).toBe(409)
    expect((await ws.viewer.client.get(`${api()}/results/${rid}/matrices`)).status).toBe(409)
  })
})

describe('exports', () => {
  let resultId: string
  beforeAll(async () => {
    const study = await createStudy({ name: 'Export me', spec: f2Spec(3), setIds: [hessian], clPercent: 90 })
    resultId = (await runAndWait(study.id))[0]!.id
  })

  it('writes CSV with provenance, caution and one line per bin', async () => {
    const res = await ws.viewer.client.get(`${api()}/results/${resultId}/export?format=csv&prescription=hessian-asymmetric`)
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toMatch(/text\/csv/)
    expect(res.headers.get('content-disposition')).toMatch(/Export_me-study-h-v1\.csv/)
    const text = res.body as string
    expect(text).toMatch(/^# Sheaf export: bands/)
    expect(text).toContain('# set: study-h version')
    expect(text).toContain('prescription: Hessian pairs, asymmetric; 90% CL')
    expect(text).toContain('kernel: dis-nc-f2')
    expect(text).toContain(`run by: ${ws.analyst.name}`)
    expect(text).toContain('draft, not reviewed')
    expect(text).toContain('caution: Leading-order prediction')
    const data = text.split('\n').filter(l => l && !l.startsWith('#'))
    expect(data[0]).toMatch(/^x,q2,central\[hessian-asymmetric\],plus\[hessian-asymmetric\]/)
    expect(data).toHaveLength(1 + 3)
    const bands = (await ws.viewer.client.get(`${api()}/results/${resultId}?prescription=hessian-asymmetric`)).body.bands
    const first = data[1]!.split(',').map(Number)
    expect(first[2]).toBe(bands.central[0])
    expect(first[3]).toBe(bands.plus[0])
  })

  it('writes JSON, a booktabs LaTeX table and the matrices', async () => {
    const json = await ws.viewer.client.get(`${api()}/results/${resultId}/export?format=json`)
    expect(json.body).toMatchObject({ format: 'sheaf-bands', provenance: { confidenceLevelPercent: 90, approval: { state: 'draft' } }, caution: RESULT_CAUTION })
    expect(json.body.bins).toHaveLength(3)
    const tex = await ws.viewer.client.get(`${api()}/results/${resultId}/export?format=latex`)
    expect(tex.body).toContain('\\toprule')
    expect(tex.body).toContain('\\bottomrule')
    const cov = await ws.viewer.client.get(`${api()}/results/${resultId}/export?format=covariance`)
    expect(cov.body).toMatch(/covariance matrix between bins/)
    const cor = await ws.viewer.client.get(`${api()}/results/${resultId}/export?format=correlation`)
    expect(cor.body.split('\n').filter((l: string) => l && !l.startsWith('#'))).toHaveLength(4)
    const bad = await ws.viewer.client.get(`${api()}/results/${resultId}/export?format=pdf`)
    expect(bad.status).toBe(400)
  })
})

describe('review', () => {
  it('submits, returns with a comment, resubmits and approves; approved versions are frozen', async () => {
    const study = await createStudy({ name: 'Review me', spec: f2Spec(2), setIds: [hessian] })
    const [r] = await runAndWait(study.id)
    const url = `${api()}/results/${r!.id}`
    const since = new Date()
    expect((await ws.viewer.client.post(`${url}/submit`, {})).status).toBe(403)
    const submit = await ws.analyst.client.post(`${url}/submit`, { comment: 'ready' })
    expect(submit.body.reviewState).toBe('submitted')
    const ownerMail = await waitForMail(ws.owner.email, /submitted/, since)
    // The mail names the study, the set with its version, and the result version.
    expect(ownerMail.textBody).toMatch(new RegExp(`${ws.analyst.name} submitted study "Review me" on set study-h \\S+, result version 1 for sign-off`))
    expect(ownerMail.subject).toMatch(/^Sheaf: Review me on set study-h \S+, result v1 submitted$/)
    expect((await ws.analyst.client.post(`${url}/submit`, {})).status).toBe(409)
    expect((await ws.analyst.client.post(`${url}/approve`, {})).status).toBe(403)
    const noComment = await ws.owner.client.post(`${url}/return`, {})
    expect(noComment.status).toBe(400)
    expect(noComment.body.data.fields.comment).toMatch(/Say what needs to change/)
    const returned = await ws.owner.client.post(`${url}/return`, { comment: 'use 90% CL' })
    expect(returned.body.reviewState).toBe('returned')
    const back = await waitForMail(ws.analyst.email, /returned/, since)
    expect(back.textBody).toContain('Comment: use 90% CL')
    await ws.analyst.client.post(`${url}/submit`, {})
    const approved = await ws.owner.client.post(`${url}/approve`, { comment: 'fine' })
    expect(approved.body).toMatchObject({ reviewState: 'approved', frozen: true })
    await waitForMail(ws.analyst.email, /approved/, since)
    // Frozen: no further review step, no deletion of the version or its study.
    expect((await ws.owner.client.post(`${url}/return`, { comment: 'again' })).status).toBe(409)
    expect((await ws.analyst.client.delete(url)).status).toBe(409)
    expect((await ws.owner.client.delete(`${api()}/studies/${study.id}`)).status).toBe(409)
    // Exports say it is approved, and by whom.
    const csv = (await ws.viewer.client.get(`${url}/export?format=csv`)).body as string
    expect(csv).toContain(`approved by ${ws.owner.name}`)
    // The trail lists each step with its actor.
    const trail = (await ws.viewer.client.get(url)).body.trail
    expect(trail.reviews.map((s: { action: string }) => s.action)).toEqual(['submitted', 'returned', 'submitted', 'approved'])
    expect(trail.events.map((e: { action: string }) => e.action)).toEqual(['result.created', 'result.ran', 'result.submitted', 'result.returned', 'result.submitted', 'result.approved'])
    // Editing the study and running again makes a new version; the approved one is unchanged.
    await ws.analyst.client.patch(`${api()}/studies/${study.id}`, { spec: f2Spec(3) })
    const [v2] = await runAndWait(study.id)
    expect(v2!.version).toBe(2)
    expect((await ws.viewer.client.get(url)).body).toMatchObject({ reviewState: 'approved', binCount: 2 })
  })
})

describe('comparison and measurements', () => {
  let studyId: string
  beforeAll(async () => {
    const study = await createStudy({ name: 'Compare', spec: f2Spec(4), setIds: [hessian, replicas] })
    studyId = study.id
    await runAndWait(study.id)
  })

  it('combines sets as an envelope and as a pooled Monte-Carlo set', async () => {
    const res = await ws.viewer.client.get(`${api()}/studies/${studyId}/comparison?replicasPerSet=40&seed=3`)
    expect(res.status).toBe(200)
    expect(res.body.bins).toEqual(f2Spec(4).bins)
    expect(res.body.sets).toHaveLength(2)
    const [a, b] = res.body.sets
    for (let i = 0; i < 4; i++) {
      const lo = Math.min(a.band.central[i] - a.band.minus[i], b.band.central[i] - b.band.minus[i])
      const hi = Math.max(a.band.central[i] + a.band.plus[i], b.band.central[i] + b.band.plus[i])
      expect(res.body.envelope.central[i] - res.body.envelope.minus[i]).toBeCloseTo(lo, 12)
      expect(res.body.envelope.central[i] + res.body.envelope.plus[i]).toBeCloseTo(hi, 12)
    }
    expect(res.body.pooled).toMatchObject({ replicasPerSet: 40, seed: 3, replicas: 80 })
    const again = await ws.viewer.client.get(`${api()}/studies/${studyId}/comparison?replicasPerSet=40&seed=3`)
    expect(again.body.pooled.sd).toEqual(res.body.pooled.sd)
    // At 90 % CL the pooled interval is read from the pool's 5th and 95th percentiles (not the
    // 68 % interval rescaled): it says so, and it contains the 68 % interval of the same pool.
    const at90 = await ws.viewer.client.get(`${api()}/studies/${studyId}/comparison?replicasPerSet=40&seed=3&cl=90`)
    expect(res.body.pooled.intervalLabel).toBe('percentile 15.87–84.13 %')
    expect(at90.body.pooled.intervalLabel).toBe('percentile 5–95 %')
    for (let i = 0; i < 4; i++) {
      const [p68, p90] = [res.body.pooled.interval, at90.body.pooled.interval]
      expect(p90.central[i] + p90.plus[i]).toBeGreaterThanOrEqual(p68.central[i] + p68.plus[i])
      expect(p90.central[i] - p90.minus[i]).toBeLessThanOrEqual(p68.central[i] - p68.minus[i])
    }
    // By default as many per set as the smallest replica set has (here 40), at most 100.
    expect((await ws.viewer.client.get(`${api()}/studies/${studyId}/comparison`)).body.pooled.replicasPerSet).toBe(40)
    const tooMany = await ws.viewer.client.get(`${api()}/studies/${studyId}/comparison?replicasPerSet=500`)
    expect(tooMany.status).toBe(422)
    expect(tooMany.body.statusMessage).toMatch(/replicas/)
  })

  it('gives the bins the results ran on, and refuses to combine results on different bins (409)', async () => {
    const study = await createStudy({ name: 'Moved bins', spec: f2Spec(3), setIds: [hessian, replicas] })
    await runAndWait(study.id)
    // Same number of bins, other Q²: only the Hessian set is run again.
    const moved = { kernel: 'dis-nc-f2', bins: f2Spec(3).bins.map(b => ({ ...b, q2: 2 * b.q2 })) }
    expect((await ws.analyst.client.patch(`${api()}/studies/${study.id}`, { spec: moved })).status).toBe(200)
    await runAndWait(study.id, [hessian])
    const mixed = await ws.viewer.client.get(`${api()}/studies/${study.id}/comparison`)
    expect(mixed.status).toBe(409)
    expect(mixed.body.statusMessage).toMatch(/different bins/)
    const rerun = await ws.viewer.client.get(`${api()}/studies/${study.id}/comparison?setIds=${hessian}`)
    expect(rerun.status).toBe(200)
    expect(rerun.body.bins).toEqual(moved.bins)
    const old = await ws.viewer.client.get(`${api()}/studies/${study.id}/comparison?setIds=${replicas}`)
    expect(old.status).toBe(200)
    expect(old.body.bins).toEqual(f2Spec(3).bins)
  })

  it('reads a measurement CSV with located errors and gives χ² with and without the PDF covariance', async () => {
    const url = `${api()}/studies/${studyId}/measurements`
    const bad = await ws.analyst.client.post(url, { name: 'bad', csv: 'value,stat\n0.3,0.01\n0.4,abc\n0.5,0.01\n0.6,-1' })
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues).toEqual([
      expect.objectContaining({ line: 3, column: 2, message: expect.stringMatching(/"abc" is not a number/) }),
      expect.objectContaining({ line: 5, column: 2, message: expect.stringMatching(/must be ≥ 0/) })
    ])
    const count = await ws.analyst.client.post(url, { name: 'short', csv: 'value,stat\n0.3,0.01' })
    expect(count.status).toBe(422)
    expect(count.body.statusMessage).toMatch(/4 bins but the measurement has 1 point/)
    const corr = await ws.analyst.client.post(url, { name: 'corr', csv: 'value,stat,syst\n1,1,1\n1,1,1\n1,1,1\n1,1,1', correlation: '1,0,0,0\n0,1,0,0\n0,0,1,2\n0,0,0,1' })
    expect(corr.status).toBe(400)
    expect(corr.body.data.issues[0]).toMatchObject({ file: 'correlation', line: 3, column: 4 })
    // A matrix must say which errors it applies to; the choice is stored and shown.
    const identity = '1,0,0,0\n0,1,0,0\n0,0,1,0\n0,0,0,1'
    const unsaid = await ws.analyst.client.post(url, { name: 'which', csv: 'value,stat,syst\n1,1,1\n1,1,1\n1,1,1\n1,1,1', correlation: identity })
    expect(unsaid.status).toBe(400)
    expect(unsaid.body.statusMessage).toMatch(/field correlationOf: Say which errors the correlation matrix applies to: stat, syst or total/)
    const said = await ws.analyst.client.post(url, { name: 'said', csv: 'value,stat,syst\n1,1,1\n1,1,1\n1,1,1\n1,1,1', correlation: identity, correlationOf: 'syst' })
    expect(said.status).toBe(201)
    expect(said.body).toMatchObject({ correlationOf: 'syst', treatment: ['The correlation matrix applies to the systematic errors.', 'Statistical errors are uncorrelated between points.'] })
    expect((await ws.viewer.client.get(`${url}/${said.body.id}`)).body).toMatchObject({ correlationOf: 'syst', data: { correlationOf: 'syst', systCombination: 'uncorrelated' } })
    expect((await ws.analyst.client.delete(`${url}/${said.body.id}`)).status).toBe(200)

    const compare = (await ws.viewer.client.get(`${api()}/studies/${studyId}/comparison`)).body
    const central = compare.sets[0].band.central as number[]
    // Data = the Hessian set's central prediction shifted by one stat error in every bin.
    const csv = ['bin,value,stat', ...central.map((c, i) => `${i + 1},${c + 0.01},0.01`)].join('\n')
    const form = await postForm(ws.analyst.client, url, { name: 'pseudo-data', points: { bytes: new TextEncoder().encode(csv), name: 'points.csv' } })
    expect(form.status).toBe(201)
    expect(form.body).toMatchObject({ name: 'pseudo-data', pointCount: 4 })
    const chi2 = await ws.viewer.client.get(`${url}/${form.body.id}/chi2`)
    expect(chi2.status).toBe(200)
    const h = chi2.body.sets.find((s: { setId: string }) => s.setId === hessian)
    // χ² = Σ (1σ)²/σ² = 4 for four uncorrelated points each one σ off (PDG review "Statistics").
    expect(h.experimental.chi2).toBeCloseTo(4, 6)
    expect(h.points).toBe(4)
    // The data with its errors and each set's band, for the plot and the pulls.
    expect(chi2.body.data.errors).toEqual([0.01, 0.01, 0.01, 0.01].map(e => expect.closeTo(e, 12)))
    expect(h.band.central).toHaveLength(4)
    // Adding the PDF covariance can only lower χ² (a positive semi-definite term in the inverse).
    expect(h.withPdf.chi2).toBeLessThan(h.experimental.chi2)
    const list = await ws.viewer.client.get(url)
    expect(list.body.measurements.map((m: { name: string }) => m.name)).toContain('pseudo-data')
    expect((await ws.analyst.client.delete(`${url}/${form.body.id}`)).status).toBe(200)
    expect((await ws.viewer.client.get(`${url}/${form.body.id}`)).status).toBe(404)
  })
})

describe('matrices of very large studies', () => {
  it('refuses the n × n matrices above the bin cap with 413 and a message, the bands still come', async () => {
    // 2001 bins: one over the default cap of 2000 (server/domain/results/results.ts MATRIX_MAX_BINS).
    const bins = Array.from({ length: 2001 }, (_, i) => ({ x: 0.001 + 0.4 * i / 2001, q2: 10 }))
    const study = await createStudy({ spec: { kernel: 'dis-nc-f2', bins }, setIds: [hessian] })
    const [h] = await runAndWait(study.id)
    const m = await ws.viewer.client.get(`${api()}/results/${h!.id}/matrices`)
    expect(m.status).toBe(413)
    expect(m.body.statusMessage).toMatch(/up to 2000 bins; this result has 2001/)
    const csv = await ws.viewer.client.get(`${api()}/results/${h!.id}/export?format=correlation`)
    expect(csv.status).toBe(413)
    const bands = await ws.viewer.client.get(`${api()}/results/${h!.id}?binsLimit=all`)
    expect(bands.status).toBe(200)
    expect(bands.body.bands.central).toHaveLength(2001)
  })
})
