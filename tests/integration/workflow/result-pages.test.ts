// GET …/results/[rid] on a finished result: bins a page at a time (?binsOffset=&binsLimit=, the
// answer's `bins` says which), the spec's bins and the bands cut alike, bad paging parameters a
// located 400, and never the member values.
import { describe, expect, it } from 'vitest'
import { createWorkspace } from '../../support/users'
import { f2Spec, toySetBytes, uploadSet, waitForResult } from './helpers'

describe('pages of bins of a result', () => {
  it('sends the bins asked for, refuses bad paging with the parameter named, and no member values', async () => {
    const ws = await createWorkspace('Result pages')
    const a = ws.analyst.client
    const set = await uploadSet(a, ws.id, toySetBytes({ name: 'pages-hessian', kind: 'hessian-pairs', errorMembers: 4 }).bytes)
    const study = await a.post(`/api/workspaces/${ws.id}/studies`, { name: 'Paged study', spec: f2Spec(5), setIds: [set.id] })
    const rid = (await a.post(`/api/workspaces/${ws.id}/studies/${study.body.id}/run`, {})).body.results[0].id
    expect((await waitForResult(a, ws.id, rid)).state).toBe('done')
    const path = `/api/workspaces/${ws.id}/results/${rid}`

    const whole = await ws.viewer.client.get(path)
    expect(whole.status).toBe(200)
    expect(whole.body.bins).toEqual({ offset: 0, limit: 5, total: 5 })
    expect(whole.body.bands.central).toHaveLength(5)
    // The member values (members × 5 bins) are not in it: no array is longer than the bins.
    const longest = (v: unknown): number => (Array.isArray(v) ? Math.max(v.length, ...v.map(longest)) : v && typeof v === 'object' ? Math.max(0, ...Object.values(v).map(longest)) : 0)
    expect(longest(whole.body)).toBe(5)

    const page = await a.get(`${path}?binsOffset=1&binsLimit=2&cl=90`)
    expect(page.status).toBe(200)
    expect(page.body.bins).toEqual({ offset: 1, limit: 2, total: 5 })
    expect(page.body.spec.bins).toEqual(whole.body.spec.bins.slice(1, 3))
    const full90 = await a.get(`${path}?cl=90`)
    expect(page.body.bands.central).toEqual(full90.body.bands.central.slice(1, 3))
    expect(page.body.bands.plus).toEqual(full90.body.bands.plus.slice(1, 3))
    expect(page.body.bands.pdf.minus).toEqual(full90.body.bands.pdf.minus.slice(1, 3))
    if (full90.body.scaleVariation) expect(page.body.scaleVariation.nominal).toEqual(full90.body.scaleVariation.nominal.slice(1, 3))

    for (const [q, field] of [['binsOffset=5', 'binsOffset'], ['binsOffset=-1', 'binsOffset'], ['binsLimit=0', 'binsLimit'], ['binsLimit=some', 'binsLimit'], ['binsOffset=1.5', 'binsOffset']] as const) {
      const bad = await a.get(`${path}?${q}`)
      expect(bad.status, q).toBe(400)
      expect(JSON.stringify(bad.body.data), q).toContain(field)
    }
  })
})
