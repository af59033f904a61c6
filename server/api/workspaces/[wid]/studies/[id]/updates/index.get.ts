import { listImpactUpdates, publicUpdate } from '../../../../../../domain/impact/updates'
// The study's set updates, newest first (viewers).
export default defineEventHandler(async (event) => {
  const { study } = await requireStudy(event, 'viewer')
  return { updates: (await listImpactUpdates(useDB(), study.id)).map(publicUpdate) }
})
