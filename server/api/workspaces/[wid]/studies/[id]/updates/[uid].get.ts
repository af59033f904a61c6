import { publicUpdate } from '../../../../../../domain/impact/updates'
// One set update with its progress and, once done, its summary (viewers).
export default defineEventHandler(async (event) => {
  const { update } = await requireImpactUpdate(event, 'viewer')
  return publicUpdate(update)
})
