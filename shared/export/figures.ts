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
  /** Axis limits in data units; null (or absent) leaves that end to the data. */
  range?: [number | null, number | null]
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
    // the legend sits outside the frame on the right (one entry a line, never over the curves);
    // room above the frame for the note and the title
    margin: { l: 72, r: 24, t: title ? 64 : 36, b: 56 },
    ...(title ? { title: { text: title, x: 0, xref: 'paper', xanchor: 'left', y: 1, yref: 'container', yanchor: 'top', pad: { t: 10 }, font: { size: 14 } } } : {}),
    legend: legendLayout('right'),
    hovermode: 'closest'
  }
}

/** Where a figure's legend goes: outside the frame on the right or below it, or inside the frame's top right corner. */
export type LegendPlace = 'right' | 'below' | 'inside'

/** Plotly legend settings for a place; outside places are added to the margins by Plotly. */
export function legendLayout(place: LegendPlace): Record<string, unknown> {
  const common = { bgcolor: 'rgba(255,255,255,0.85)', borderwidth: 0, tracegroupgap: 2, itemsizing: 'constant', itemwidth: 30 }
  // 'normal' order flows the entries along the rows (grouped order gives each legend group a row of its own)
  if (place === 'below') return { ...common, orientation: 'h', traceorder: 'normal', x: 0, xanchor: 'left', y: 0, yref: 'container', yanchor: 'bottom' }
  if (place === 'inside') return { ...common, orientation: 'v', x: 0.99, xanchor: 'right', y: 0.99, yanchor: 'top', bordercolor: '#c9cfd2', borderwidth: 1 }
  return { ...common, orientation: 'v', x: 1.02, xanchor: 'left', y: 1, yanchor: 'top' }
}

const SUPERSCRIPTS = '⁰¹²³⁴⁵⁶⁷⁸⁹'
/** 10 to an integer power as text: "10⁻³", "1", "10". */
export function decadeText(k: number): string {
  if (k === 0) return '1'
  if (k === 1) return '10'
  return `10${k < 0 ? '⁻' : ''}${String(Math.abs(k)).replace(/\d/g, d => SUPERSCRIPTS[Number(d)]!)}`
}

/**
 * Tick values and labels of a log axis over [lo, hi] (lo > 0): every decade labelled in full
 * ("10⁻³"), never a bare mantissa. An axis spanning fewer than two decades also gets 2× and 5×
 * ticks, labelled with their decade ("2×10⁻³"); a wide one thins the decades to at most 8 labels.
 */
export function logTicks(lo: number, hi: number): { tickvals: number[], ticktext: string[] } {
  if (!(lo > 0) || !(hi > lo)) return { tickvals: [], ticktext: [] }
  const k0 = Math.floor(Math.log10(lo) + 1e-9)
  const k1 = Math.ceil(Math.log10(hi) - 1e-9)
  const tickvals: number[] = []
  const ticktext: string[] = []
  const decades = k1 - k0
  const step = Math.max(1, Math.ceil(decades / 8))
  const inRange = (v: number) => v >= lo * (1 - 1e-9) && v <= hi * (1 + 1e-9)
  for (let k = k0; k <= k1; k++) {
    const mantissas = decades <= 2 ? [1, 2, 5] : [1]
    for (const m of mantissas) {
      if (m === 1 && (k - k0) % step !== 0) continue
      const v = m * 10 ** k
      if (!inRange(v)) continue
      tickvals.push(Number(v.toPrecision(12)))
      ticktext.push(m === 1 ? decadeText(k) : k === 0 ? String(m) : k === 1 ? String(m * 10) : `${m}×${decadeText(k)}`)
    }
  }
  return { tickvals, ticktext }
}

/** Lower and upper ends of finite values (positive ones only when `positive`), or null. */
function extent(values: Iterable<number | null | undefined>, positive = false): [number, number] | null {
  let lo = Infinity
  let hi = -Infinity
  for (const v of values) {
    if (v === null || v === undefined || !Number.isFinite(v) || (positive && v <= 0)) continue
    if (v < lo) lo = v
    if (v > hi) hi = v
  }
  return lo <= hi ? [lo, hi] : null
}

/**
 * Plotly settings of an axis's range and ticks from the data's extent: a log axis gets decade
 * labels and a floor (the lower end never below `floorRatio` × the upper end, so a band that
 * touches zero does not stretch the axis over ten empty decades); a given range overrides.
 */
export function axisRange(a: AxisSpec, data: Iterable<number | null | undefined>, options: { floorRatio?: number, pad?: number } = {}): Record<string, unknown> {
  const wanted = a.range ?? [null, null]
  if (a.log) {
    const e = extent(data, true)
    let lo = wanted[0] ?? e?.[0] ?? null
    const hi = wanted[1] ?? e?.[1] ?? null
    if (lo === null || hi === null || !(lo > 0) || !(hi > lo)) return {}
    if (wanted[0] === null && options.floorRatio) lo = Math.max(lo, hi * options.floorRatio)
    const pad = options.pad ?? 0.04
    const span = Math.log10(hi) - Math.log10(lo)
    const r0 = wanted[0] === null ? Math.log10(lo) - pad * span : Math.log10(lo)
    const r1 = wanted[1] === null ? Math.log10(hi) + pad * span : Math.log10(hi)
    return { range: [r0, r1], ...logTicks(10 ** r0, 10 ** r1), tickmode: 'array' }
  }
  if (wanted[0] === null && wanted[1] === null) return {}
  const e = extent(data)
  const lo = wanted[0] ?? e?.[0] ?? 0
  const hi = wanted[1] ?? e?.[1] ?? 1
  return hi > lo ? { range: [lo, hi], autorange: false } : {}
}

/** Splits a title into lines of at most `width` characters at spaces (Plotly's <br>). */
export function wrapTitle(text: string, width: number): string {
  if (text.length <= width) return text
  const lines: string[] = []
  let line = ''
  for (const word of text.split(' ')) {
    if (line && line.length + 1 + word.length > width) {
      lines.push(line)
      line = word
    }
    else line = line ? `${line} ${word}` : word
  }
  if (line) lines.push(line)
  return lines.join('<br>')
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

/** Bins that share the values of a second bin variable (e.g. one Q² of an x–Q² study), drawn as one curve. */
export interface BinGroup {
  /** What the bins share, for the legend ("Q² = 10 GeV²"). */
  label: string
  /** 0-based bin indices of the group. */
  indices: number[]
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
  /** A line above the frame's top right corner (e.g. Q² = 100 GeV²), never over the curves. */
  note?: string
  /**
   * Bins split by a second variable: each group is its own curve (own colour when there is one
   * series, own dash otherwise), so bins at the same position of different groups never join.
   */
  groups?: BinGroup[]
  /** Lowest value a log observable axis shows, as a fraction of its highest (default 1e-4). */
  logFloor?: number
  /** Height of the drawing in px, to wrap a long y title within its panel (default 460). */
  heightPx?: number
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

const DASHES = ['solid', 'dash', 'dot', 'dashdot', 'longdash', 'longdashdot']
const SYMBOLS = ['circle', 'square', 'diamond', 'triangle-up', 'cross', 'x']

const subset = <T>(a: ArrayLike<T>, idx: readonly number[]): T[] => idx.map(i => a[i]!)

/**
 * The spread for points drawn side by side at one x: a third of the narrowest gap between distinct
 * x values (in ln x on a log axis); 0 with fewer than two distinct values.
 * @example pointDodgeStep([1, 2, 4], false) // 1/3
 */
export function pointDodgeStep(xs: ArrayLike<number>, log: boolean): number {
  const values = [...new Set(Array.from(xs, v => (log && v > 0 ? Math.log(v) : v)).filter(Number.isFinite))].sort((a, b) => a - b)
  let gap = Infinity
  for (let i = 1; i < values.length; i++) gap = Math.min(gap, values[i]! - values[i - 1]!)
  return Number.isFinite(gap) ? gap / 3 : 0
}

/**
 * Observable against one kinematic variable: each series as a filled band (or error bars),
 * optionally a ratio panel to a reference series (each series' band divided by the reference
 * central value, common practice for comparing sets) and an envelope drawn hatched and dashed.
 */
export function bandFigure(input: BandFigureInput): Figure {
  const n = input.positions.lo.length
  checkLengths(input, n)
  const reference = input.referenceId === undefined ? undefined : input.series.find(s => s.id === input.referenceId)
  if (input.referenceId !== undefined && !reference) throw new RangeError(`Reference series '${input.referenceId}' is not among the plotted series`)
  const all = Array.from({ length: n }, (_, i) => i)
  const groups: BinGroup[] = input.groups?.length ? input.groups : [{ label: '', indices: all }]
  for (const g of groups) for (const i of g.indices) if (!(i >= 0 && i < n)) throw new RangeError(`Group ${g.label} names bin ${i + 1}; there are ${n} bins`)
  const grouped = groups.length > 1
  const data: PlotTrace[] = []
  const draw = input.draw ?? 'band'
  const yValues: number[] = []
  const xValues: number[] = []

  groups.forEach((group, g) => {
    const idx = group.indices
    const m = idx.length
    const positions: BinPositions = { lo: subset(input.positions.lo, idx), ...(input.positions.hi ? { hi: subset(input.positions.hi, idx) } : {}) }
    xValues.push(...positions.lo as number[], ...((positions.hi ?? []) as number[]))
    const segments = layoutBins(positions, m)
    const panels: Array<{ axes: { xaxis: string, yaxis: string }, scale: (i: number, v: number) => number | null }> = [
      { axes: { xaxis: 'x', yaxis: 'y' }, scale: (_, v) => v }
    ]
    if (reference) {
      const divisor = subset(reference.band.central, idx)
      panels.push({ axes: { xaxis: 'x2', yaxis: 'y2' }, scale: (i, v) => (divisor[i] ? v / divisor[i]! : null) })
    }
    // Points at one x (no range to spread over) are set side by side, within a third of the
    // narrowest gap between distinct x values, so that no series hides another's error bars.
    const dodgeStep = pointDodgeStep(positions.lo, Boolean(input.variable.log))
    const positionOf = (i: number, k: number, count: number) => {
      const lo = positions.lo[i]!
      const hi = positions.hi?.[i]
      if (hi === undefined) {
        if (count < 2 || dodgeStep === 0) return lo
        const shift = dodgeStep * (k - (count - 1) / 2) / (count - 1)
        return input.variable.log && lo > 0 ? lo * Math.exp(shift) : lo + shift
      }
      const t = (k + 1) / (count + 1)
      return input.variable.log && lo > 0 ? lo * (hi / lo) ** t : lo + (hi - lo) * t
    }
    panels.forEach((panel, p) => {
      input.series.forEach((s, k) => {
        const colourIndex = grouped && input.series.length === 1 ? g : k
        const color = (grouped && input.series.length === 1 ? undefined : s.color) ?? FIGURE_PALETTE[colourIndex % FIGURE_PALETTE.length]!
        const dash = grouped && input.series.length > 1 ? DASHES[g % DASHES.length]! : 'solid'
        const central = subset(s.band.central, idx)
        const plus = subset(s.band.plus, idx)
        const minus = subset(s.band.minus, idx)
        const up: Transform = i => panel.scale(i, central[i]! + plus[i]!)
        const down: Transform = i => panel.scale(i, central[i]! - minus[i]!)
        const mid: Transform = i => panel.scale(i, central[i]!)
        if (p === 0) for (let i = 0; i < m; i++) yValues.push(central[i]! - minus[i]!, central[i]!, central[i]! + plus[i]!)
        const name = grouped ? (input.series.length === 1 ? group.label : `${s.label}, ${group.label}`) : s.label
        const common = { ...panel.axes, legendgroup: grouped ? `${s.id}-${g}` : s.id, name }
        const hover = `${name}<br>%{customdata[0]:.4g} +%{customdata[1]:.2g} −%{customdata[2]:.2g}<extra></extra>`
        if (draw === 'bars') {
          const local = Array.from({ length: m }, (_, i) => i)
          const count = input.series.length * groups.length
          const x = local.map(i => positionOf(i, k * groups.length + g, count))
          const y = local.map(i => mid(i))
          data.push({
            ...common, type: 'scatter', mode: 'markers', x, y, showlegend: p === 0,
            marker: { color, size: 6, symbol: SYMBOLS[(grouped ? g : k) % SYMBOLS.length] },
            error_y: { type: 'data', symmetric: false, array: local.map(i => (up(i) ?? Number.NaN) - (y[i] ?? Number.NaN)), arrayminus: local.map(i => (y[i] ?? Number.NaN) - (down(i) ?? Number.NaN)), color, thickness: 1.2, width: 3 },
            ...(positions.hi ? { error_x: { type: 'data', symmetric: false, array: local.map(i => positions.hi![i]! - x[i]!), arrayminus: local.map(i => x[i]! - positions.lo[i]!), color, thickness: 0.8, width: 0 } } : {}),
            customdata: local.map(i => [central[i], plus[i], minus[i], idx[i]]),
            hovertemplate: hover
          })
          return
        }
        const area = outline(positions, segments, up, down)
        data.push({ ...common, type: 'scatter', mode: 'lines', ...area, fill: 'toself', fillcolor: withAlpha(color, 0.25), line: { width: 0.8, color: withAlpha(color, 0.6), dash }, hoverinfo: 'skip', showlegend: p === 0 })
        const line = centralLine(positions, segments, mid)
        data.push({
          ...common, type: 'scatter', mode: 'lines', x: line.x, y: line.y, line: { width: 1.6, color, dash }, showlegend: false,
          customdata: line.index.map(i => (i === null ? null : [central[i], plus[i], minus[i], idx[i]])),
          hovertemplate: hover
        })
      })
      if (input.envelope) {
        const env = input.envelope
        const color = env.color ?? FIGURE_INK
        const lower = subset(env.lower, idx)
        const upper = subset(env.upper, idx)
        if (p === 0) yValues.push(...lower, ...upper)
        const area = outline(positions, segments, i => panel.scale(i, upper[i]!), i => panel.scale(i, lower[i]!))
        data.push({
          ...panel.axes, type: 'scatter', mode: 'lines', ...area, name: env.label, legendgroup: 'envelope', showlegend: p === 0 && g === 0,
          fill: 'toself', fillcolor: 'rgba(0,0,0,0)', fillpattern: { shape: '/', fgcolor: withAlpha(color, 0.5), size: 8, solidity: 0.1 },
          line: { width: 1.2, dash: 'dash', color }, hoverinfo: 'skip'
        })
      }
    })
  })
  const layout: Record<string, unknown> = houseLayout(input.title)
  const height = input.heightPx ?? 460
  const fontSize = 13
  // A y title longer than its panel wraps onto a second line instead of running past the panel.
  const yTitle = (a: AxisSpec, share: number) => wrapTitle(axisTitle(a), Math.max(12, Math.floor((height - 100) * share / (fontSize * 0.62))))
  const xRange = axisRange(input.variable, xValues)
  const yRange = axisRange(input.observable, yValues, { floorRatio: input.logFloor ?? 1e-4 })
  const yAxis = (share: number, extra: Record<string, unknown> = {}) =>
    houseAxis(input.observable, { ...yRange, title: { text: yTitle(input.observable, share), standoff: 6 }, ...extra })
  if (reference) {
    layout.xaxis = houseAxis(null, { anchor: 'y', matches: 'x2', showticklabels: false, type: input.variable.log ? 'log' : 'linear', ...xRange })
    layout.yaxis = yAxis(0.7, { domain: [0.3, 1] })
    layout.xaxis2 = houseAxis(input.variable, { anchor: 'y2', ...xRange, title: { text: axisTitle(input.variable), standoff: 6 } })
    layout.yaxis2 = houseAxis({ label: `ratio to ${reference.label}` }, { domain: [0, 0.25], title: { text: wrapTitle(`ratio to ${reference.label}`, 14), font: { size: 10 }, standoff: 6 } })
  }
  else {
    layout.xaxis = houseAxis(input.variable, { ...xRange, title: { text: axisTitle(input.variable), standoff: 6 } })
    layout.yaxis = yAxis(1)
  }
  if (input.note) {
    const note = noteAnnotation(input.note)
    layout.annotations = [note]
    // a note on two or more lines pushes the frame down instead of running off the top
    const lines = String(note.text).split('<br>').length
    const margin = layout.margin as { t: number }
    layout.margin = { ...margin, t: margin.t + (lines - 1) * 14 }
  }
  return { data, layout }
}

/** Characters a line of the note holds on the page's figure (about 700 px at 11 px). */
const NOTE_WIDTH_CHARS = 100

/** The figure's note: above the frame at its right end, clear of the curves and the legend; long notes wrap. */
export function noteAnnotation(text: string, widthChars = NOTE_WIDTH_CHARS): Record<string, unknown> {
  return { name: 'note', text: wrapTitle(text.replace(/<br>/g, ' '), widthChars), xref: 'paper', yref: 'paper', x: 1, y: 1, xanchor: 'right', yanchor: 'bottom', yshift: 4, showarrow: false, font: { size: 11 }, align: 'right' }
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
  /** Opens the figure-for-a-paper dialog (PDF, SVG, PNG at journal sizes). */
  openDialog(): void
}

/** Forwards export calls to a frame found later (a template ref), for a component to expose. */
export function forwardImages(frame: () => FigureImages | null | undefined): FigureImages {
  const get = () => {
    const f = frame()
    if (!f) throw new Error('The figure is not drawn yet')
    return f
  }
  return { exportImage: (format, options) => get().exportImage(format, options), toImage: (format, options) => get().toImage(format, options), openDialog: () => get().openDialog() }
}

// ── Figures for a paper: the export dialog's settings, the file metadata and the footer.

/** One column and two columns of a two-column journal page, in cm (common practice). */
export const FIGURE_WIDTHS_CM = { single: 8.6, double: 17.8 } as const
export const CM_TO_PT = 72 / 2.54

/** Font of exported figures: DejaVu Sans, served as FigureSans from public/fonts and embedded in PDFs. */
export const PAPER_FONT = 'FigureSans, "DejaVu Sans", sans-serif'

/** What the export dialog asks. */
export interface FigureExportSettings {
  /** Width of the figure on the page, cm. */
  widthCm: number
  /** Width over height. */
  aspect: number
  /** Font size of labels and ticks, pt. */
  fontPt: number
  legend: LegendPlace
  /** Print the provenance and the caution under the figure as well as in the file's metadata. */
  footer: boolean
  /** Resolution of a PNG, dots per inch. */
  dpi: number
}

export const DEFAULT_FIGURE_EXPORT: FigureExportSettings = { widthCm: FIGURE_WIDTHS_CM.single, aspect: 4 / 3, fontPt: 8, legend: 'below', footer: false, dpi: 300 }

/** Where a figure came from, for its metadata and footer. */
export interface FigureProvenance {
  /** File title ("Proton F2 at low x, Bramble-H 1.2"). */
  title: string
  /** "key: value" lines (study, set, prescription and CL, kernel, result version, review state, run by/at, exported at). */
  lines: string[]
  /** The caution that goes with every result. */
  caution: string
}

/** Size of the drawing in pt (1 px of the drawing is 1 pt on the page) for the settings. */
export function figureSizePt(s: FigureExportSettings): { width: number, height: number } {
  const width = Math.round(s.widthCm * CM_TO_PT)
  return { width, height: Math.round(width / s.aspect) }
}

/** One short footer line: the set and version, the prescription and CL, then the caution. */
export function footerText(p: FigureProvenance, width: number, fontPt: number): string {
  const text = `${p.title}. ${p.caution}`
  return wrapTitle(text, Math.max(30, Math.floor(width / (fontPt * 0.55))))
}

/**
 * A figure restyled for the page: its size in pt, the font size, the legend's place, titles
 * wrapped to fit, no interactive chrome, and the footer when asked.
 */
export function paperFigure(figure: Figure, s: FigureExportSettings, provenance?: FigureProvenance): Figure {
  const { width, height } = figureSizePt(s)
  const f = s.fontPt
  const layout: Record<string, unknown> = structuredClone(figure.layout)
  layout.width = width
  layout.height = height
  // the PDF's embedded font (DejaVu Sans, public/fonts), so that the widths Plotly measures hold in every format
  layout.font = { ...(layout.font as Record<string, unknown>), size: f, family: PAPER_FONT }
  layout.legend = { ...legendLayout(s.legend), font: { size: Math.max(5, f - 1) } }
  layout.showlegend = true
  delete layout.title
  const footerLines = s.footer && provenance ? footerText(provenance, width, f).split('<br>').length : 0
  const footerHeight = footerLines ? Math.ceil(footerLines * (f - 1) * 1.3) + 6 : 0
  layout.margin = { l: Math.round(4.5 * f), r: Math.round(1.5 * f), t: Math.round(2.2 * f), b: Math.round(4 * f) + footerHeight, pad: 0 }
  for (const key of Object.keys(layout).filter(k => /^[xy]axis\d*$/.test(k))) {
    const axis = { ...(layout[key] as Record<string, unknown>) }
    const title = axis.title as { text?: string, font?: Record<string, unknown> } | undefined
    if (title?.text) {
      const plain = title.text.replace(/<br>/g, ' ')
      const isY = key.startsWith('y')
      const domain = (axis.domain as [number, number] | undefined) ?? [0, 1]
      const room = (isY ? height : width) * (domain[1] - domain[0])
      const size = (title.font?.size as number | undefined) ? Math.max(5, f - 2) : f
      axis.title = { ...title, text: wrapTitle(plain, Math.max(8, Math.floor(room / (size * 0.6)))), font: { ...title.font, size }, standoff: Math.round(f / 2) }
    }
    axis.tickfont = { size: Math.max(5, f - 1) }
    layout[key] = axis
  }
  const noteSize = Math.max(5, f - 1)
  let noteLines = 0
  const annotations: Record<string, unknown>[] = ((layout.annotations as Record<string, unknown>[] | undefined) ?? []).map((a) => {
    const font = { ...(a.font as Record<string, unknown>), size: noteSize }
    if (a.name !== 'note') return { ...a, font }
    // the note wrapped to the page's width, with room above the frame for its lines
    const note = noteAnnotation(String(a.text), Math.max(20, Math.floor(width * 0.9 / (noteSize * 0.55))))
    noteLines = String(note.text).split('<br>').length
    return { ...note, font }
  })
  if (noteLines > 1) (layout.margin as { t: number }).t += Math.ceil((noteLines - 1) * noteSize * 1.3)
  if (footerLines && provenance) {
    // the footer is the layout's title placed at the image's bottom edge (titles take container
    // coordinates, annotations do not); a legend below the plot sits on top of it
    layout.title = {
      // anchored at its top: the lines of a wrapped footer run down to the bottom edge
      text: footerText(provenance, width, f), xref: 'container', yref: 'container', x: 0, y: (footerHeight - 2) / height, xanchor: 'left', yanchor: 'top',
      pad: { l: 4 }, font: { size: Math.max(5, f - 1), color: '#4a555b' }, automargin: false
    }
    if (s.legend === 'below') layout.legend = { ...(layout.legend as Record<string, unknown>), y: (footerHeight + 2) / height }
  }
  layout.annotations = annotations
  return { data: figure.data, layout }
}

const xmlEscape = (t: string) => t.replace(/[<>&"']/g, c => `&#${c.charCodeAt(0)};`)

/** The provenance and caution as plain text, one "key: value" a line. */
export function provenanceText(p: FigureProvenance): string {
  return [p.title, ...p.lines, `caution: ${p.caution}`].join('\n')
}

/**
 * An SVG file with the provenance inside: <title>, <desc> (readable by any SVG tool) and
 * <metadata> in Dublin Core terms (title, description, source, rights-free caution as a comment).
 */
export function svgWithMetadata(svg: string, p: FigureProvenance): string {
  const open = /<svg\b[^>]*>/.exec(svg)
  if (!open) throw new RangeError('The figure is not an SVG document')
  const block = `<title>${xmlEscape(p.title)}</title><desc>${xmlEscape(provenanceText(p))}</desc>`
    + `<metadata><rdf:RDF xmlns:rdf="http://www.w3.org/1999/02/22-rdf-syntax-ns#" xmlns:dc="http://purl.org/dc/elements/1.1/">`
    + `<rdf:Description><dc:title>${xmlEscape(p.title)}</dc:title><dc:creator>Sheaf</dc:creator>`
    + `<dc:description>${xmlEscape(provenanceText(p))}</dc:description></rdf:Description></rdf:RDF></metadata>`
  const at = open.index + open[0].length
  return svg.slice(0, at) + block + svg.slice(at)
}

let crcTable: Uint32Array | null = null
/** CRC-32 as PNG chunks use it (ISO 3309, polynomial 0xedb88320). */
export function crc32(bytes: Uint8Array): number {
  if (!crcTable) {
    crcTable = new Uint32Array(256)
    for (let n = 0; n < 256; n++) {
      let c = n
      for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1
      crcTable[n] = c >>> 0
    }
  }
  let c = 0xffffffff
  for (const b of bytes) c = crcTable[(c ^ b) & 0xff]! ^ (c >>> 8)
  return (c ^ 0xffffffff) >>> 0
}

function pngChunk(type: string, body: Uint8Array): Uint8Array {
  const out = new Uint8Array(12 + body.length)
  const view = new DataView(out.buffer)
  view.setUint32(0, body.length)
  for (let i = 0; i < 4; i++) out[4 + i] = type.charCodeAt(i)
  out.set(body, 8)
  view.setUint32(8 + body.length, crc32(out.subarray(4, 8 + body.length)))
  return out
}

/** Latin-1 text for a tEXt chunk: characters outside it become their closest ASCII words or '?'. */
export function latin1Text(t: string): string {
  const words: Record<string, string> = { 'σ': 'sigma', 'μ': 'mu', 'α': 'alpha', 'Δ': 'Delta', 'τ': 'tau', 'ν': 'nu', '−': '-', '–': '-', '—': '-', '×': 'x', '⁺': '+', '⁻': '-', '²': '^2', '₁': '1', '₂': '2', '⟨': '<', '⟩': '>' }
  return Array.from(t, c => words[c] ?? (c.charCodeAt(0) <= 0xff ? c : '?')).join('')
}

/**
 * A PNG with text chunks before its image data: per entry a tEXt chunk (Latin-1, as PNG
 * readers show it) and an iTXt chunk with the exact UTF-8 text (PNG specification, 11.3.4).
 */
export function pngWithText(png: Uint8Array, entries: Record<string, string>): Uint8Array {
  const signature = [137, 80, 78, 71, 13, 10, 26, 10]
  if (png.length < 33 || signature.some((b, i) => png[i] !== b)) throw new RangeError('The figure is not a PNG image')
  const ihdrEnd = 8 + 12 + new DataView(png.buffer, png.byteOffset).getUint32(8)
  const enc = new TextEncoder()
  const chunks: Uint8Array[] = []
  for (const [key, text] of Object.entries(entries)) {
    const latin = latin1Text(text)
    const t = new Uint8Array(key.length + 1 + latin.length)
    for (let i = 0; i < key.length; i++) t[i] = key.charCodeAt(i)
    for (let i = 0; i < latin.length; i++) t[key.length + 1 + i] = latin.charCodeAt(i)
    chunks.push(pngChunk('tEXt', t))
    const utf8 = enc.encode(text)
    const it = new Uint8Array(key.length + 5 + utf8.length)
    for (let i = 0; i < key.length; i++) it[i] = key.charCodeAt(i)
    it.set(utf8, key.length + 5) // keyword, 0, compression flag 0, method 0, empty language, 0, empty translated keyword, 0
    chunks.push(pngChunk('iTXt', it))
  }
  const size = png.length + chunks.reduce((a, c) => a + c.length, 0)
  const out = new Uint8Array(size)
  out.set(png.subarray(0, ihdrEnd), 0)
  let at = ihdrEnd
  for (const c of chunks) { out.set(c, at); at += c.length }
  out.set(png.subarray(ihdrEnd), at)
  return out
}

/** Reads the tEXt and iTXt chunks of a PNG (tests and the dialog's check). */
export function pngTextChunks(png: Uint8Array): Array<{ type: 'tEXt' | 'iTXt', key: string, text: string }> {
  const out: Array<{ type: 'tEXt' | 'iTXt', key: string, text: string }> = []
  const view = new DataView(png.buffer, png.byteOffset, png.byteLength)
  let at = 8
  while (at + 8 <= png.length) {
    const length = view.getUint32(at)
    const type = String.fromCharCode(...png.subarray(at + 4, at + 8))
    const body = png.subarray(at + 8, at + 8 + length)
    if (type === 'tEXt' || type === 'iTXt') {
      const zero = body.indexOf(0)
      const key = String.fromCharCode(...body.subarray(0, zero))
      const text = type === 'tEXt' ? String.fromCharCode(...body.subarray(zero + 1)) : new TextDecoder().decode(body.subarray(zero + 5))
      out.push({ type, key, text })
    }
    at += 12 + length
  }
  return out
}
