import { assertQ2Inside } from '../../../../../domain/sets/library'
import { loadErrorSet } from '../../../../../domain/sets/store'
import { sumRuleBands } from '../../../../../domain/sets/densities'
import { setPrescription } from '../../../../../domain/results/results'
import { engineRejection } from '../../../../../domain/errors'
// The momentum and valence sum-rule integrals of every member at ?q2=, with the set's band.
export default defineEventHandler(async (event) => {
  const { set: row } = await requireSet(event, 'viewer')
  const query = queryValid(event, sumRulesQuerySchema)
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
