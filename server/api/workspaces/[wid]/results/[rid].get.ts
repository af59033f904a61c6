import { cautionOfKernel } from '../../../../../shared/export/caution'
import { prescriptionsFor } from '../../../../../shared/physics/uncertainty/bands'
import { loadResultScale, reportingChoice, resultBands, resultSetHeader, resultTrail, userNames } from '../../../../domain/results/results'
import { bandsPage, binPage, scalePage, specPage } from '../../../../domain/results/page'
import { cachedBands, cachedScale } from '../../../../domain/results/cache'
import { kFactorView } from '../../../../domain/results/k-factors'
import { publicResult } from '../../../../domain/studies/studies'

// One result version: state and progress (the live bar polls this), and once finished its bands
// for ?prescription= and ?cl= (computed on the server from the stored member values, no new job;
// the member values themselves are never sent), the scale variation apart from the PDF band, the
// review state and the audit trail. Past a few thousand bins one page of bins at a time
// (?binsOffset=&binsLimit=, `bins` says which); the spec's bins are those of the page. With
// K-factors, `kFactors` gives them and their uncertainty on the page's bins, apart from the band.
export default defineEventHandler(async (event) => {
  const { result, study } = await requireResult(event, 'viewer')
  const query = queryValid(event, resultQuerySchema)
  const db = useDB()
  const snapshot = result.specSnapshot
  const page = binPage(snapshot.spec.bins.length, query)
  const [header, names, trail] = await Promise.all([
    resultSetHeader(db, result), userNames(db, [result.requestedBy]), resultTrail(db, result)
  ])
  const choice = reportingChoice(result, header, query)
  let bands = null
  let scale = null
  let kFactors = null
  if (result.state === 'done') {
    const [all, allScale] = await Promise.all([
      cachedBands(result.id, choice.prescription, choice.clPercent, () => resultBands(db, result, header, choice.prescription, choice.clPercent)),
      cachedScale(result.id, () => loadResultScale(db, result.id))
    ])
    bands = bandsPage(all, page)
    scale = allScale ? scalePage(allScale, page) : null
    kFactors = kFactorView(snapshot.spec, bands, choice.clPercent, page)
  }
  return {
    ...publicResult(result),
    study: { id: study.id, name: study.name, revision: study.revision },
    set: snapshot.set,
    second: snapshot.second,
    spec: specPage(snapshot.spec, page),
    bins: page,
    requestedByName: result.requestedBy ? names.get(result.requestedBy) ?? null : null,
    reporting: { ...choice, available: prescriptionsFor(header.kind), setConfidenceLevelPercent: header.confidenceLevelPercent },
    bands,
    scaleVariation: scale,
    kFactors,
    trail,
    caution: cautionOfKernel(Boolean(snapshot.spec.kFactors), snapshot.spec.kernel, snapshot.second?.variation ?? (snapshot.second ? 'central' : undefined))
  }
})
