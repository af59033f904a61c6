import { prescriptionsFor } from '../../../../../../shared/physics/uncertainty/bands'
import { assertQ2Inside, assertXInside } from '../../../../../domain/sets/library'
import { loadErrorSet } from '../../../../../domain/sets/store'
import { densityBands, logSpacedX } from '../../../../../domain/sets/densities'
import { setPrescription } from '../../../../../domain/results/results'
import { engineRejection } from '../../../../../domain/errors'
import { findSet } from '../../../../../domain/lookups'

// x·f(x, Q²) of chosen flavours (?flavours=21,2,-2,uv …) at ?q2= with the set's band
// (?prescription=, default by kind; ?cl=, default 68), on ?points= log-spaced x values, and with
// ?ratioTo=<set id> the band divided by that set's central member. ?x= gives one x instead of the
// log-spaced points (422 outside the grid).
export default defineEventHandler(async (event) => {
  const { workspace, set: row } = await requireSet(event, 'viewer')
  const workspaceId = workspace.id
  const query = queryValid(event, densitiesQuerySchema)
  const reference = query.ratioTo ? await findSet(useDB(), workspaceId, query.ratioTo) : null
  assertQ2Inside(query.q2, Math.max(row.q2Min, reference?.q2Min ?? 0), Math.min(row.q2Max, reference?.q2Max ?? Infinity))
  const prescription = setPrescription(row.kind, query.prescription)
  const clPercent = query.cl ?? 68
  const [xLo, xHi] = [Math.max(row.xMin, reference?.xMin ?? 0), Math.min(row.xMax, reference?.xMax ?? 1)]
  if (query.x !== undefined) assertXInside(query.x, xLo, xHi)
  const x = query.x !== undefined ? Float64Array.of(query.x) : logSpacedX(xLo, xHi, query.points)
  const db = useDB()
  const set = await loadErrorSet(db, row.id)
  const ref = reference ? await loadErrorSet(db, reference.id) : undefined
  try {
    return {
      setId: row.id, q2GeV2: query.q2, prescription, clPercent, available: prescriptionsFor(row.kind),
      ratioTo: reference ? { id: reference.id, name: reference.name, version: reference.version } : null,
      x: Array.from(x),
      flavours: densityBands(set, { q2GeV2: query.q2, flavours: query.flavours, x, prescription, clPercent }, ref)
    }
  } catch (err) {
    throw engineRejection(err, 'The densities cannot be evaluated')
  }
})
