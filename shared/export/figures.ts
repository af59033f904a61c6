/**
 * Figures for the results pages as plain Plotly-shaped objects ({ data, layout }), built
 * without a DOM so they are testable and identical wherever they are rendered. The components
 * in components/plots/ hand them to Plotly; PNG and SVG exports render the same objects.
 *
 * Look (common practice for figures in an analysis note): white background, ticks outside,
 * mirrored axes with a frame, Public Sans, Sheaf's palette.
 */
import type { LabelledBand } from './types'

export type PlotTrace = Record<string, unknown>
export interface Figure {
  data: PlotTrace[]
  layout: Record<string, unknown>
}

/** Sheaf's palette (tailwind.config.ts), in the order series take it. */
export const FIGURE_PALETTE = ['#2f6f94', '#c8612b', '#3f7d57', '#1f2a30', '#21516d', '#93451d', '#28543a', '#8a969c']
export const FIGURE_INK = '#1f2a30'
export const FIGURE_FONT = '"Public Sans", system-ui, sans-serif'

/** `#rrggbb` with an opacity, as rgba(). */
export function withAlpha(hex: string, alpha: number): string {
  const m = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(hex)
  if (!m) throw new RangeError(`Colour ${hex} is not of the form #rrggbb`)
  return `rgba(${parseInt(m[1]!, 16)}, ${parseInt(m[2]!, 16)}, ${parseInt(m[3]!, 16)}, ${alpha})`
}

/** A quantity on an axis. */
export interface AxisSpec {
  label: string
  unit?: string
  log?: boolean
}

export const axisTitle = (a: AxisSpec) => (a.unit ? `${a.label} [${a.unit}]` : a.label)

/** An axis in the house style; `extra` overrides. */
export function houseAxis(a: AxisSpec | null, extra: Record<string, unknown> = {}): Record<string, unknown> {
  return {
    ...(a ? { title: { text: axisTitle(a) }, type: a.log ? 'log' : 'linear' } : {}),
    ticks: 'outside', mirror: 'ticks', showline: true, linecolor: FIGURE_INK, linewidth: 1, tickcolor: FIGURE_INK,
    zeroline: false, showgrid: true, gridcolor: '#ecebe6', automargin: true, exponentformat: 'power',
    ...extra
  }
}

/** The layout every Sheaf figure starts from. */
export function houseLayout(title?: string): Record<string, unknown> {
  return {
    font: { family: FIGURE_FONT, size: 13, color: FIGURE_INK },
    paper_bgcolor: '#ffffff', plot_bgcolor: '#ffffff',
    // room above the frame for the legend, and for the title above it
    margin: { l: 72, r: 24, t: title ? 80 : 44, b: 56 },
    ...(title ? { title: { text: title, x: 0, xref: 'paper', xanchor: 'left', y: 1, yref: 'container', yanchor: 'top', pad: { t: 10 }, font: { size: 14 } } } : {}),
    legend: { orientation: 'h', x: 0, y: 1.02, yanchor: 'bottom', bgcolor: 'rgba(255,255,255,0)' },
    hovermode: 'closest'
  }
}

/** Plotly config for every figure: no vendor logo, no lasso tools, image export in our size. */
export function houseConfig(filename = 'sheaf-figure'): Record<string, unknown> {
  return {
    displaylogo: false, responsive: true,
    modeBarButtonsToRemove: ['lasso2d', 'select2d', 'autoScale2d', 'toggleSpikelines'],
    toImageButtonOptions: { format: 'svg', filename, width: 900, height: 600, scale: 1 }
  }
}

/** Where the bins sit along the chosen kinematic variable: edges (lo, hi) or points (lo only). */
export interface BinPositions {
  lo: ArrayLike<number>
  hi?: ArrayLike<number>
}

/** A band shown apart from the PDF band (scale variation): absolute lower and upper values. */
export interface EnvelopeBand {
  label: string
  lower: ArrayLike<number>
  upper: ArrayLike<number>
  color?: string
}

/**
 * Input of {@link bandFigure}. Hovering a central line or a marker shows the bin's value and
 * errors; each such point's customdata is [central, plus, minus, bin index].
 */
export interface BandFigureInput {
  positions: BinPositions
  variable: AxisSpec
  observable: AxisSpec
  /** One set's (or one flavour's) band each; only central, plus and minus are drawn. */
  series: LabelledBand[]
  /** 'band': filled areas (steps for bins); 'bars': markers with asymmetric error bars. */
  draw?: 'band' | 'bars'
  /** Id of the series the ratio panel divides by; no ratio panel when absent. */
  referenceId?: string
  envelope?: EnvelopeBand
  title?: string
  /** A line under the plot (e.g. Q² = 100 GeV²), inside the frame's top-left corner. */
  note?: string
}

type Transform = (i: number) => number | null

/** Bin order along the variable and the runs of touching bins (gaps break filled areas). */
function layoutBins(positions: BinPositions, n: number) {
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => positions.lo[a]! - positions.lo[b]!)
  const segments: number[][] = []
  for (const i of order) {
    const last = segments.at(-1)
    const prev = last?.at(-1)
    const touches = prev !== undefined && (!positions.hi || Math.abs(positions.hi[prev]! - positions.lo[i]!) <= 1e-9 * Math.max(1, Math.abs(positions.lo[i]!)))
    if (last && touches) last.push(i)
    else segments.push([i])
  }
  return segments
}

/** x,y of a closed outline per segment between `top` and `bottom`, segments separated by nulls. */
function outline(positions: BinPositions, segments: number[][], top: Transform, bottom: Transform) {
  const x: (number | null)[] = []
  const y: (number | null)[] = []
  for (const seg of segments) {
    if (x.length) { x.push(null); y.push(null) }
    const edges = (i: number) => (positions.hi ? [positions.lo[i]!, positions.hi[i]!] : [positions.lo[i]!])
    for (const i of seg) for (const e of edges(i)) { x.push(e); y.push(top(i)) }
    for (const i of [...seg].reverse()) for (const e of edges(i).reverse()) { x.push(e); y.push(bottom(i)) }
  }
  return { x, y }
}

/** The central line: steps over bin edges or a line through points, broken at gaps. */
function centralLine(positions: BinPositions, segments: number[][], value: Transform) {
  const x: (number | null)[] = []
  const y: (number | null)[] = []
  const index: (number | null)[] = []
  for (const seg of segments) {
    if (x.length) { x.push(null); y.push(null); index.push(null) }
    for (const i of seg) {
      for (const e of positions.hi ? [positions.lo[i]!, positions.hi[i]!] : [positions.lo[i]!]) {
        x.push(e); y.push(value(i)); index.push(i)
      }
    }
  }
  return { x, y, index }
}

function checkLengths(input: BandFigureInput, n: number) {
  if (input.positions.hi && input.positions.hi.length !== n) throw new RangeError(`${input.positions.hi.length} upper bin edges for ${n} lower edges`)
  for (const { label, band } of input.series) {
    for (const part of ['central', 'plus', 'minus'] as const) {
      if (band[part].length !== n) throw new RangeError(`Series ${label} has ${band[part].length} ${part} values for ${n} bins`)
    }
  }
  if (input.envelope && (input.envelope.lower.length !== n || input.envelope.upper.length !== n)) throw new RangeError(`The ${input.envelope.label} band needs ${n} lower and upper values`)
}

/**
 * Observable against one kinematic variable: each series as a filled band (or error bars),
 * optionally a ratio panel to a reference series (each series' band divided by the reference
 * central value, common practice for comparing sets) and an envelope drawn hatched and dashed.
 */
export function bandFigure(input: BandFigureInput): Figure {
  const n = input.positions.lo.length
  checkLengths(input, n)
  const segments = layoutBins(input.positions, n)
  const reference = input.referenceId === undefined ? undefined : input.series.find(s => s.id === input.referenceId)
  if (input.referenceId !== undefined && !reference) throw new RangeError(`Reference series '${input.referenceId}' is not among the plotted series`)
  const panels: Array<{ axes: { xaxis: string, yaxis: string }, scale: (i: number, v: number) => number | null }> = [
    { axes: { xaxis: 'x', yaxis: 'y' }, scale: (_, v) => v }
  ]
  if (reference) {
    const divisor = reference.band.central
    panels.push({ axes: { xaxis: 'x2', yaxis: 'y2' }, scale: (i, v) => (divisor[i] ? v / divisor[i]! : null) })
  }
  const data: PlotTrace[] = []
  const draw = input.draw ?? 'band'
  const positionOf = (i: number, k: number, count: number) => {
    const lo = input.positions.lo[i]!
    const hi = input.positions.hi?.[i]
    if (hi === undefined) return lo
    const t = (k + 1) / (count + 1)
    return input.variable.log && lo > 0 ? lo * (hi / lo) ** t : lo + (hi - lo) * t
  }
  panels.forEach((panel, p) => {
    input.series.forEach((s, k) => {
      const color = s.color ?? FIGURE_PALETTE[k % FIGURE_PALETTE.length]!
      const { central, plus, minus } = s.band
      const up: Transform = i => panel.scale(i, central[i]! + plus[i]!)
      const down: Transform = i => panel.scale(i, central[i]! - minus[i]!)
      const mid: Transform = i => panel.scale(i, central[i]!)
      const common = { ...panel.axes, legendgroup: s.id, name: s.label }
      if (draw === 'bars') {
        const idx = Array.from({ length: n }, (_, i) => i)
        const x = idx.map(i => positionOf(i, k, input.series.length))
        const y = idx.map(i => mid(i))
        data.push({
          ...common, type: 'scatter', mode: 'markers', x, y, showlegend: p === 0,
          marker: { color, size: 6, symbol: ['circle', 'square', 'diamond', 'triangle-up'][k % 4] },
          error_y: { type: 'data', symmetric: false, array: idx.map(i => (up(i) ?? Number.NaN) - (y[i] ?? Number.NaN)), arrayminus: idx.map(i => (y[i] ?? Number.NaN) - (down(i) ?? Number.NaN)), color, thickness: 1.2, width: 3 },
          ...(input.positions.hi ? { error_x: { type: 'data', symmetric: false, array: idx.map(i => input.positions.hi![i]! - x[i]!), arrayminus: idx.map(i => x[i]! - input.positions.lo[i]!), color, thickness: 0.8, width: 0 } } : {}),
          customdata: idx.map(i => [central[i], plus[i], minus[i], i]),
          hovertemplate: `${s.label}<br>%{customdata[0]:.4g} +%{customdata[1]:.2g} −%{customdata[2]:.2g}<extra></extra>`
        })
        return
      }
      const area = outline(input.positions, segments, up, down)
      data.push({ ...common, type: 'scatter', mode: 'lines', ...area, fill: 'toself', fillcolor: withAlpha(color, 0.25), line: { width: 0.8, color: withAlpha(color, 0.6) }, hoverinfo: 'skip', showlegend: p === 0 })
      const line = centralLine(input.positions, segments, mid)
      data.push({
        ...common, type: 'scatter', mode: 'lines', x: line.x, y: line.y, line: { width: 1.6, color }, showlegend: false,
        customdata: line.index.map(i => (i === null ? null : [central[i], plus[i], minus[i], i])),
        hovertemplate: `${s.label}<br>%{customdata[0]:.4g} +%{customdata[1]:.2g} −%{customdata[2]:.2g}<extra></extra>`
      })
    })
    if (input.envelope) {
      const env = input.envelope
      const color = env.color ?? FIGURE_INK
      const area = outline(input.positions, segments, i => panel.scale(i, env.upper[i]!), i => panel.scale(i, env.lower[i]!))
      data.push({
        ...panel.axes, type: 'scatter', mode: 'lines', ...area, name: env.label, legendgroup: 'envelope', showlegend: p === 0,
        fill: 'toself', fillcolor: 'rgba(0,0,0,0)', fillpattern: { shape: '/', fgcolor: withAlpha(color, 0.5), size: 8, solidity: 0.1 },
        line: { width: 1.2, dash: 'dash', color }, hoverinfo: 'skip'
      })
    }
  })
  const layout: Record<string, unknown> = houseLayout(input.title)
  if (reference) {
    layout.xaxis = houseAxis(null, { anchor: 'y', matches: 'x2', showticklabels: false, type: input.variable.log ? 'log' : 'linear' })
    layout.yaxis = houseAxis(input.observable, { domain: [0.3, 1] })
    layout.xaxis2 = houseAxis(input.variable, { anchor: 'y2' })
    layout.yaxis2 = houseAxis({ label: `ratio to ${reference.label}` }, { domain: [0, 0.25], title: { text: `ratio to<br>${reference.label}`, font: { size: 11 } } })
  }
  else {
    layout.xaxis = houseAxis(input.variable)
    layout.yaxis = houseAxis(input.observable)
  }
  if (input.note) layout.annotations = [{ text: input.note, xref: 'paper', yref: 'paper', x: 0.01, y: 0.99, xanchor: 'left', yanchor: 'top', showarrow: false, font: { size: 12 } }]
  return { data, layout }
}

/** Diverging colours from −1 (tide) through 0 (white) to +1 (ember), our own scale. */
export const CORRELATION_SCALE: Array<[number, string]> = [[0, '#21516d'], [0.25, '#2f6f94'], [0.5, '#ffffff'], [0.75, '#c8612b'], [1, '#93451d']]

/** Bin-to-bin correlation matrix as a heat map fixed to [−1, 1], bin 1 at the top left. */
export function correlationFigure(input: { matrix: ArrayLike<ArrayLike<number>>, labels?: string[], title?: string }): Figure {
  const n = input.matrix.length
  const labels = input.labels ?? Array.from({ length: n }, (_, i) => String(i + 1))
  if (labels.length !== n) throw new RangeError(`${labels.length} labels for a ${n} × ${n} correlation matrix`)
  const z = Array.from({ length: n }, (_, i) => {
    if (input.matrix[i]!.length !== n) throw new RangeError(`The correlation matrix is not square: row ${i + 1} has ${input.matrix[i]!.length} entries for ${n} bins`)
    return Array.from(input.matrix[i]!)
  })
  const layout = houseLayout(input.title)
  layout.xaxis = houseAxis({ label: 'bin' }, { type: 'category', showgrid: false, constrain: 'domain' })
  layout.yaxis = houseAxis({ label: 'bin' }, { type: 'category', showgrid: false, autorange: 'reversed', scaleanchor: 'x', constrain: 'domain' })
  return {
    data: [{
      type: 'heatmap', z, x: labels, y: labels, zmin: -1, zmax: 1, colorscale: CORRELATION_SCALE,
      colorbar: { title: { text: 'correlation' }, tickvals: [-1, -0.5, 0, 0.5, 1], outlinewidth: 0, thickness: 14 },
      hovertemplate: 'bin %{y} × bin %{x}: %{z:.3f}<extra></extra>'
    }],
    layout
  }
}

/** One eigenvector's shift of the chosen bin: X_k⁺ − X₀ and, for pairs, X_k⁻ − X₀. */
export interface EigenvectorShift {
  label: string
  up: number
  down?: number
}

export interface EigenvectorFigureInput {
  binLabel: string
  shifts: EigenvectorShift[]
  unit?: string
  /** Central value of the bin: when given, shifts are shown in percent of it. */
  central?: number
  /** 'size' sorts by the larger |shift|, largest first; default keeps the given order. */
  sortBy?: 'index' | 'size'
  /** Show only this many (after sorting). */
  top?: number
}

/** Signed bars: how far each eigenvector moves the chosen bin up and down. */
export function eigenvectorFigure(input: EigenvectorFigureInput): Figure {
  const size = (s: EigenvectorShift) => Math.max(Math.abs(s.up), Math.abs(s.down ?? 0))
  let shifts = [...input.shifts]
  if (input.sortBy === 'size') shifts.sort((a, b) => size(b) - size(a))
  if (input.top !== undefined) shifts = shifts.slice(0, input.top)
  const relative = input.central !== undefined && input.central !== 0
  const value = (v: number) => (relative ? (100 * v) / Math.abs(input.central!) : v)
  const labels = shifts.map(s => s.label)
  const data: PlotTrace[] = [{
    type: 'bar', name: 'plus member', x: labels, y: shifts.map(s => value(s.up)), marker: { color: FIGURE_PALETTE[0] },
    hovertemplate: `eigenvector %{x}, plus: %{y:.3g}${relative ? ' %' : ''}<extra></extra>`
  }]
  if (shifts.some(s => s.down !== undefined)) {
    data.push({
      type: 'bar', name: 'minus member', x: labels, y: shifts.map(s => (s.down === undefined ? null : value(s.down))), marker: { color: FIGURE_PALETTE[1] },
      hovertemplate: `eigenvector %{x}, minus: %{y:.3g}${relative ? ' %' : ''}<extra></extra>`
    })
  }
  const layout = houseLayout(`Eigenvector shifts of ${input.binLabel}`)
  layout.barmode = 'group'
  layout.bargap = 0.25
  layout.xaxis = houseAxis({ label: 'eigenvector' }, { type: 'category', showgrid: false, tickangle: labels.length > 30 ? -90 : 0 })
  layout.yaxis = houseAxis({ label: 'shift from central', unit: relative ? '%' : input.unit }, { zeroline: true, zerolinecolor: FIGURE_INK })
  return { data, layout }
}

/** A figure, or the builder's message when the inputs cannot make one (shown in place of the plot). */
export function tryFigure(build: () => Figure): { figure: Figure | null, error: string | null } {
  try {
    return { figure: build(), error: null }
  }
  catch (e) {
    if (e instanceof RangeError) return { figure: null, error: e.message }
    throw e
  }
}

/** What a plot component exposes for figure export (PlotFrame implements it). */
export interface FigureImages {
  exportImage(format: 'png' | 'svg', options?: { width?: number, height?: number, scale?: number, filename?: string }): Promise<void>
  toImage(format: 'png' | 'svg', options?: { width?: number, height?: number, scale?: number }): Promise<string>
}

/** Forwards export calls to a frame found later (a template ref), for a component to expose. */
export function forwardImages(frame: () => FigureImages | null | undefined): FigureImages {
  const get = () => {
    const f = frame()
    if (!f) throw new Error('The figure is not drawn yet')
    return f
  }
  return { exportImage: (format, options) => get().exportImage(format, options), toImage: (format, options) => get().toImage(format, options) }
}
