/**
 * Import benchmark of the neutral set tables: writes a large long-form CSV (about 200 MB by
 * default: 101 Hessian members × 30 Q² × 100 x × 11 flavours = 3.3 million rows) to a
 * temporary folder, then imports it in a fresh process through the server's own import code
 * (server/domain/sets/table-import.ts: two streaming passes and the .sheafset writer; the
 * upload itself is streamed to a file by the route) and prints the time, the throughput and the
 * process's peak resident memory against its memory before the import. It also times the
 * line reader against csv-parse on the first 20 MB, the reason the reader is hand-written.
 *
 *   npx tsx scripts/bench-table.ts [--members 101] [--nx 100] [--nq 30] [--gzip]
 */
import { spawnSync } from 'node:child_process'
import { createReadStream, createWriteStream, mkdtempSync, rmSync, statSync } from 'node:fs'
import { tmpdir, loadavg } from 'node:os'
import { join } from 'node:path'
import { once } from 'node:events'
import { createGzip } from 'node:zlib'
import { parse } from 'csv-parse'
import { readSetTable } from '../server/domain/sets/table-import'
import { delimitedSource } from '../server/domain/sets/table-read'

const FLAVOURS = [-5, -4, -3, -2, -1, 21, 1, 2, 3, 4, 5]
const arg = (name: string, fallback: number) => {
  const i = process.argv.indexOf(`--${name}`)
  return i > 0 ? Number(process.argv[i + 1]) : fallback
}
const header = {
  name: 'bench-table', kind: 'hessian-pairs' as const, confidenceLevelPercent: 68, alphasMzCentral: 0.118,
  scheme: { type: 'fixed' as const, nf: 5 as const, massesGeV: { charm: 1.5, bottom: 4.75, top: 173 } },
  target: { type: 'proton' as const }, provenance: 'benchmark table (made-up numbers)'
}
const mib = (bytes: number) => `${(bytes / 1048576).toFixed(1)} MiB`

async function writeTable(path: string, members: number, nx: number, nq: number, gzip: boolean) {
  const file = createWriteStream(path)
  const out = gzip ? createGzip() : file
  if (gzip) out.pipe(file)
  const xs = Array.from({ length: nx }, (_, i) => 1e-5 * (0.95 / 1e-5) ** (i / (nx - 1)))
  const qs = Array.from({ length: nq }, (_, i) => 2 * (1e5 / 2) ** (i / (nq - 1)))
  let chunk = 'member,x,q2,pdg,xf\r\n'
  for (let m = 0; m < members; m++) {
    for (const q of qs) {
      for (const x of xs) {
        for (const f of FLAVOURS) chunk += `${m},${x},${q},${f},${(1 + m * 1e-3) * x ** 0.3 * (1 - x) ** 3 * (1 + Math.abs(f) / 7) * Math.log(q)}\r\n`
        if (chunk.length > 1 << 20) {
          if (!out.write(chunk)) await once(out, 'drain')
          chunk = ''
        }
      }
    }
  }
  out.end(chunk)
  await once(file, 'close')
}

async function importOnly(path: string) {
  const before = process.memoryUsage().rss
  const t0 = performance.now()
  const { bytes, stats } = await readSetTable(path, path.endsWith('.gz') ? 'bench.csv.gz' : 'bench.csv', header, 1 << 30)
  const seconds = (performance.now() - t0) / 1000
  const peak = process.resourceUsage().maxRSS * 1024
  console.log(JSON.stringify({ seconds, fileBytes: stats.fileBytes, records: stats.records, setBytes: bytes.byteLength, before, peak }))
}

async function readerRatio(path: string, limitBytes: number) {
  // csv-parse on the first `limitBytes`, then our reader on the same rows.
  const t0 = performance.now()
  let rows = 0
  const parser = createReadStream(path, { end: limitBytes }).pipe(parse({ info: true, relax_column_count: true }))
  for await (const _ of parser) rows++
  const csvParse = performance.now() - t0
  const source = await delimitedSource(path, 'csv', false)
  const t1 = performance.now()
  let ours = 0
  await source.read(() => { if (++ours >= rows) throw new Error('enough') }).catch(() => undefined)
  return { rows, csvParseMs: csvParse, oursMs: performance.now() - t1 }
}

async function main() {
  if (process.argv[2] === '--import-only') return importOnly(process.argv[3]!)
  const members = arg('members', 101)
  const nx = arg('nx', 100)
  const nq = arg('nq', 30)
  const gzip = process.argv.includes('--gzip')
  const dir = mkdtempSync(join(tmpdir(), 'sheaf-bench-table-'))
  try {
    const path = join(dir, gzip ? 'bench.csv.gz' : 'bench.csv')
    await writeTable(path, members, nx, nq, gzip)
    const size = statSync(path).size
    console.log(`table: ${members} members × ${nq} Q² × ${nx} x × ${FLAVOURS.length} flavours, ${mib(size)}${gzip ? ' gzipped' : ''} (load average ${loadavg().map(l => l.toFixed(1)).join(' ')})`)
    const child = spawnSync(process.execPath, [...process.execArgv, process.argv[1]!, '--import-only', path], { encoding: 'utf8', maxBuffer: 1 << 20 })
    if (child.status !== 0) throw new Error(child.stderr)
    const r = JSON.parse(child.stdout.trim().split('\n').pop()!)
    console.log(`import: ${r.records} rows in ${r.seconds.toFixed(1)} s = ${Math.round(r.records / r.seconds)} rows/s, ${(r.fileBytes / 1048576 / r.seconds).toFixed(1)} MiB/s of file (two passes)`)
    console.log(`memory: ${mib(r.before)} before, ${mib(r.peak)} peak (+${mib(r.peak - r.before)}); the set file is ${mib(r.setBytes)}, the table ${mib(r.fileBytes)}`)
    if (!gzip) {
      const ratio = await readerRatio(path, 20 * 1048576)
      console.log(`reader: ${ratio.rows} rows: csv-parse ${ratio.csvParseMs.toFixed(0)} ms, ours ${ratio.oursMs.toFixed(0)} ms, ${(ratio.csvParseMs / ratio.oursMs).toFixed(1)}× faster`)
    }
  } finally {
    rmSync(dir, { recursive: true, force: true })
  }
}

void main()
