import { eq } from 'drizzle-orm'
import { tables as t } from '../../../../database/client'
import { assertSetNameFree, publicSet, setColumns, userBrief, whileSetNameFree } from '../../../../domain/sets/library'
import { audit } from '../../../../domain/audit'
import { fail } from '../../../../domain/errors'

// Rename an error set (analysts). The name and version stay unique in the workspace: a rename
// racing another for the same name answers 409. The new name and its audit event are written
// together or not at all.
export default defineEventHandler(async (event) => {
  const { user, workspace, set } = await requireSet(event, 'analyst')
  const workspaceId = workspace.id
  const { name } = await readValid(event, setRenameSchema)
  await assertSetNameFree(useDB(), workspaceId, name, set.version, set.id)
  const row = await whileSetNameFree(name, set.version, () => useDB().transaction(async (tx) => {
    const [renamed] = await tx.update(t.errorSets).set({ name }).where(eq(t.errorSets.id, set.id)).returning(setColumns)
    if (!renamed) fail(404, 'Error set not found')
    await audit(tx, { workspaceId, actorId: user.id, action: 'set.renamed', subjectType: 'error_set', subjectId: set.id, detail: { from: set.name, to: name } })
    return renamed
  }))
  const addedBy = await userBrief(useDB(), row.addedBy)
  return publicSet(row, addedBy && { id: addedBy.id, name: addedBy.name })
})
