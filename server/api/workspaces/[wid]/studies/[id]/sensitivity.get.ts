import { studySensitivity } from '../../../../../domain/impact/sensitivity'
// cos φ between each bin of the study's newest result on a set and x·f(x, Q²) of one flavour,
// and the sensitivity when one of the study's measurements is named (viewers).
export default defineEventHandler(async (event) => {
  const { study } = await requireStudy(event, 'viewer')
  const query = queryValid(event, sensitivityQuerySchema)
  return studySensitivity(useDB(), study, query)
})
