import { RESULT_CAUTION } from '../../../../../shared/export/caution'
import { prescriptionsFor } from '../../../../../shared/physics/uncertainty/bands'
import { loadResultValues, reportingChoice, resultBands, resultSetHeader, resultTrail, userNames } from '../../../../domain/results/results'
import { publicResult } from '../../../../domain/studies/studies'

// One result version: state and progress (the live bar polls this), and once finished its bands
// for ?prescription= and ?cl= (recomputed from the stored member values, no new job), the scale
// variation apart from the PDF band, the review state and the audit trail.
export default defineEventHandler(async (event) => {
  const { result, study } = await requireResult(event, 'viewer')
  const query = queryValid(event, bandsQuerySchema)
  const header = await resultSetHeader(useDB(), result)
  const choice = reportingChoice(result, header, query)
  const snapshot = result.specSnapshot
  let bands = null
  let scale = null
  if (result.state === 'done') {
    bands = await resultBands(useDB(), result, header, choice.prescription, choice.clPercent)
    scale = (await loadResultValues(useDB(), result.id)).scale
  }
  const names = await userNames(useDB(), [result.requestedBy])
  return {
    ...publicResult(result),
    study: { id: study.id, name: study.name, revision: study.revision },
    set: snapshot.set,
    second: snapshot.second,
    spec: snapshot.spec,
    requestedByName: result.requestedBy ? names.get(result.requestedBy) ?? null : null,
    reporting: { ...choice, available: prescriptionsFor(header.kind), setConfidenceLevelPercent: header.confidenceLevelPercent },
    bands,
    scaleVariation: scale,
    trail: await resultTrail(useDB(), result),
    caution: RESULT_CAUTION
  }
})
