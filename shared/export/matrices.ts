import { writeCsv } from './csv'
import { provenanceLines } from './provenance'
import type { MatrixForExport } from './types'

/**
 * A covariance (unit²) or correlation matrix as CSV: provenance comments, a header row of bin
 * labels, then one line per bin starting with its label. A correlation is undefined (NaN) for a
 * bin whose variance is zero; such cells, like any non-finite value, are left empty, with a
 * comment line saying so. Refuses a matrix that is not square, whose labels do not match, or
 * (correlation) has entries outside [-1, 1] beyond rounding.
 */
export function matrixToCsv(m: MatrixForExport): string {
  const n = m.values.length
  for (let i = 0; i < n; i++) {
    if (m.values[i]!.length !== n) throw new RangeError(`The ${m.kind} matrix is not square: row ${i + 1} has ${m.values[i]!.length} entries for ${n} bins`)
  }
  const labels = m.labels ?? Array.from({ length: n }, (_, i) => `bin ${i + 1}`)
  if (labels.length !== n) throw new RangeError(`${labels.length} bin labels for a ${n} × ${n} ${m.kind} matrix`)
  if (m.kind === 'correlation') {
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        const v = m.values[i]![j]!
        if (!Number.isNaN(v) && !(Math.abs(v) <= 1 + 1e-9)) throw new RangeError(`Correlation between bins ${i + 1} and ${j + 1} is ${v}, outside [-1, 1]`)
      }
    }
  }
  const unit = m.kind === 'covariance' ? (m.observable.unit ? `[(${m.observable.unit})²]` : '[dimensionless]') : '[dimensionless, -1 to 1]'
  const undefinedCells = Array.from(m.values).some(row => Array.from(row).some(v => !Number.isFinite(v)))
  const comments = [
    ...provenanceLines(m.provenance, m.observable, `${m.kind} matrix between bins ${unit}`),
    ...(undefinedCells ? [`an empty cell has no finite value${m.kind === 'correlation' ? ' (a bin whose variance is zero has no correlation)' : ''}`] : [])
  ]
  const rows = labels.map((label, i) => [label, ...Array.from(m.values[i]!)])
  return writeCsv([['bin', ...labels], ...rows], { comments })
}
