import { engineMeasurement, measurementCovariance, type MeasurementData } from '../../../../../../../../shared/measurements/csv'
import { chiSquares, comparedSets } from '../../../../../../../domain/measurements/comparison'
import { publicMeasurement } from '../../../../../../../domain/measurements/measurements'
import { fail } from '../../../../../../../domain/errors'

// χ² of the measurement against the newest finished result on each set (?setIds=; default all),
// with the experimental covariance alone and with the PDF covariance added, the point count, the
// data with its errors, the bins the results ran on and each set's band at the study's CL.
export default defineEventHandler(async (event) => {
  const { study, measurement } = await requireMeasurement(event, 'viewer')
  const query = queryValid(event, chi2QuerySchema)
  const sets = await comparedSets(useDB(), study, query.setIds)
  const data = measurement.data as MeasurementData
  if (sets[0]!.matrix.bins !== data.values.length) {
    fail(409, `The results have ${sets[0]!.matrix.bins} bins but the measurement has ${data.values.length} points; upload a measurement for the current bins`)
  }
  // The data with one standard deviation per point (the covariance's diagonal) for the plot and the pulls.
  const n = data.values.length
  const covariance = measurementCovariance(data)
  const errors = data.values.map((_, i) => Math.sqrt(covariance[i * n + i]!))
  return {
    measurement: publicMeasurement(measurement), points: n, data: { values: data.values, errors },
    clPercent: study.clPercent, bins: sets[0]!.result.specSnapshot.spec.bins,
    sets: chiSquares(sets, engineMeasurement(data), study, study.clPercent)
  }
})
