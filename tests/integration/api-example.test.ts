// The README's worked example ("A worked example with a token"), step by step through Node's
// fetch: with a token, import a set table, create a study, run it, poll its progress, download
// the bands as CSV and JSON.
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { createToken } from '../support/tokens'
import { createWorkspace } from '../support/users'
import { testEnv } from '../support/env'

const samples = join(__dirname, '../../samples/tables')

describe('the README worked example', () => {
  it('imports a table, creates and runs a study, polls it and downloads the bands with a token', async () => {
    const ws = await createWorkspace('Worked example')
    const { secret } = await createToken(ws.analyst, ws.id, 'analyst')
    const SHEAF_URL = testEnv().appUrl
    const WID = ws.id
    const auth = { authorization: `Bearer ${secret}` }

    // 1. Upload the set table with its sidecar.
    const form = new FormData()
    form.append('sidecar', new Blob([readFileSync(join(samples, 'toy-table.header.json'))]), 'toy-table.header.json')
    form.append('file', new Blob([readFileSync(join(samples, 'toy-table-long.csv'))]), 'toy-table-long.csv')
    const imported = await fetch(`${SHEAF_URL}/api/workspaces/${WID}/sets/import`, { method: 'POST', headers: auth, body: form })
    expect(imported.status).toBe(201)
    const SID = (await imported.json() as { id: string }).id

    // 2. Create a study on it.
    const study = await fetch(`${SHEAF_URL}/api/workspaces/${WID}/studies`, {
      method: 'POST', headers: { ...auth, 'content-type': 'application/json' },
      body: JSON.stringify({
        name: 'F2 from a script',
        spec: { kernel: 'dis-nc-f2', bins: [{ x: 0.001, q2: 10 }, { x: 0.01, q2: 10 }, { x: 0.1, q2: 100 }] },
        setIds: [SID]
      })
    })
    expect(study.status).toBe(201)
    const STUDY = (await study.json() as { id: string }).id

    // 3. Run it: one result per set.
    const run = await fetch(`${SHEAF_URL}/api/workspaces/${WID}/studies/${STUDY}/run`, { method: 'POST', headers: { ...auth, 'content-type': 'application/json' }, body: '{}' })
    expect(run.status).toBe(202)
    const RID = (await run.json() as { results: Array<{ id: string }> }).results[0]!.id

    // 4. Poll the progress until it ends.
    let state = 'queued'
    for (let i = 0; i < 600 && !['done', 'failed', 'cancelled'].includes(state); i++) {
      await new Promise(r => setTimeout(r, 200))
      const progress = await fetch(`${SHEAF_URL}/api/workspaces/${WID}/results/${RID}/progress`, { headers: auth })
      expect(progress.status).toBe(200)
      state = (await progress.json() as { state: string }).state
    }
    expect(state).toBe('done')

    // 5. Download the bands as CSV and as JSON.
    const csv = await fetch(`${SHEAF_URL}/api/workspaces/${WID}/results/${RID}/export?format=csv`, { headers: auth })
    expect(csv.status).toBe(200)
    const text = await csv.text()
    const records = text.split('\r\n').filter(l => l && !l.startsWith('#'))
    expect(records[0]).toMatch(/central\[/)
    expect(records).toHaveLength(1 + 3) // the column names, then one line per bin
    const json = await fetch(`${SHEAF_URL}/api/workspaces/${WID}/results/${RID}/export?format=json`, { headers: auth })
    expect(json.status).toBe(200)
    const body = await json.json() as Record<string, unknown>
    expect(JSON.stringify(body)).toMatch(/central/)
  })
})
