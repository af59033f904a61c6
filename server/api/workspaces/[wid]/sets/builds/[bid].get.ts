import { publicSetBuild } from '../../../../../domain/sets/builds'
// A set build's state and progress (members built / total) and, once done, the new set's id.
export default defineEventHandler(async (event) => {
  const { build } = await requireSetBuild(event, 'viewer')
  return publicSetBuild(build)
})
