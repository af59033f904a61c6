import { listJobs } from '../../../../domain/jobs/list'

// The workspace's queued work, newest first: study runs and set builds with their progress.
export default defineEventHandler(async (event) => {
  const { workspace } = await requireWorkspace(event, 'viewer')
  return { jobs: await listJobs(useDB(), workspace.id) }
})
