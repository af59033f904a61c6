import type { SpecSnapshot } from '../../../../utils/workflow/result-versions'
import { RESULT_CAUTION } from '../../../../../shared/export/caution'
import { prescriptionsFor } from '../../../../../shared/physics/uncertainty/bands'

// One result version: state and progress (the live bar polls this), and once finished its bands
// for ?prescription= and ?cl= (recomputed from the stored member values, no new job), the scale
// variation apart from the PDF band, the review state and the audit trail.
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  const resultId = uuidParam(event, 'rid', 'Result')
  const query = queryValid(event, bandsQuerySchema)
  const { result, study } = await requireResult(workspaceId, resultId, user.id, 'viewer')
  const header = await resultSetHeader(result)
  const choice = reportingChoice(result, header, query)
  const snapshot = result.specSnapshot as SpecSnapshot
  let bands = null
  let scale = null
  if (result.state === 'done') {
    bands = await resultBands(result, header, choice.prescription, choice.clPercent)
    scale = (await loadResultValues(result.id)).scale
  }
  const names = await userNames([result.requestedBy])
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
    trail: await resultTrail(result),
    caution: RESULT_CAUTION
  }
})
