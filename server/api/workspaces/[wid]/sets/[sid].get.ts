// One error set: metadata, the full header, and how many results use it.
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  const setId = uuidParam(event, 'sid', 'Error set')
  const { set } = await requireSet(workspaceId, setId, user.id, 'viewer')
  const addedBy = await userBrief(set.addedBy)
  return {
    ...publicSet(set, addedBy && { id: addedBy.id, name: addedBy.name }, true),
    resultCount: await resultsUsingSet(set.id)
  }
})
