import { inArray } from 'drizzle-orm'
import { tables as t } from '../../../../database/client'
import { addExampleSets } from '../../../../domain/examples/examples'
import { publicSet, setColumns } from '../../../../domain/sets/library'

// Adds the example (TOY) error sets to the workspace's library (analysts), once: 201 with the
// example sets and how many were added (0 when they were there already).
export default defineEventHandler(async (event) => {
  const { user, workspace } = await requireWorkspace(event, 'analyst')
  const { ids, added } = await addExampleSets(useDB(), workspace.id, user.id)
  const rows = ids.length ? await useDB().select(setColumns).from(t.errorSets).where(inArray(t.errorSets.id, ids)) : []
  setResponseStatus(event, added ? 201 : 200)
  return { added, sets: rows.map(r => publicSet(r, null)) }
})
