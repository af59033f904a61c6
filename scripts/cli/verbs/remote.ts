/**
 * Verbs that use a Sheaf server with an API token (scripts/cli/remote.ts):
 *   sheaf remote-import <table> --header <header.json>   import a set table, print the set
 *   sheaf remote-run <study.json> --set <id>[,<id>…]      create and run a study, wait, print the bands
 */
import { parseVerbArgs, stringOption, type VerbSpec } from '../args'
import { UsageError } from '../errors'
import { readJson, type CliIo } from '../io'
import { filePart, fileName, REMOTE_HELP, REMOTE_OPTIONS, remoteOptions, remoteRequest, tokenWorkspace } from '../remote'

export const remoteImportVerb: VerbSpec = {
  name: 'remote-import',
  summary: 'import a set table (CSV, TSV, gzipped, Parquet) into a Sheaf server\'s workspace',
  help: `Usage: sheaf remote-import <table> --header <header.json> [--server <url>] [--token-file <file>]

Sends the table (long or wide layout, see README "Set tables") with its header to the server,
into the workspace of the API token (analyst role). Prints the stored set as JSON; a refused
table prints the server's message with its line and column.

Options:
  --header <file>        the set header as JSON (name, kind, confidenceLevelPercent, …)
${REMOTE_HELP}
  -h, --help             this text`,
  options: { header: { type: 'string' }, ...REMOTE_OPTIONS },
  positionals: { min: 1, max: 1, what: 'table file' }
}

/** Runs `remote-import`; returns the exit code. */
export async function runRemoteImport(argv: readonly string[], io: CliIo, env: NodeJS.ProcessEnv = process.env): Promise<number> {
  const args = parseVerbArgs(remoteImportVerb, argv)
  if (args.help) { io.stdout(`${remoteImportVerb.help}\n`); return 0 }
  const header = stringOption(args, 'header')
  if (header === undefined) throw new UsageError('remote-import: give the set header with --header <header.json>.')
  const o = remoteOptions('remote-import', args, io, env)
  const { workspaceId } = await tokenWorkspace(o)
  const table = args.positionals[0]!
  const form = new FormData()
  form.append('sidecar', filePart(io, header), fileName(header))
  form.append('file', filePart(io, table), fileName(table))
  const set = await remoteRequest(o, 'POST', `/api/workspaces/${workspaceId}/sets/import`, form)
  io.stdout(`${JSON.stringify(set, null, 2)}\n`)
  return 0
}

export const remoteRunVerb: VerbSpec = {
  name: 'remote-run',
  summary: 'create and run a study on a Sheaf server, wait for it, print the bands',
  help: `Usage: sheaf remote-run <study.json> --set <id>[,<id>…] [--second <id>] [--name <text>] [--format json|csv] [--server <url>] [--token-file <file>]

Creates a study from study.json (the same spec 'sheaf compute' reads: kernel, options, bins)
on the sets given by id in the API token's workspace (analyst role), runs it, shows the
progress on stderr, and prints each set's bands: the server's JSON export (default) or CSV.

Options:
  --set <ids>            comma-separated error-set ids of the workspace
  --second <id>          the study's second set, held at its central member (the
                         fragmentation set of a sidis-* study, the second species of
                         epem-species-ratio, beam 2 or the nuclear set of other kernels);
                         the server refuses a set holding the wrong density (400)
  --name <text>          the study's name (default: the file's name)
  --format json|csv      the export format (default json)
  --timeout <seconds>    give up waiting after this long (default 600)
${REMOTE_HELP}
  -h, --help             this text`,
  options: { set: { type: 'string' }, second: { type: 'string' }, name: { type: 'string' }, format: { type: 'string' }, timeout: { type: 'string' }, ...REMOTE_OPTIONS },
  positionals: { min: 1, max: 1, what: 'study file' }
}

const ENDED = new Set(['done', 'failed', 'cancelled'])

/** Runs `remote-run`; returns the exit code (1 when a run failed). */
export async function runRemoteRun(argv: readonly string[], io: CliIo, env: NodeJS.ProcessEnv = process.env, pollMs = 500): Promise<number> {
  const args = parseVerbArgs(remoteRunVerb, argv)
  if (args.help) { io.stdout(`${remoteRunVerb.help}\n`); return 0 }
  const sets = (stringOption(args, 'set') ?? '').split(',').map(s => s.trim()).filter(Boolean)
  if (!sets.length) throw new UsageError('remote-run: give the set ids with --set <id>[,<id>…].')
  const format = stringOption(args, 'format') ?? 'json'
  if (format !== 'json' && format !== 'csv') throw new UsageError(`remote-run: --format is json or csv, not '${format}'.`)
  const timeoutText = stringOption(args, 'timeout') ?? '600'
  const timeoutS = Number(timeoutText)
  if (!(timeoutS > 0)) throw new UsageError(`remote-run: --timeout is a number of seconds, not '${timeoutText}'.`)
  const o = remoteOptions('remote-run', args, io, env)
  const file = args.positionals[0]!
  const spec = readJson(io, file)
  const { workspaceId } = await tokenWorkspace(o)
  const api = `/api/workspaces/${workspaceId}`
  const name = stringOption(args, 'name') ?? fileName(file).replace(/\.json$/i, '')
  const second = stringOption(args, 'second')
  const study = await remoteRequest<{ id: string }>(o, 'POST', `${api}/studies`, { name, spec, setIds: sets, ...(second ? { secondSetId: second } : {}) })
  const { results } = await remoteRequest<{ results: Array<{ id: string, setId: string }> }>(o, 'POST', `${api}/studies/${study.id}/run`, {})
  io.stderr(`study ${study.id}: ${results.length} run(s) queued\n`)
  const deadline = Date.now() + timeoutS * 1000
  let failed = 0
  const outputs: Array<{ setId: string, resultId: string, state: string, error?: string | null, bands?: unknown }> = []
  for (const r of results) {
    let p: { state: string, error: string | null, progress?: { percent?: number } }
    for (;;) {
      p = await remoteRequest(o, 'GET', `${api}/results/${r.id}/progress`)
      if (ENDED.has(p.state)) break
      if (Date.now() > deadline) throw new UsageError(`remote-run: result ${r.id} still ${p.state} after ${timeoutS} s; raise --timeout or look at /jobs.`)
      io.stderr(`result ${r.id}: ${p.state} ${p.progress?.percent ?? 0}%\n`)
      await new Promise(resolve => setTimeout(resolve, pollMs))
    }
    if (p.state !== 'done') {
      failed++
      outputs.push({ setId: r.setId, resultId: r.id, state: p.state, error: p.error })
      continue
    }
    const bands = await remoteRequest(o, 'GET', `${api}/results/${r.id}/export?format=${format}`)
    outputs.push({ setId: r.setId, resultId: r.id, state: p.state, bands })
  }
  if (format === 'csv') {
    for (const out of outputs) io.stdout(typeof out.bands === 'string' ? out.bands : `# result ${out.resultId} ${out.state}: ${out.error ?? ''}\r\n`)
  } else {
    io.stdout(`${JSON.stringify({ studyId: study.id, results: outputs }, null, 2)}\n`)
  }
  if (failed) io.stderr(`${failed} run(s) did not finish\n`)
  return failed ? 1 : 0
}
