/**
 * A stored measurement as the engine's χ² input (Measurement in shared/physics/uncertainty).
 */
import type { Measurement } from '../physics/uncertainty'
import type { MeasurementData } from './types'

/**
 * The engine's Measurement for stored data: with a 'total' correlation the full covariance
 * ρ_ij σ_i σ_j (σ² = stat² + syst²) plus the shift sources; otherwise stat, syst with their
 * correlation, and the shift sources as correlated sources.
 */
export function engineMeasurement(d: MeasurementData): Measurement {
  const n = d.values.length
  const sources = d.sources.map(s => s.shifts)
  if (d.correlation && d.correlationOf === 'total') {
    const sigma = d.values.map((_, i) => Math.hypot(d.stat?.[i] ?? 0, d.syst?.[i] ?? 0))
    const values = new Float64Array(n * n)
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        let c = d.correlation[i]![j]! * sigma[i]! * sigma[j]!
        for (const s of sources) c += s[i]! * s[j]!
        values[i * n + j] = c
      }
    }
    return { values: d.values, covariance: { size: n, values } }
  }
  return {
    values: d.values,
    ...(d.stat ? { stat: d.stat } : {}),
    ...(d.syst ? { syst: d.syst } : {}),
    ...(d.correlation && d.syst ? { systCorrelation: { size: n, values: Float64Array.from(d.correlation.flat()) } } : {}),
    ...(sources.length ? { correlatedSources: sources } : {})
  }
}
