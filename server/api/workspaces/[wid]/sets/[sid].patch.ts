import { eq } from 'drizzle-orm'
import { z } from 'zod'
import { tables as t } from '../../../../database/client'
import { assertSetNameFree, publicSet, setColumns, userBrief } from '../../../../domain/sets/library'
import { audit } from '../../../../domain/audit'

const SetPatch = z.object({
  name: z.string({ error: 'Give the new name' }).trim().min(1, 'The name cannot be empty').max(120, 'Keep the name under 120 characters')
}).strict()

// Rename an error set (analysts). The name and version stay unique in the workspace.
export default defineEventHandler(async (event) => {
  const { user, workspace, set } = await requireSet(event, 'analyst')
  const workspaceId = workspace.id
  const { name } = await readValid(event, SetPatch)
  await assertSetNameFree(useDB(), workspaceId, name, set.version, set.id)
  const [row] = await useDB().update(t.errorSets).set({ name }).where(eq(t.errorSets.id, set.id)).returning(setColumns)
  await audit(useDB(), { workspaceId, actorId: user.id, action: 'set.renamed', subjectType: 'error_set', subjectId: set.id, detail: { from: set.name, to: name } })
  const addedBy = await userBrief(useDB(), row!.addedBy)
  return publicSet(row!, addedBy && { id: addedBy.id, name: addedBy.name })
})
