import { eq, sql } from 'drizzle-orm'
import { tables as t } from '../../../../database/client'

// Delete an error set (owners), refused while any result was computed with it.
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  const setId = uuidParam(event, 'sid', 'Error set')
  const { set } = await requireSet(workspaceId, setId, user.id, 'owner')
  const used = await resultsUsingSet(set.id)
  if (used > 0) {
    throw createError({ statusCode: 409, statusMessage: `${set.name} is used by ${used} result${used > 1 ? 's' : ''}; delete those studies' results first`, data: { resultCount: used } })
  }
  await useDB().transaction(async (tx) => {
    // Studies keep their other sets; this one leaves their list.
    await tx.update(t.studies).set({ setIds: sql`array_remove(${t.studies.setIds}, ${set.id}::uuid)` })
      .where(sql`${set.id}::uuid = any(${t.studies.setIds})`)
    await tx.delete(t.errorSets).where(eq(t.errorSets.id, set.id))
    await audit({ workspaceId, actorId: user.id, action: 'set.deleted', subjectType: 'error_set', subjectId: set.id, detail: { name: set.name, version: set.version } }, tx)
  })
  return { deleted: set.id }
})
