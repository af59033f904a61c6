import { cancelImpactUpdate, publicUpdate } from '../../../../../../../domain/impact/updates'
// Cancel a queued or running set update (analysts); the request and its audit event are one write.
export default defineEventHandler(async (event) => {
  const { user, update } = await requireImpactUpdate(event, 'analyst')
  return publicUpdate(await cancelImpactUpdate(useDB(), useQueue, update, user.id))
})
