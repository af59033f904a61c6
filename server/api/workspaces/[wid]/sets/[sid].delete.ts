import { eq, sql } from 'drizzle-orm'
import { tables as t } from '../../../../database/client'
import { resultsUsingSet } from '../../../../domain/sets/library'
import { audit } from '../../../../domain/audit'
import { fail } from '../../../../domain/errors'

// Delete an error set (owners), refused while any result was computed with it.
export default defineEventHandler(async (event) => {
  const { user, workspace, set } = await requireSet(event, 'owner')
  const workspaceId = workspace.id
  const used = await resultsUsingSet(useDB(), set.id)
  if (used > 0) {
    fail(409, `${set.name} is used by ${used} result${used > 1 ? 's' : ''}; delete those studies' results first`, { resultCount: used })
  }
  await useDB().transaction(async (tx) => {
    // Studies keep their other sets; this one leaves their list.
    await tx.update(t.studies).set({ setIds: sql`array_remove(${t.studies.setIds}, ${set.id}::uuid)` })
      .where(sql`${set.id}::uuid = any(${t.studies.setIds})`)
    await tx.delete(t.errorSets).where(eq(t.errorSets.id, set.id))
    await audit(tx, { workspaceId, actorId: user.id, action: 'set.deleted', subjectType: 'error_set', subjectId: set.id, detail: { name: set.name, version: set.version } })
  })
  return { deleted: set.id }
})
