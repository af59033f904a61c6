// Running ended work again from the job monitor: a build with the same name and request.
// (A run is re-run through the study's Run, which makes the next result version.)
import type { DB } from '../../database/client'
import type { SetBuild } from '../../database/schema'
import { fail } from '../errors'
import type { QueueSource } from './queue'
import { startSetBuild } from '../sets/builds'

/**
 * Queues a new build of a failed or cancelled build `b`'s name and request. 409 while `b` is
 * queued or running, and once it is done (its set exists under that name).
 */
export async function rerunSetBuild(db: DB, queues: QueueSource, b: SetBuild, userId: string) {
  if (b.state === 'queued' || b.state === 'running') {
    fail(409, `This build is ${b.state}; cancel it or wait for it to end before running it again`)
  }
  if (b.state === 'done') {
    fail(409, 'This build has finished and its set is in the library; build under another name to make a new one')
  }
  return startSetBuild(db, queues, b.workspaceId, userId, b.name, b.request)
}
