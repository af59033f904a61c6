import { prescriptionsFor } from '../../../../../../shared/physics/uncertainty/bands'
import { assertQ2Inside, assertXInside } from '../../../../../domain/sets/library'
import { loadErrorSet } from '../../../../../domain/sets/store'
import { densityOf } from '../../../../../../shared/physics/fragmentation/species'
import { densityText } from '../../../../../../shared/physics/sets/density-words'
import { densityBands, linearSpacedX, logSpacedX } from '../../../../../domain/sets/densities'
import { setPrescription } from '../../../../../domain/results/results'
import { engineRejection, fail } from '../../../../../domain/errors'
import { findSet } from '../../../../../domain/lookups'

// x·f(x, Q²) of chosen flavours (?flavours=21,2,-2,uv …) at ?q2= with the set's band
// (?prescription=, default by kind; ?cl=, default 68), on ?points= x values spaced evenly in ln x
// or x (?spacing=log|linear), and with ?ratioTo=<set id> the band divided by that set's central
// member. ?x= gives one x instead of the spaced points (422 outside the grid). For a
// fragmentation set the same for z·D(z, Q²): x is read as z, the valence combinations uv, dv do
// not apply, and a ratio needs another set of the same density.
export default defineEventHandler(async (event) => {
  const { workspace, set: row } = await requireSet(event, 'viewer')
  const workspaceId = workspace.id
  const query = queryValid(event, densitiesQuerySchema)
  const reference = query.ratioTo ? await findSet(useDB(), workspaceId, query.ratioTo) : null
  const density = densityOf(row.header)
  if (density.type === 'fragmentation' && query.flavours.some(f => typeof f === 'string')) {
    fail(400, `${row.name} holds ${densityText(row.header)}: the valence combinations uv and dv are for parton densities; ask for PDG codes`, { fields: { flavours: 'uv and dv are for parton densities' } })
  }
  if (reference && JSON.stringify(densityOf(reference.header)) !== JSON.stringify(density)) {
    fail(400, `ratioTo: ${reference.name} holds ${densityText(reference.header)} and ${row.name} holds ${densityText(row.header)}; a ratio needs two sets of the same density`, { fields: { ratioTo: `${reference.name} holds ${densityText(reference.header)}` } })
  }
  assertQ2Inside(query.q2, Math.max(row.q2Min, reference?.q2Min ?? 0), Math.min(row.q2Max, reference?.q2Max ?? Infinity))
  const prescription = setPrescription(row.kind, query.prescription)
  const clPercent = query.cl ?? 68
  const [xLo, xHi] = [Math.max(row.xMin, reference?.xMin ?? 0), Math.min(row.xMax, reference?.xMax ?? 1)]
  if (query.x !== undefined) assertXInside(query.x, xLo, xHi)
  const x = query.x !== undefined ? Float64Array.of(query.x) : (query.spacing === 'linear' ? linearSpacedX : logSpacedX)(xLo, xHi, query.points)
  const db = useDB()
  const set = await loadErrorSet(db, row.id)
  const ref = reference ? await loadErrorSet(db, reference.id) : undefined
  try {
    return {
      setId: row.id, density, q2GeV2: query.q2, spacing: query.spacing, prescription, clPercent, available: prescriptionsFor(row.kind),
      ratioTo: reference ? { id: reference.id, name: reference.name, version: reference.version } : null,
      x: Array.from(x),
      flavours: densityBands(set, { q2GeV2: query.q2, flavours: query.flavours, x, prescription, clPercent }, ref)
    }
  } catch (err) {
    throw engineRejection(err, 'The densities cannot be evaluated')
  }
})
