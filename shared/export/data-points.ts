import type { BinPositions, Figure } from './figures'

/** Measured points to draw over the bands: values and their (symmetric) errors, one per bin. */
export interface DataPoints {
  label: string
  values: ArrayLike<number>
  /** One standard deviation per point (the diagonal of the experimental covariance), ≥ 0. */
  errors: ArrayLike<number>
}

/**
 * `figure` with the data drawn on its main panel as black markers with error bars, at the bin's
 * centre (the geometric centre on a log axis), horizontal bars spanning the bin when it has edges.
 * Refuses data whose length is not one per bin.
 */
export function withDataPoints(figure: Figure, data: DataPoints | undefined, positions: BinPositions, logX = false): Figure {
  if (!data) return figure
  const n = positions.lo.length
  if (data.values.length !== n || data.errors.length !== n) throw new RangeError(`${data.values.length} data points and ${data.errors.length} errors for ${n} bins`)
  const idx = Array.from({ length: n }, (_, i) => i)
  const x = idx.map((i) => {
    const lo = positions.lo[i]!
    const hi = positions.hi?.[i]
    if (hi === undefined) return lo
    return logX && lo > 0 ? Math.sqrt(lo * hi) : (lo + hi) / 2
  })
  const trace = {
    type: 'scatter', mode: 'markers', xaxis: 'x', yaxis: 'y', name: data.label, legendgroup: 'data',
    x, y: Array.from(data.values),
    marker: { color: '#000000', size: 6, symbol: 'circle' },
    error_y: { type: 'data', array: Array.from(data.errors), color: '#000000', thickness: 1.2, width: 3 },
    ...(positions.hi ? { error_x: { type: 'data', symmetric: false, array: idx.map(i => positions.hi![i]! - x[i]!), arrayminus: idx.map(i => x[i]! - positions.lo[i]!), color: '#000000', thickness: 0.8, width: 0 } } : {}),
    customdata: idx.map(i => [data.values[i], data.errors[i], i]),
    hovertemplate: `${data.label}<br>%{customdata[0]:.4g} ± %{customdata[1]:.2g}<extra></extra>`
  }
  return { ...figure, data: [...figure.data, trace] }
}

/**
 * Pulls (D_i − T_i) / σ_i of a measurement against a prediction, σ_i the experimental error of
 * point i; null where σ_i is 0 or a value is not finite.
 */
export function pulls(values: ArrayLike<number>, prediction: ArrayLike<number>, errors: ArrayLike<number>): Array<number | null> {
  if (values.length !== prediction.length || values.length !== errors.length) throw new RangeError(`${values.length} points, ${prediction.length} predictions and ${errors.length} errors`)
  return Array.from(values, (v, i) => {
    const p = (v - prediction[i]!) / errors[i]!
    return errors[i]! > 0 && Number.isFinite(p) ? p : null
  })
}
