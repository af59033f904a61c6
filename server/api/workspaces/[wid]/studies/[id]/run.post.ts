// Run a study (analysts): one queued job per chosen set, each filling a new result version.
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  const studyId = uuidParam(event, 'id', 'Study')
  const body = await readValid(event, runRequestSchema)
  const { study } = await requireStudy(workspaceId, studyId, user.id, 'analyst')
  const results = await startRuns(study, body.setIds ?? study.setIds, user.id)
  setResponseStatus(event, 202)
  return { results: results.map(publicResult) }
})
