import { combineSets, comparedSets } from '../../../../../domain/measurements/comparison'
import { engineRejection } from '../../../../../domain/errors'
// Combine the newest finished results of several sets of one study (?setIds=a,b; default all):
// each set's band, their envelope, and the Monte-Carlo pooled combination (?replicasPerSet=,
// ?seed=), all at ?cl= (default the study's CL).
export default defineEventHandler(async (event) => {
  const { study } = await requireStudy(event, 'viewer')
  const query = queryValid(event, comparisonQuerySchema)
  const sets = await comparedSets(useDB(), study, query.setIds)
  try {
    return combineSets(sets, study, query.cl ?? study.clPercent, query.replicasPerSet, query.seed)
  } catch (err) {
    throw engineRejection(err, 'The sets cannot be combined')
  }
})
