// The momentum and valence sum-rule integrals of every member at ?q2=, with the set's band.
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  const setId = uuidParam(event, 'sid', 'Error set')
  const query = queryValid(event, sumRulesQuerySchema)
  const { set: row } = await requireSet(workspaceId, setId, user.id, 'viewer')
  assertQ2Inside(query.q2, row.q2Min, row.q2Max)
  const prescription = setPrescription(row.kind, query.prescription)
  const clPercent = query.cl ?? 68
  const set = await loadErrorSet(useDB(), row.id)
  try {
    return { setId: row.id, q2GeV2: query.q2, prescription, clPercent, rules: sumRuleBands(set, query.q2, prescription, clPercent) }
  } catch (err) {
    throw engineRejection(err, 'The sum rules cannot be evaluated')
  }
})
