import { publicMeasurement } from '../../../../../../domain/measurements/measurements'
// One measurement with its points and correlation matrix.
export default defineEventHandler(async (event) => {
  const { measurement } = await requireMeasurement(event, 'viewer')
  return { ...publicMeasurement(measurement), data: measurement.data }
})
