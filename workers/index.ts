// The queue worker: plain Node (tsx), started beside the Nuxt server by scripts/start.sh, or alone
// on any machine that reaches the same PostgreSQL and Redis (`npm run worker`) to add capacity.
// Env: DATABASE_URL, REDIS_URL (server/domain/settings.ts); SHEAF_WORKER_CONCURRENCY (jobs at
// once per queue, default 2); SHEAF_EVAL_THREADS (evaluation threads, default one per core);
// SHEAF_QUEUE_PREFIX (BullMQ key prefix, default "bull"; tests isolate their workers with it).
// SIGTERM/SIGINT drain running jobs.
import { Worker, type WorkerOptions } from 'bullmq'
import IORedis from 'ioredis'
import { createDB } from '../server/database/client'
import { logText } from '../server/domain/log-text'
import { readSettings } from '../server/domain/settings'
import { closePool, poolThreads, warmPool } from '../server/domain/studies/pool'
import { BUILD_SET_QUEUE, IMPACT_UPDATE_QUEUE, RUN_CHUNK_QUEUE, RUN_STUDY_QUEUE } from '../shared/queue/workflow'
import { buildSetJob, runChunkJob, runStudyJob, WORKER_NAME } from './handlers'
import { impactUpdateJob } from './impact-update'

/**
 * Stalled-job recovery (see DEVELOPERS.md, "Workers on many machines"): a worker renews its
 * job's lock every lockDuration / 2; a job whose lock has expired is found by the next stalled
 * check of any worker and put back to wait. Worst case after a kill -9: lockDuration +
 * stalledInterval = 13 s, within 15 s. maxStalledCount 2: a job may lose two workers before it fails.
 */
export const STALL_OPTIONS = { lockDuration: 8_000, stalledInterval: 5_000, maxStalledCount: 2 } as const

const settings = readSettings()
const concurrency = Math.max(1, Number(process.env.SHEAF_WORKER_CONCURRENCY) || 2)
const prefix = process.env.SHEAF_QUEUE_PREFIX || undefined
const db = createDB(settings.databaseUrl, concurrency * 2 + 2)
// An idle connection dropped by a PostgreSQL restart must not end the process: the job that
// needed it fails this attempt and is retried.
db.pool.on('error', err => console.error(`[worker] database connection lost: ${logText(err)}`))
const connection = new IORedis(settings.redisUrl, { maxRetriesPerRequest: null })
const common: Omit<WorkerOptions, 'concurrency'> = { connection, ...STALL_OPTIONS, ...(prefix ? { prefix } : {}), name: WORKER_NAME }

// One thread per core for the engine, started now so the first run does not wait for it.
void warmPool().then(() => console.log(`[worker] evaluation pool: ${poolThreads()} threads`), err => console.error(`[worker] evaluation pool: ${logText(err)}`))

const workers = [
  new Worker(RUN_STUDY_QUEUE, job => runStudyJob(db, settings, job), { ...common, concurrency }),
  new Worker(RUN_CHUNK_QUEUE, job => runChunkJob(db, job), { ...common, concurrency }),
  new Worker(BUILD_SET_QUEUE, job => buildSetJob(db, settings, job), { ...common, concurrency: 1 }),
  // set updates by a measurement (workers/impact-update.ts)
  new Worker(IMPACT_UPDATE_QUEUE, job => impactUpdateJob(db, job), { ...common, concurrency: 1 })
]

for (const w of workers) {
  w.on('failed', (job, err) => console.error(`[worker] ${w.name} ${job?.id} failed: ${logText(err)}`))
  w.on('ready', () => console.log(`[worker] ${WORKER_NAME} listening on queue ${w.name} (concurrency ${w.opts.concurrency})`))
  w.on('error', err => console.error(`[worker] ${w.name}: ${logText(err)}`))
}

let closing = false
async function drain(signal: string) {
  if (closing) return
  closing = true
  console.log(`[worker] ${signal}: finishing running jobs`)
  await Promise.all(workers.map(w => w.close()))
  await closePool()
  await connection.quit()
  await db.pool.end()
  process.exit(0)
}
process.on('SIGTERM', () => void drain('SIGTERM'))
process.on('SIGINT', () => void drain('SIGINT'))
