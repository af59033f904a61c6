import { cancelSetBuild, publicSetBuild } from '../../../../../../domain/sets/builds'
// Cancel a queued or running set build (analysts); the request and its audit event are one write.
export default defineEventHandler(async (event) => {
  const { user, build } = await requireSetBuild(event, 'analyst')
  return publicSetBuild(await cancelSetBuild(useDB(), useQueue, build, user.id))
})
