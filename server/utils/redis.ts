import { Queue } from 'bullmq'
import IORedis from 'ioredis'

let redis: IORedis | undefined
const queues = new Map<string, Queue>()

/** The process-wide Redis connection (throttle counters, queue producers, health). */
export function useRedis(): IORedis {
  // BullMQ requires maxRetriesPerRequest: null on connections it uses.
  redis ??= new IORedis(useSettings().redisUrl, { maxRetriesPerRequest: null, lazyConnect: false })
  return redis
}

/** A BullMQ producer for `name`, created once per process. */
export function useQueue(name: string): Queue {
  let q = queues.get(name)
  if (!q) {
    q = new Queue(name, { connection: useRedis() })
    queues.set(name, q)
  }
  return q
}
