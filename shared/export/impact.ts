/**
 * Figures and the CSV table of a set update by a measurement (reweighting, profiling) and of a
 * sensitivity map, as plain Plotly-shaped objects (see figures.ts) and text through the one CSV
 * writer (csv.ts).
 */
import type { BandJson } from '../physics/uncertainty/band'
import { RESULT_CAUTION } from './caution'
import { writeCsv } from './csv'
import { CORRELATION_SCALE, FIGURE_INK, FIGURE_PALETTE, houseAxis, houseLayout, withAlpha, type Figure, type PlotTrace } from './figures'
import { IMPACT_CAUTION } from './impact-caution'

/** The before/after part of an update's summary that the table and the figures read. */
export interface BeforeAfter {
  data: ArrayLike<number>
  before: BandJson
  after: BandJson
}

/** One row per bin: data, the parent's and the updated prediction with their ±Δ, and the band shrinkage. */
export interface ShrinkageRow {
  bin: number
  label: string
  data: number
  before: number
  beforePlus: number
  beforeMinus: number
  after: number
  afterPlus: number
  afterMinus: number
  /** Half-width after over half-width before ((Δ⁺ + Δ⁻) after / (Δ⁺ + Δ⁻) before); null when the band before is 0. */
  shrinkage: number | null
}

/**
 * The band shrinkage per bin: the ratio of the full band widths after and before, (Δ⁺ + Δ⁻)_after /
 * (Δ⁺ + Δ⁻)_before (1 = unchanged, below 1 = narrower).
 * @throws RangeError when the bands and the data differ in length.
 * @example shrinkageRows({ data: [1], before: { central: [1], plus: [0.2], minus: [0.2], … }, after: … })[0].shrinkage
 */
export function shrinkageRows(s: BeforeAfter, labels?: readonly string[]): ShrinkageRow[] {
  const n = s.before.central.length
  if (s.after.central.length !== n || s.data.length !== n) throw new RangeError(`The update has ${n} bins before, ${s.after.central.length} after and ${s.data.length} data points: they must match`)
  return Array.from({ length: n }, (_, b) => {
    const wb = s.before.plus[b]! + s.before.minus[b]!
    const wa = s.after.plus[b]! + s.after.minus[b]!
    return {
      bin: b + 1, label: labels?.[b] ?? String(b + 1), data: s.data[b]!,
      before: s.before.central[b]!, beforePlus: s.before.plus[b]!, beforeMinus: s.before.minus[b]!,
      after: s.after.central[b]!, afterPlus: s.after.plus[b]!, afterMinus: s.after.minus[b]!,
      shrinkage: wb > 0 ? wa / wb : null
    }
  })
}

/** The shrinkage table as CSV with the provenance and both cautions as comment lines. */
export function shrinkageCsv(rows: readonly ShrinkageRow[], provenance: readonly string[]): string {
  return writeCsv([
    ['bin', 'label', 'data', 'before', 'before_plus', 'before_minus', 'after', 'after_plus', 'after_minus', 'shrinkage'],
    ...rows.map(r => [r.bin, r.label, r.data, r.before, r.beforePlus, r.beforeMinus, r.after, r.afterPlus, r.afterMinus, r.shrinkage])
  ], { comments: [...provenance, RESULT_CAUTION, IMPACT_CAUTION] })
}

/**
 * Parent and updated predictions per bin overlaid (points with asymmetric error bars, the data as
 * black markers), and below them the ratio to the parent's central value with both bands.
 */
export function beforeAfterFigure(s: BeforeAfter & { labels?: string[], parentName: string, updatedName: string, unit?: string }): Figure {
  const rows = shrinkageRows(s, s.labels)
  // Bin numbers on the axis: labels need not be unique (a rapidity cut shared by several mass bins).
  const x = rows.map(r => String(r.bin))
  const ratio = (v: number, r: ShrinkageRow) => (r.before !== 0 ? v / r.before : null)
  const series = (name: string, colour: string, central: number[], plus: number[], minus: number[], yaxis: string, offset: number, legend: boolean): PlotTrace => ({
    type: 'scatter', mode: 'markers', name, x, y: central, xaxis: 'x', yaxis, showlegend: legend, legendgroup: name,
    marker: { color: colour, size: 7, symbol: offset < 0 ? 'circle' : 'diamond' },
    error_y: { type: 'data', symmetric: false, array: plus, arrayminus: minus, color: colour, thickness: 1.5, width: 4 },
    hovertemplate: `${name}, bin %{x}: %{y:.4g}<extra></extra>`
  })
  const data: PlotTrace[] = [
    series(s.parentName, FIGURE_PALETTE[0]!, rows.map(r => r.before), rows.map(r => r.beforePlus), rows.map(r => r.beforeMinus), 'y', -1, true),
    series(s.updatedName, FIGURE_PALETTE[1]!, rows.map(r => r.after), rows.map(r => r.afterPlus), rows.map(r => r.afterMinus), 'y', 1, true),
    { type: 'scatter', mode: 'markers', name: 'data', x, y: rows.map(r => r.data), yaxis: 'y', marker: { color: FIGURE_INK, size: 6, symbol: 'x' }, hovertemplate: 'data, bin %{x}: %{y:.4g}<extra></extra>' },
    series(s.parentName, FIGURE_PALETTE[0]!, rows.map(() => 1), rows.map(r => ratio(r.beforePlus, r) ?? 0), rows.map(r => ratio(r.beforeMinus, r) ?? 0), 'y2', -1, false),
    series(s.updatedName, FIGURE_PALETTE[1]!, rows.map(r => ratio(r.after, r) ?? 0), rows.map(r => ratio(r.afterPlus, r) ?? 0), rows.map(r => ratio(r.afterMinus, r) ?? 0), 'y2', 1, false),
    { type: 'scatter', mode: 'markers', name: 'data', x, y: rows.map(r => ratio(r.data, r)), yaxis: 'y2', showlegend: false, marker: { color: FIGURE_INK, size: 6, symbol: 'x' }, hovertemplate: 'data / parent, bin %{x}: %{y:.4g}<extra></extra>' }
  ]
  const layout = houseLayout('Before and after the update')
  layout.xaxis = houseAxis({ label: 'bin' }, { type: 'category', anchor: 'y2' })
  const values = rows.flatMap(r => [r.before, r.after, r.data])
  const lo = Math.min(...values)
  // A spectrum falling over decades is read on a log axis (common practice).
  const log = lo > 0 && Math.max(...values) / lo > 100
  layout.yaxis = houseAxis({ label: 'prediction', unit: s.unit && s.unit !== '1' ? s.unit : undefined, log }, { domain: [0.38, 1] })
  layout.yaxis2 = houseAxis({ label: 'ratio to parent' }, { domain: [0, 0.3] })
  return { data, layout }
}

/** The χ² profile P(α) of the replicas (arXiv:1012.0836), with a line at α = 1. */
export function chi2ProfileFigure(p: { alpha: ArrayLike<number>, density: ArrayLike<number>, mostProbableAlpha: number }): Figure {
  const layout = houseLayout(`χ² profile P(α): most probable α = ${p.mostProbableAlpha.toFixed(2)}`)
  layout.xaxis = houseAxis({ label: 'α (factor on the experimental errors)' })
  layout.yaxis = houseAxis({ label: 'P(α)' }, { rangemode: 'tozero' })
  layout.shapes = [{ type: 'line', x0: 1, x1: 1, yref: 'paper', y0: 0, y1: 1, line: { color: FIGURE_INK, dash: 'dot', width: 1 } }]
  return {
    data: [{ type: 'scatter', mode: 'lines', name: 'P(α)', x: Array.from(p.alpha), y: Array.from(p.density), line: { color: FIGURE_PALETTE[0], width: 2 }, fill: 'tozeroy', fillcolor: withAlpha(FIGURE_PALETTE[0]!, 0.15), hovertemplate: 'α = %{x:.2f}: %{y:.3g}<extra></extra>' }],
    layout
  }
}

/** The profiled shifts z_k of the eigenvector parameters as bars (members at z_k = ±1). */
export function shiftsFigure(shifts: ArrayLike<number>): Figure {
  const x = Array.from(shifts, (_, k) => String(k + 1))
  const layout = houseLayout('Shifts of the eigenvector parameters at the profiled minimum')
  layout.xaxis = houseAxis({ label: 'eigenvector k' }, { type: 'category', showgrid: false })
  layout.yaxis = houseAxis({ label: 'z_k' }, { zeroline: true, zerolinecolor: FIGURE_INK })
  return { data: [{ type: 'bar', name: 'z_k', x, y: Array.from(shifts), marker: { color: FIGURE_PALETTE[0] }, hovertemplate: 'z_%{x} = %{y:.4f}<extra></extra>' }], layout }
}

/** A sensitivity map: one value per bin and x point (NaN where undefined). */
export interface SensitivityGrid {
  x: ArrayLike<number>
  labels: string[]
  /** values[b][p]; null or NaN where undefined. */
  values: ReadonlyArray<ArrayLike<number | null>>
  /** 'cosPhi' in [−1, 1]; 'sensitivity' unbounded (scaled symmetric to its largest |value|). */
  quantity: 'cosPhi' | 'sensitivity'
  flavourLabel: string
  q2GeV2: number
}

const finiteOrNull = (v: number | null) => (v === null || !Number.isFinite(v) ? null : v)

/** The map as a heat map: bins down, x across (log scale), diverging colours symmetric about 0. */
export function sensitivityHeatmap(g: SensitivityGrid): Figure {
  const z = g.values.map(row => Array.from(row, finiteOrNull))
  const top = g.quantity === 'cosPhi' ? 1 : Math.max(1e-12, ...z.flat().map(v => Math.abs(v ?? 0)))
  const what = g.quantity === 'cosPhi' ? 'cos φ' : 'sensitivity'
  const layout = houseLayout(`${what} of each bin with x·${g.flavourLabel}(x, Q² = ${g.q2GeV2} GeV²)`)
  layout.xaxis = houseAxis({ label: 'x', log: true }, { showgrid: false })
  layout.yaxis = houseAxis({ label: 'bin' }, { type: 'category', autorange: 'reversed', showgrid: false })
  return {
    data: [{
      type: 'heatmap', x: Array.from(g.x), y: g.labels, z, zmin: -top, zmax: top, colorscale: CORRELATION_SCALE,
      colorbar: { title: { text: what }, outlinewidth: 0, thickness: 14 }, hovertemplate: `bin %{y}, x = %{x:.3g}: %{z:.3f}<extra></extra>`
    }],
    layout
  }
}

/** The map of one or more bins as lines over x. */
export function sensitivityLines(g: SensitivityGrid, bins: readonly number[]): Figure {
  const what = g.quantity === 'cosPhi' ? 'cos φ' : 'sensitivity'
  const data: PlotTrace[] = bins.map((b, i) => {
    if (b < 0 || b >= g.values.length) throw new RangeError(`Bin ${b + 1} is not in the map (1 to ${g.values.length})`)
    return {
      type: 'scatter', mode: 'lines', name: `bin ${g.labels[b]}`, x: Array.from(g.x), y: Array.from(g.values[b]!, finiteOrNull),
      line: { color: FIGURE_PALETTE[i % FIGURE_PALETTE.length], width: 2 }, hovertemplate: `bin ${g.labels[b]}, x = %{x:.3g}: %{y:.3f}<extra></extra>`
    }
  })
  const layout = houseLayout(`${what} with x·${g.flavourLabel}(x, Q² = ${g.q2GeV2} GeV²)`)
  layout.xaxis = houseAxis({ label: 'x', log: true })
  layout.yaxis = houseAxis({ label: what }, g.quantity === 'cosPhi' ? { range: [-1.05, 1.05], zeroline: true, zerolinecolor: FIGURE_INK } : { zeroline: true, zerolinecolor: FIGURE_INK })
  return { data, layout }
}
