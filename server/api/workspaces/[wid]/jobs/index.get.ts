import { countJobs, listJobs } from '../../../../domain/jobs/list'

// The workspace's queued work, newest first: study runs and set builds with their progress,
// filtered by ?kind=run|build and ?state=, at most ?limit= (default 100); counts of every state.
export default defineEventHandler(async (event) => {
  const { workspace } = await requireWorkspace(event, 'viewer')
  const filter = queryValid(event, jobsQuerySchema)
  const db = useDB()
  const [jobs, counts] = await Promise.all([listJobs(db, workspace.id, filter), countJobs(db, workspace.id)])
  return { jobs, counts }
})
