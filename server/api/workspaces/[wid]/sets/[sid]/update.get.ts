import { publicUpdate, updateOfSet } from '../../../../../domain/impact/updates'
// The set update (reweighting, profiling) that saved this set, or null for an uploaded or built set (viewers).
export default defineEventHandler(async (event) => {
  const { set, workspace } = await requireSet(event, 'viewer')
  const update = await updateOfSet(useDB(), workspace.id, set.id)
  return { update: update ? publicUpdate(update) : null }
})
