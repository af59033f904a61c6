import { publicUpdate, startImpactUpdate } from '../../../../../../domain/impact/updates'
// Update one of the study's sets by one of its measurements (analysts): reweighting for a replica
// set, profiling for a Hessian set. Checked now (located 4xx, nothing stored or queued when
// refused); the derived set is built and saved to the library by the impact-update job.
export default defineEventHandler(async (event) => {
  const { user, study } = await requireStudy(event, 'analyst')
  const body = await readValid(event, impactUpdateSchema)
  const update = await startImpactUpdate(useDB(), useQueue, study, user.id, body)
  setResponseStatus(event, 202)
  return publicUpdate(update)
})
