import { JOB_KINDS, QUEUES, squareRequestSchema } from '../../../../../shared/queue/names'

// Enqueue the demo job (square numbers, one step per number) that proves the worker round trip.
export default defineEventHandler(async (event) => {
  const { user, workspace } = await requireWorkspace(event, 'analyst')
  const input = await readValid(event, squareRequestSchema)
  const job = await enqueueJob({ queue: QUEUES.demo, kind: JOB_KINDS.square, workspaceId: workspace.id, requestedBy: user.id, input })
  setResponseStatus(event, 201)
  return job
})
