import { publicSetBuild } from '../../../../../../domain/sets/builds'
import { rerunSetBuild } from '../../../../../../domain/jobs/rerun'
// Run a failed or cancelled set build again (analysts): a new build with the same name
// and request, queued like the first (409 while the first is queued or running, or once it is done).
export default defineEventHandler(async (event) => {
  const { user, build } = await requireSetBuild(event, 'analyst')
  const again = await rerunSetBuild(useDB(), useQueue, build, user.id)
  setResponseStatus(event, 202)
  return publicSetBuild(again)
})
