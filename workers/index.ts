// The queue worker: plain Node (tsx), started beside the Nuxt server by scripts/start.sh.
// Env: DATABASE_URL, REDIS_URL (server/domain/settings.ts). SIGTERM/SIGINT drain running jobs.
import { Worker } from 'bullmq'
import IORedis from 'ioredis'
import { createDB } from '../server/database/client'
import { logText } from '../server/domain/log-text'
import { readSettings } from '../server/domain/settings'
import { BUILD_SET_QUEUE, IMPACT_UPDATE_QUEUE, RUN_STUDY_QUEUE } from '../shared/queue/workflow'
import { buildSetJob, runStudyJob } from './handlers'
import { impactUpdateJob } from './impact-update'

const settings = readSettings()
const db = createDB(settings.databaseUrl, 4)
const connection = new IORedis(settings.redisUrl, { maxRetriesPerRequest: null })

const workers = [
  new Worker(RUN_STUDY_QUEUE, job => runStudyJob(db, settings, job), { connection, concurrency: 2 }),
  new Worker(BUILD_SET_QUEUE, job => buildSetJob(db, settings, job), { connection, concurrency: 1 }),
  // set updates by a measurement (workers/impact-update.ts)
  new Worker(IMPACT_UPDATE_QUEUE, job => impactUpdateJob(db, job), { connection, concurrency: 1 })
]

for (const w of workers) {
  w.on('failed', (job, err) => console.error(`[worker] ${w.name} ${job?.id} failed: ${logText(err)}`))
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
