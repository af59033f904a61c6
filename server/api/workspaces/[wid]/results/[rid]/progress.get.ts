import { progressOf } from '../../../../../domain/studies/studies'
// State and progress only (members done / total): cheap enough to poll every half second.
export default defineEventHandler(async (event) => {
  const { result } = await requireResult(event, 'viewer')
  return progressOf(result)
})
