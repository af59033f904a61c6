import { publicResult } from '../../../../../domain/studies/studies'
import { startRuns } from '../../../../../domain/studies/runs'
// Run a study (analysts): one queued job per chosen set, each filling a new result version.
export default defineEventHandler(async (event) => {
  const { user, study } = await requireStudy(event, 'analyst')
  const body = await readValid(event, runRequestSchema)
  const results = await startRuns(useDB(), useQueue, study, body.setIds ?? study.setIds, user.id)
  setResponseStatus(event, 202)
  return { results: results.map(publicResult) }
})
