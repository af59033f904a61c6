import { publicSetBuild, withQueuePlaces } from '../../../../../domain/sets/builds'
// A set build's state and progress (members built / total), its place on the queue while it
// waits and, once done, the new set's id.
export default defineEventHandler(async (event) => {
  const { build } = await requireSetBuild(event, 'viewer')
  const [withPlace] = await withQueuePlaces(useDB(), [build])
  return publicSetBuild(withPlace!)
})
