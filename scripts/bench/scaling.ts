/**
 * Throughput of runs against the number of worker processes on one Redis and PostgreSQL:
 * `DATABASE_URL=… REDIS_URL=… npx tsx scripts/bench/scaling.ts [runs] [workers…]` (defaults:
 * 6 runs, with 1, 2 and 3 workers). Each run is a 101-member toy replica set on 3000 DIS bins,
 * queued as a flow of member chunks (the same path as the app's Run); each worker runs one job at
 * a time on one evaluation thread, on its own BullMQ prefix. Prints runs per minute, and the
 * PostgreSQL and Redis traffic per run, from which the limits are estimated. A measurement:
 * always exits 0. Leaves a workspace named "scaling benchmark" behind in the database.
 */
import { randomUUID } from 'node:crypto'
import { spawn, type ChildProcess } from 'node:child_process'
import { Queue } from 'bullmq'
import IORedis from 'ioredis'
import { eq, inArray } from 'drizzle-orm'
import { createDB, tables as t } from '../../server/database/client'
import { addRunFlow, runChunks } from '../../server/domain/jobs/queue'
import { insertErrorSet } from '../../server/domain/sets/store'
import { toyErrorSet, toyQ2Nodes, toyXNodes } from '../../shared/physics/sets/toy'
import { writeSetFile } from '../../shared/physics/sets/write'
import { parseStudySpec } from '../../shared/physics/study/spec'
import { RUN_STUDY_QUEUE } from '../../shared/queue/workflow'

const BINS = 3000
const runs = Number(process.argv[2] ?? 6)
const counts = process.argv.slice(3).map(Number)
const workerCounts = counts.length ? counts : [1, 2, 3]
const db = createDB(process.env.DATABASE_URL!, 4)
const redis = new IORedis(process.env.REDIS_URL!, { maxRetriesPerRequest: null })

function startWorker(name: string, prefix: string): Promise<ChildProcess> {
  const child = spawn('node_modules/.bin/tsx', ['workers/index.ts'], {
    stdio: ['ignore', 'pipe', 'pipe'],
    env: { ...process.env, SHEAF_QUEUE_PREFIX: prefix, SHEAF_WORKER_NAME: name, SHEAF_WORKER_CONCURRENCY: '1', SHEAF_EVAL_THREADS: '1', SHEAF_MAIL_AFTER_MS: '600000' }
  })
  let text = ''
  child.stdout!.on('data', (d: Buffer) => { text += d.toString() })
  child.stderr!.on('data', (d: Buffer) => { text += d.toString() })
  return new Promise((resolve, reject) => {
    const timer = setInterval(() => {
      if ((text.match(/listening on queue/g) ?? []).length >= 3 && text.includes('evaluation pool')) { clearInterval(timer); resolve(child) }
      if (child.exitCode !== null) { clearInterval(timer); reject(new Error(text)) }
    }, 100)
  })
}

async function main() {
  const [user] = await db.insert(t.users).values({ email: `scaling-${randomUUID()}@example.org`, name: 'Scaling benchmark', passwordHash: 'x', emailVerifiedAt: new Date() }).returning()
  const [ws] = await db.insert(t.workspaces).values({ name: 'scaling benchmark', createdBy: user!.id }).returning()
  const set = toyErrorSet({
    kind: 'replicas', errorMembers: 100, name: `scaling-${randomUUID().slice(0, 6)}`, x: toyXNodes(40, 1e-5, 0.95),
    q2: toyQ2Nodes({ q2MinGeV2: 2, q2MaxGeV2: 1e5, count: 16, thresholdsGeV2: [1.5 ** 2, 4.75 ** 2] }),
    scheme: { type: 'variable', nf: 5, massesGeV: { charm: 1.5, bottom: 4.75, top: 173 } }
  })
  const setId = await insertErrorSet(db, { workspaceId: ws!.id, name: set.header.name, fileName: 'scaling.sheafset', bytes: writeSetFile(set), origin: 'upload', addedBy: user!.id })
  const spec = parseStudySpec({ kernel: 'dis-nc-f2', bins: Array.from({ length: BINS }, (_, i) => ({ x: 1e-4 * 5000 ** ((i % 60) / 60), q2: 10 + Math.floor(i / 60) * 200 })) })
  const [study] = await db.insert(t.studies).values({ workspaceId: ws!.id, name: 'scaling', spec, setIds: [setId], clPercent: 68, createdBy: user!.id }).returning()
  let version = 0
  console.log(`Worker scaling — ${runs} runs of 101 members × ${BINS} DIS bins each, as flows of ${runChunks(101).length} chunks; one job and one thread per worker`)
  for (const n of workerCounts) {
    const prefix = `scale${randomUUID().slice(0, 8)}`
    const workers = await Promise.all(Array.from({ length: n }, (_, k) => startWorker(`s${k + 1}`, prefix)))
    const queue = new Queue(RUN_STUDY_QUEUE, { connection: redis, prefix })
    const ids: string[] = []
    const before = await redis.info('stats')
    const t0 = performance.now()
    for (let r = 0; r < runs; r++) {
      version += 1
      const [row] = await db.insert(t.results).values({
        studyId: study!.id, setId, version, studyRevision: 1, membersTotal: 101, binCount: BINS, requestedBy: user!.id,
        specSnapshot: { studyName: 'scaling', spec, prescription: 'auto', clPercent: 68, set: { id: setId, name: set.header.name, version: set.header.version, family: set.header.family, kind: set.header.kind, memberCount: 101, confidenceLevelPercent: set.header.confidenceLevelPercent }, second: null }
      }).returning()
      ids.push(row!.id)
      await addRunFlow(queue, row!.id, { resultId: row!.id }, runChunks(101))
    }
    for (;;) {
      const rows = await db.select({ state: t.results.state }).from(t.results).where(inArray(t.results.id, ids))
      if (rows.every(r => r.state !== 'queued' && r.state !== 'running')) break
      await new Promise(r => setTimeout(r, 200))
    }
    const seconds = (performance.now() - t0) / 1000
    const after = await redis.info('stats')
    const stat = (text: string, key: string) => Number(new RegExp(`${key}:(\\d+)`).exec(text)?.[1] ?? 0)
    const commands = stat(after, 'total_commands_processed') - stat(before, 'total_commands_processed')
    const netIn = stat(after, 'total_net_input_bytes') - stat(before, 'total_net_input_bytes')
    const done = (await db.select({ state: t.results.state }).from(t.results).where(inArray(t.results.id, ids))).filter(r => r.state === 'done').length
    const [values] = await db.select({ values: t.resultValues.values }).from(t.resultValues).where(eq(t.resultValues.resultId, ids[0]!))
    console.log(`  ${n} worker${n > 1 ? 's' : ''}: ${done}/${runs} done in ${seconds.toFixed(1)} s = ${(60 * runs / seconds).toFixed(1)} runs/min; per run ${Math.round(commands / runs)} Redis commands, ${(netIn / runs / 2 ** 20).toFixed(1)} MiB into Redis, ${((values?.values.byteLength ?? 0) / 2 ** 20).toFixed(1)} MiB of values into PostgreSQL`)
    const chunks = new Queue(`${RUN_STUDY_QUEUE}-chunk`, { connection: redis, prefix })
    for (const q of [queue, chunks]) {
      await q.obliterate({ force: true }).catch(() => {})
      await q.close()
    }
    await Promise.all(workers.map(w => new Promise(r => { w.once('exit', r); w.kill('SIGTERM') })))
  }
  await redis.quit()
  await db.pool.end()
}

await main()
