// Combine the newest finished results of several sets of one study (?setIds=a,b; default all):
// each set's band, their envelope, and the Monte-Carlo pooled combination (?replicasPerSet=,
// ?seed=), all at ?cl= (default the study's CL).
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  const studyId = uuidParam(event, 'id', 'Study')
  const query = queryValid(event, comparisonQuerySchema)
  const { study } = await requireStudy(workspaceId, studyId, user.id, 'viewer')
  const sets = await comparedSets(study, query.setIds)
  try {
    return combineSets(sets, study, query.cl ?? study.clPercent, query.replicasPerSet, query.seed)
  } catch (err) {
    throw engineRejection(err, 'The sets cannot be combined')
  }
})
