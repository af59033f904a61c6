import { engineMeasurement, type MeasurementData } from '../../../../../../../../shared/measurements/csv'
import { chiSquares, comparedSets } from '../../../../../../../domain/measurements/comparison'
import { publicMeasurement } from '../../../../../../../domain/measurements/measurements'
import { fail } from '../../../../../../../domain/errors'

// χ² of the measurement against the newest finished result on each set (?setIds=; default all),
// with the experimental covariance alone and with the PDF covariance added, and the point count.
export default defineEventHandler(async (event) => {
  const { study, measurement } = await requireMeasurement(event, 'viewer')
  const query = queryValid(event, chi2QuerySchema)
  const sets = await comparedSets(useDB(), study, query.setIds)
  const data = measurement.data as MeasurementData
  if (sets[0]!.matrix.bins !== data.values.length) {
    fail(409, `The results have ${sets[0]!.matrix.bins} bins but the measurement has ${data.values.length} points; upload a measurement for the current bins`)
  }
  return { measurement: publicMeasurement(measurement), points: data.values.length, sets: chiSquares(sets, engineMeasurement(data)) }
})
