import { publicSet, resultsUsingSet, userBrief } from '../../../../domain/sets/library'
// One error set: metadata, the full header, and how many results use it.
export default defineEventHandler(async (event) => {
  const { set } = await requireSet(event, 'viewer')
  const addedBy = await userBrief(useDB(), set.addedBy)
  return {
    ...publicSet(set, addedBy && { id: addedBy.id, name: addedBy.name }, true),
    resultCount: await resultsUsingSet(useDB(), set.id)
  }
})
