/**
 * A stored measurement as the engine's χ² input (Measurement in shared/physics/uncertainty), and
 * the words that say how its errors combine.
 */
import type { Measurement } from '../physics/uncertainty'
import type { MeasurementData } from './types'

/**
 * The experimental covariance of a stored measurement, C_ij (row-major, n × n), built term by term
 * (common practice of χ² fits to binned data):
 * - stat: δ_ij s_i², or ρ_ij s_i s_j when the matrix applies to stat;
 * - syst: δ_ij e_i² (uncorrelated), e_i e_j (fully correlated), or ρ_ij e_i e_j when the matrix
 *   applies to syst;
 * - total: ρ_ij σ_i σ_j with σ_i² = s_i² + e_i², replacing the two terms above;
 * - each shift source b: b_i b_j (fully correlated between points, independent of the others).
 */
export function measurementCovariance(d: MeasurementData): Float64Array {
  const n = d.values.length
  const c = new Float64Array(n * n)
  const rho = (i: number, j: number) => d.correlation![i]![j]!
  const stat = d.stat ?? new Array<number>(n).fill(0)
  const syst = d.syst ?? new Array<number>(n).fill(0)
  const matrixOf = d.correlation ? d.correlationOf : null
  const systFull = (d.systCombination ?? 'uncorrelated') === 'fully-correlated'
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      let v = 0
      if (matrixOf === 'total') {
        v += rho(i, j) * Math.hypot(stat[i]!, syst[i]!) * Math.hypot(stat[j]!, syst[j]!)
      }
      else {
        if (matrixOf === 'stat') v += rho(i, j) * stat[i]! * stat[j]!
        else if (i === j) v += stat[i]! * stat[i]!
        if (matrixOf === 'syst') v += rho(i, j) * syst[i]! * syst[j]!
        else if (systFull || i === j) v += syst[i]! * syst[j]!
      }
      for (const s of d.sources) v += s.shifts[i]! * s.shifts[j]!
      c[i * n + j] = v
    }
  }
  return c
}

/** The engine's Measurement for stored data: the values and {@link measurementCovariance}. */
export function engineMeasurement(d: MeasurementData): Measurement {
  return { values: d.values, covariance: { size: d.values.length, values: measurementCovariance(d) } }
}

const ERRORS = { stat: 'the statistical errors', syst: 'the systematic errors', total: 'the total errors √(stat² + syst²)' } as const

/** How the errors of a stored measurement combine, in words for the page and the API. */
export function measurementTreatment(d: MeasurementData): string[] {
  const lines: string[] = []
  const matrix = d.correlation ? d.correlationOf : null
  if (matrix) lines.push(`The correlation matrix applies to ${ERRORS[matrix]}.`)
  else lines.push('No correlation matrix.')
  if (d.stat && matrix !== 'stat' && matrix !== 'total') lines.push('Statistical errors are uncorrelated between points.')
  if (d.syst && matrix !== 'syst' && matrix !== 'total') {
    lines.push((d.systCombination ?? 'uncorrelated') === 'fully-correlated'
      ? 'Systematic errors are fully correlated between points.'
      : 'Systematic errors are uncorrelated between points.')
  }
  if (d.sources.length) lines.push(`${d.sources.length} shift source${d.sources.length > 1 ? 's' : ''} (${d.sources.map(s => s.name).join(', ')}), each fully correlated between points and independent of the others.`)
  return lines
}
