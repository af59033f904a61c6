import { cancelSetBuild, publicSetBuild } from '../../../../../../domain/sets/builds'
// Cancel a queued or running set build (analysts).
export default defineEventHandler(async (event) => {
  const { build } = await requireSetBuild(event, 'analyst')
  return publicSetBuild(await cancelSetBuild(useDB(), useQueue, build))
})
