import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { runRemoteImport, runRemoteRun } from '../../scripts/cli/verbs/remote'
import { main } from '../../scripts/cli/main'
import { createToken } from '../support/tokens'
import { createWorkspace } from '../support/users'
import { testEnv } from '../support/env'

const samples = join(__dirname, '../../samples')

function capture() {
  const out: string[] = []
  const err: string[] = []
  return { io: { stdout: (t: string) => { out.push(t) }, stderr: (t: string) => { err.push(t) } }, out, err }
}

describe('sheaf remote-import and remote-run against a server', () => {
  it('imports a table, runs a study on it and prints the bands', async () => {
    const ws = await createWorkspace('Command line')
    const { secret } = await createToken(ws.analyst, ws.id, 'analyst')
    const env = { SHEAF_URL: testEnv().appUrl, SHEAF_TOKEN: secret }

    const imported = capture()
    const code = await runRemoteImport([join(samples, 'tables/toy-table-wide.tsv'), '--header', join(samples, 'tables/toy-table.header.json')], imported.io, env)
    expect(imported.err.join('')).toBe('')
    expect(code).toBe(0)
    const set = JSON.parse(imported.out.join(''))
    expect(set).toMatchObject({ name: 'toy-table', memberCount: 5 })

    const run = capture()
    const study = join(__dirname, '../../samples/studies/dis-f2.json')
    const ran = await runRemoteRun([study, '--set', set.id, '--format', 'csv'], run.io, env, 100)
    expect(run.err.join('')).toMatch(/run\(s\) queued/)
    expect(ran).toBe(0)
    expect(run.out.join('')).toMatch(/central\[/)
  })

  it('says what is missing or refused in one line', async () => {
    const noToken = capture()
    expect(await main(['remote-run', 'x.json', '--set', 'a', '--server', 'http://127.0.0.1:1'], noToken.io)).toBe(2)
    expect(noToken.err.join('')).toMatch(/^sheaf: remote-run: give an API token/)

    const bad = capture()
    const env = { SHEAF_URL: testEnv().appUrl, SHEAF_TOKEN: 'sheaf_pat_' + 'C'.repeat(43) }
    expect(await runRemoteImport([join(samples, 'tables/bad-cell.csv'), '--header', join(samples, 'tables/toy-table.header.json')], bad.io, env).catch((e: Error) => e.message))
      .toMatch(/the server answered 401 .*not valid/)
  })
})
