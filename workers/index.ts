// The queue worker: plain Node (tsx), started beside the Nuxt server by scripts/start.sh.
// Env: DATABASE_URL, REDIS_URL. SIGTERM/SIGINT drain running jobs, then exit.
import { type Job, Worker } from 'bullmq'
import IORedis from 'ioredis'
import { createDB } from '../server/database/client'
import { JOB_KINDS, QUEUES } from '../shared/queue/names'
import { BUILD_SET_QUEUE, RUN_STUDY_QUEUE } from '../shared/queue/workflow'
import { buildSetJob } from './jobs/build-set'
import { runStudyJob } from './jobs/run-study'
import { runSquare } from './jobs/square'

const databaseUrl = process.env.DATABASE_URL
const redisUrl = process.env.REDIS_URL
if (!databaseUrl || !redisUrl) throw new Error('DATABASE_URL and REDIS_URL must be set')

const db = createDB(databaseUrl, 4)
const connection = new IORedis(redisUrl, { maxRetriesPerRequest: null })

// One handler per job kind on the demo queue; the workflow adds queues and kinds here.
const demoHandlers: Record<string, (job: Job) => Promise<unknown>> = {
  [JOB_KINDS.square]: job => runSquare(db, job)
}

const workers = [
  new Worker(QUEUES.demo, async (job) => {
    const handler = demoHandlers[job.name]
    if (!handler) throw new Error(`No handler for job kind ${job.name}`)
    return handler(job)
  }, { connection, concurrency: 2 }),
  new Worker(RUN_STUDY_QUEUE, job => runStudyJob(db, job), { connection, concurrency: 2 }),
  new Worker(BUILD_SET_QUEUE, job => buildSetJob(db, job), { connection, concurrency: 1 })
]

for (const w of workers) {
  w.on('failed', (job, err) => console.error(`[worker] ${w.name} ${job?.id} failed: ${err.message}`))
  w.on('ready', () => console.log(`[worker] listening on queue ${w.name}`))
}

let closing = false
async function drain(signal: string) {
  if (closing) return
  closing = true
  console.log(`[worker] ${signal}: finishing running jobs`)
  await Promise.all(workers.map(w => w.close()))
  await connection.quit()
  await db.pool.end()
  process.exit(0)
}
process.on('SIGTERM', () => void drain('SIGTERM'))
process.on('SIGINT', () => void drain('SIGINT'))
