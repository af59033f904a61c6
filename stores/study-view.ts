import { defineStore } from 'pinia'
import { computed, ref, type Ref } from 'vue'
import type { BinColumn, BinRow as GridRow, RowCheck, RowProblem } from '#shared/bins'
import type { AxisSpec, BinPositions } from '#shared/export/figures'
import type { VariableName, VariableSpec } from '#shared/physics/kernels/registry'
import type { BinRow as SpecBin, StudyKFactors } from '#shared/physics/study/spec'
import type { BandJson } from '#shared/physics/uncertainty/band'
import type { IntervalRule } from '#shared/physics/uncertainty/bands'
import { PRESCRIPTION_LABELS } from '#shared/utils/prescriptions'
import type { JobPhase } from '#shared/queue/workflow'

// ── The bins grid of a study: which columns a kernel's variables give, and the conversions
// between the spec's bins and the grid's rows. Pure functions; the pages feed them the kernel's
// variables from the engine's registry (kernelVariables), so no kinematics are duplicated here.

/** How a variable is given in the bins: one value per bin, a range, or (loaded data) both. */
export type VariableLayout = 'point' | 'range' | 'mixed'

/** Label and unit of each bin variable, as axes, legends and keys write them. */
export const VARIABLE_NAMES: Readonly<Record<VariableName, { label: string, unit?: string }>> = {
  x: { label: 'x' }, q2: { label: 'Q²', unit: 'GeV²' }, y: { label: 'y' }, m: { label: 'M', unit: 'GeV' },
  z: { label: 'z' }, sqrtS: { label: '√s', unit: 'GeV' }
}

/** The layout each variable has in `bins`; a variable no bin gives yet takes `fallback`. */
export function layoutsOf(variables: readonly VariableSpec[], bins: readonly SpecBin[], fallback: (v: VariableSpec) => VariableLayout = defaultLayout): Record<string, VariableLayout> {
  const out: Record<string, VariableLayout> = {}
  for (const v of variables) {
    const point = bins.some(b => b[v.name] !== undefined)
    const range = bins.some(b => b[`${v.name}Min`] !== undefined || b[`${v.name}Max`] !== undefined)
    out[v.name] = point && range ? 'mixed' : point ? 'point' : range ? 'range' : fallback(v)
  }
  return out
}

/** New studies: rapidity in ranges (hadron colliders bin in y), everything else at points (common practice). */
export const defaultLayout = (v: VariableSpec): VariableLayout => (v.name === 'y' && v.label.startsWith('rapidity') ? 'range' : 'point')

/** Which K-factor columns the grid shows: none, the K-factor alone, or with its uncertainty. */
export type KFactorColumns = 'none' | 'values' | 'values-errors'

/** The grid's K-factor columns: K (> 0, needed in every bin once shown) and its uncertainty δK (≥ 0). */
export const K_FACTOR_COLUMNS: Record<'kFactor' | 'kFactorError', BinColumn> = {
  kFactor: { key: 'kFactor', label: 'K-factor', kind: 'number', min: 0, exclusiveMin: true, required: true, quantity: 'the K-factor' },
  kFactorError: { key: 'kFactorError', label: 'K-factor error', kind: 'number', min: 0, quantity: 'the K-factor error' }
}

const isKColumn = (key: string) => key === 'kFactor' || key === 'kFactorError'

/**
 * Grid columns: each variable as a point or a Min/Max pair (both for mixed data), the K-factor
 * columns when asked, then an optional label.
 */
export function gridColumns(variables: readonly VariableSpec[], layouts: Record<string, VariableLayout>, kFactors: KFactorColumns = 'none'): BinColumn[] {
  const columns: BinColumn[] = []
  for (const v of variables) {
    const { label, unit } = VARIABLE_NAMES[v.name]
    const layout = layouts[v.name] ?? defaultLayout(v)
    const required = layout !== 'mixed'
    if (layout !== 'range') columns.push({ key: v.name, label, unit, kind: 'number', required, quantity: label })
    if (layout !== 'point') {
      columns.push({ key: `${v.name}Min`, label: `${label} min`, unit, kind: 'range-lo', pairWith: `${v.name}Max`, required, quantity: label })
      columns.push({ key: `${v.name}Max`, label: `${label} max`, unit, kind: 'range-hi', required, quantity: label })
    }
  }
  if (kFactors !== 'none') columns.push(K_FACTOR_COLUMNS.kFactor)
  if (kFactors === 'values-errors') columns.push(K_FACTOR_COLUMNS.kFactorError)
  columns.push({ key: 'label', label: 'label', kind: 'text' })
  return columns
}

/** The K-factor columns a study's spec fills. */
export const kFactorColumnsOf = (k: StudyKFactors | undefined): KFactorColumns => (!k ? 'none' : k.errors ? 'values-errors' : 'values')

/** The spec's bins as grid rows (every column present, empty as null), with each bin's K-factor when given. */
export function rowsFromBins(bins: readonly SpecBin[], columns: readonly BinColumn[], kFactors?: StudyKFactors): GridRow[] {
  return bins.map((b, i) => Object.fromEntries(columns.map((c) => {
    if (c.key === 'kFactor') return [c.key, kFactors?.values[i] ?? null]
    if (c.key === 'kFactorError') return [c.key, kFactors?.errors?.[i] ?? null]
    return [c.key, (b as Record<string, number | string | undefined>)[c.key] ?? null]
  })))
}

/**
 * The K-factor columns of the grid rows as the spec's per-bin lists (null without a K-factor
 * column). An empty or unreadable cell stays in the list as it is, so the server's check names
 * its bin and column; an all-empty error column gives no errors.
 */
export function kFactorsFromRows(rows: readonly Readonly<GridRow>[], columns: readonly BinColumn[]): { values: unknown[], errors?: unknown[] } | null {
  if (!columns.some(c => c.key === 'kFactor')) return null
  const values = rows.map(r => r.kFactor ?? null)
  const errors = columns.some(c => c.key === 'kFactorError') ? rows.map(r => r.kFactorError ?? null) : []
  return errors.some(e => e !== null) ? { values, errors } : { values }
}

/** Grid rows as the spec's bins: numbers in kinematic columns, the label when given (K-factors apart). */
export function binsFromRows(rows: readonly Readonly<GridRow>[], columns: readonly BinColumn[]): SpecBin[] {
  return rows.map((row) => {
    const bin: Record<string, number | string> = {}
    for (const c of columns) {
      const v = row[c.key]
      if (isKColumn(c.key)) continue
      if (c.key === 'label') {
        if (v !== null && v !== undefined && String(v).trim() !== '') bin.label = String(v).trim()
      }
      else if (v !== null && v !== undefined) bin[c.key] = v as number
    }
    return bin as SpecBin
  })
}

/**
 * Rows after switching `variable` to `layout`: a point becomes the lower end of a range (the
 * upper end left to fill), a range becomes its midpoint.
 */
export function switchLayout(rows: readonly Readonly<GridRow>[], variable: VariableName, layout: 'point' | 'range'): GridRow[] {
  const lo = `${variable}Min`
  const hi = `${variable}Max`
  return rows.map((row) => {
    const next: GridRow = { ...row }
    if (layout === 'range' && row[variable] !== null && row[variable] !== undefined) {
      next[lo] = next[lo] ?? row[variable]!
      next[hi] = next[hi] ?? null
    }
    if (layout === 'point') {
      const a = row[lo]
      const b = row[hi]
      if (next[variable] == null && typeof a === 'number' && typeof b === 'number') next[variable] = (a + b) / 2
      else if (next[variable] == null && typeof a === 'number') next[variable] = a
    }
    delete next[layout === 'range' ? variable : lo]
    if (layout === 'point') delete next[hi]
    return next
  })
}

/** The engine's own domain check of every kinematic cell (x in (0, 1), Q² > 0 …), as a grid check. */
export function domainCheck(variables: readonly VariableSpec[]): RowCheck {
  // the cells of each variable, named once (the check runs on every row of 10,000 at a load)
  const cells = variables.map(v => ({ check: v.check, keys: [v.name, `${v.name}Min`, `${v.name}Max`] }))
  return (row) => {
    const problems: RowProblem[] = []
    for (const { check, keys } of cells) {
      for (const key of keys) {
        const value = row[key]
        const why = typeof value === 'number' ? check(value) : null
        if (why) problems.push({ column: key, reason: why })
      }
    }
    return problems
  }
}

/** A located server issue: 1-based bin, the column when the engine knows it. */
export interface BinIssue { bin?: number, column?: string, message: string }

/**
 * The cell a located server message is about: the range end the message says to narrow
 * ("narrow Q² to at most …" → Q² max), else the quantity it names first (a factorisation scale
 * μ_F² stands for Q² or M, whichever the bins have), else the first kinematic column — never the
 * label.
 */
export function issueColumn(reason: string, columns: readonly BinColumn[]): string {
  const byQuantity = (q: string, kind?: BinColumn['kind']) => columns.find(c => c.quantity === q && (!kind || c.kind === kind))
  const narrow = /narrow (x|Q²|M|y) to at (most|least)/.exec(reason)
  if (narrow) {
    const c = byQuantity(narrow[1]!, narrow[2] === 'most' ? 'range-hi' : 'range-lo') ?? byQuantity(narrow[1]!)
    if (c) return c.key
  }
  // A reach message names the quantity first ("x = 1e-7 … is below the set's smallest x node").
  const named = /(?:^|: |\()(x|Q²|M|y|μ_F²)[₁₂]?(?: = | \()/.exec(reason)?.[1]
  if (named === 'μ_F²') {
    const c = byQuantity('Q²') ?? byQuantity('M')
    if (c) return c.key
  }
  const c = named ? byQuantity(named) : undefined
  return (c ?? columns.find(k => k.kind !== 'text' && k.key !== 'label') ?? columns[0]!).key
}

/**
 * The problems the server found (400/422 `data.issues`) as a grid check: each on its cell, or,
 * when the server names no column of the grid (reach problems), on the cell {@link issueColumn} reads from the message.
 */
export function serverCheck(issues: readonly BinIssue[], columns: readonly BinColumn[]): RowCheck {
  const keys = new Set(columns.map(c => c.key))
  const byRow = new Map<number, RowProblem[]>()
  for (const issue of issues) {
    if (!issue.bin || issue.bin < 1) continue
    const reason = issue.message.replace(/(^|: )bin \d+(, column \w+)?: /, '$1')
    const column = issue.column && keys.has(issue.column) ? issue.column : issueColumn(reason, columns)
    byRow.set(issue.bin - 1, [...(byRow.get(issue.bin - 1) ?? []), { column, reason }])
  }
  return (_row, index) => byRow.get(index)
}

// ── What the study page shows, kept across pages (client state only, never server data).

/** Choices on one study's results. `null` means "the study's own choice". */
export interface StudyView {
  /** Prescription per set kind ('hessian-pairs' → 'hessian-asymmetric' …). */
  prescriptionByKind: Record<string, string>
  clPercent: number | null
  /** Set whose band the ratio panel divides by. */
  referenceSetId: string | null
  /** Set whose values the grid, the matrices and the review panel show. */
  focusSetId: string | null
  /** Chosen result version per set (result id); absent: the newest. */
  versionBySet: Record<string, string>
  /** 0-based bin for the eigenvector bars. */
  bin: number
  /** Kinematic variable on the plot's horizontal axis. */
  variable: VariableName | null
  showScale: boolean
}

const emptyView = (): StudyView => ({
  prescriptionByKind: {}, clPercent: null, referenceSetId: null, focusSetId: null, versionBySet: {}, bin: 0, variable: null, showScale: true
})

/** The result choices of every study opened in this tab: `view(id)` is reactive and writable. */
export const useStudyViewStore = defineStore('study-view', () => {
  const views = ref<Record<string, StudyView>>({})

  function view(studyId: string): StudyView {
    if (!views.value[studyId]) views.value[studyId] = emptyView()
    return views.value[studyId]!
  }

  function reset(studyId: string) {
    views.value[studyId] = emptyView()
  }

  return { views, view, reset }
})

// ── Words and numbers as the pages show them.

export const KIND_LABELS: Record<string, string> = {
  'hessian-pairs': 'Hessian pairs', 'hessian-one-sided': 'Hessian one-sided', 'replicas': 'Monte-Carlo replicas'
}

/** Words for each prescription, as the exports print them (plus the study's 'auto'). */
export const PRESCRIPTION_NAMES: Readonly<Record<string, string>> = { auto: 'the set\'s default', ...PRESCRIPTION_LABELS }

const SUPERSCRIPT = '⁻⁰¹²³⁴⁵⁶⁷⁸⁹'
/** A grid bound as people write it: 0.95, 10⁻⁵, 2.5×10⁸. */
export function sciText(v: number): string {
  if (v === 0 || (Math.abs(v) >= 1e-2 && Math.abs(v) < 1e4)) return String(Number(v.toPrecision(3)))
  const [m, e] = v.toExponential(2).split('e') as [string, string]
  const power = String(Number(e)).replace(/[-0-9]/g, c => SUPERSCRIPT['-0123456789'.indexOf(c)]!)
  return `${Number(m) === 1 ? '' : `${Number(m)}×`}10${power}`
}

/** The order a reader names a bin's variables in: √s, x, z, Q², then mass before rapidity. */
const READING_ORDER: readonly VariableName[] = ['sqrtS', 'x', 'z', 'q2', 'm', 'y']

/** A bin as a reader names it: "M 60–80 GeV, y −1–1", "x 0.01, Q² 10 GeV²". */
export function binText(bin: SpecBin | undefined): string {
  if (!bin) return ''
  const parts = READING_ORDER.flatMap((n) => {
    const { label, unit } = VARIABLE_NAMES[n]
    const lo = bin[`${n}Min`]
    const hi = bin[`${n}Max`]
    const value = bin[n] !== undefined ? String(bin[n]) : lo !== undefined && hi !== undefined ? `${lo}–${hi}` : null
    return value === null ? [] : [`${label} ${value.replace(/-/g, '−')}${unit ? ` ${unit}` : ''}`]
  })
  return [bin.label, ...parts].filter(Boolean).join(', ')
}

export const targetText = (t: { type: string, z?: number, a?: number } | null | undefined) =>
  !t ? '—' : t.type === 'nucleus' ? `nucleus Z = ${t.z}, A = ${t.a}` : t.type

/** The message of a failed $fetch (the route's statusMessage), and its located issues. */
export function fetchFailure(err: unknown): { status: number, message: string, issues: BinIssue[] } {
  const e = err as { statusCode?: number, data?: { statusMessage?: string, message?: string, data?: { issues?: BinIssue[] } } }
  return {
    status: e.statusCode ?? 0,
    message: e.data?.statusMessage ?? e.data?.message ?? 'The server could not be reached; try again',
    issues: e.data?.data?.issues ?? []
  }
}

// ── Shapes of the study and result routes the pages read (server/api/workspaces/[wid]/…).

export interface ResultRow {
  id: string, studyId: string, setId: string, version: number, studyRevision: number
  state: 'queued' | 'running' | 'done' | 'failed' | 'cancelled'
  /** The phase named in the progress (queued, evaluating members, combining, storing). */
  phase?: JobPhase
  progress: { done: number, total: number }, binCount: number, error: string | null, cancelRequested: boolean
  reviewState: 'draft' | 'submitted' | 'returned' | 'approved', frozen: boolean
  startedAt: string | null, finishedAt: string | null, createdAt: string
}

export interface StudySpecJson {
  kernel: string, options: Record<string, unknown>, bins: SpecBin[]
  quadratureOrder?: number, fullRangeOrder?: number, scaleFactor?: number, rangeMode?: string, title?: string
  kFactors?: StudyKFactors
  /** Vary the second set too (apart, in quadrature); see Settings.vue. */
  varySecondSet?: boolean
}

export interface StudyDetail {
  id: string, name: string, description: string, spec: StudySpecJson, setIds: string[], secondSetId: string | null
  prescription: string, clPercent: number, revision: number, unit: string | null, updatedAt: string
  results: ResultRow[], measurements: Array<{ id: string, name: string, pointCount: number, createdAt: string }>
  /** The sets the study and its versions name (the page's first paint needs no more of the library). */
  sets: Array<{ id: string, name: string, version: string, kind: string, memberCount: number }>
}

/** The engine's band in its JSON form (null where a relative width is undefined), as the API sends it. */
export type { BandJson }

export interface TrailEntry { action: string, at: string, actorName: string | null, comment?: string, detail?: Record<string, unknown> }

export interface ResultDetail extends ResultRow {
  set: { id: string, name: string, version: string, kind: string, family: string, memberCount: number, confidenceLevelPercent: number }
  spec: StudySpecJson
  requestedByName: string | null
  /** Which bins `spec.bins`, `bands` and `scaleVariation` hold (0-based offset, count, all bins). */
  bins?: { offset: number, limit: number, total: number }
  reporting: { prescription: string, clPercent: number, available: string[], setConfidenceLevelPercent: number }
  /** The study's second set when this version ran, and how its members varied (absent variation: held at its central member). */
  second?: { id: string, name: string, version: string, kind: string, family?: string, memberCount?: number, variation?: 'central' | 'paired' | 'apart' } | null
  bands: (BandJson & {
    prescription: string, clPercent: number, pdf: BandJson, alphas: number[] | null, interval?: IntervalRule
    /** An apart run's parts: the result's set alone, the second set alone (its own prescription), and their combination (= the band). */
    apart?: { set: BandJson & { prescription: string }, second: BandJson & { prescription: string, name: string }, combined: BandJson }
  }) | null
  /** Central member at μ_F = κ μ for each κ (values[k]), and the envelope about κ = 1: nominal ± up/down; `label` says which scales moved. */
  scaleVariation: { kappas: number[], values: number[][], nominal: number[], up: number[], down: number[], label?: string, variation?: string } | null
  /** The K-factors of the page's bins and their uncertainty δX at the band's CL, apart from the band; null without K-factors. */
  kFactors: { values: number[], errors: number[] | null, source: string | null, addedInQuadrature: boolean, error: number[] | null, combined: BandJson | null } | null
  trail: { reviews: TrailEntry[], events: TrailEntry[] }
  caution: string
}

/**
 * The curves a result adds to the band plot: its band, labelled by how a second set entered it
 * ("correlated: members paired"), and for an apart run also each set's part alone.
 * @example resultSeries(apartDetail).map(s => s.id) // [setId, `${setId}:set`, `${setId}:second`]
 */
export function resultSeries(d: Pick<ResultDetail, 'setId' | 'set' | 'second' | 'bands'>): Array<{ id: string, label: string, band: BandJson }> {
  if (!d.bands) return []
  const name = `${d.set.name} ${d.set.version}`
  const variation = d.second?.variation ?? 'central'
  const apart = d.bands.apart
  if (variation === 'apart' && apart) {
    return [
      { id: d.setId, label: `${name} ⊕ ${apart.second.name} (in quadrature)`, band: d.bands },
      { id: `${d.setId}:set`, label: `${name} alone (${apart.second.name} at its central member)`, band: apart.set },
      { id: `${d.setId}:second`, label: `${apart.second.name} alone (${name} at its central member)`, band: apart.second }
    ]
  }
  return [{ id: d.setId, label: variation === 'paired' ? `${name} (correlated: members paired with ${d.second!.name})` : name, band: d.bands }]
}

const BIN_KEYS = ['x', 'xMin', 'xMax', 'q2', 'q2Min', 'q2Max', 'y', 'yMin', 'yMax', 'm', 'mMin', 'mMax', 'z', 'zMin', 'zMax', 'sqrtS', 'sqrtSMin', 'sqrtSMax', 'label'] as const

/** Whether two lists of bins are the same kinematics (key order does not matter; stored JSON is reordered). */
export function sameBins(a: readonly SpecBin[], b: readonly SpecBin[]): boolean {
  return a.length === b.length && a.every((p, i) => BIN_KEYS.every(k => (p[k] ?? null) === (b[i]![k] ?? null)))
}

/** Whether a result's K-factor values are those of the draft's K columns (both none counts as the same). */
export function sameKFactors(run: { values: readonly unknown[] } | undefined | null, draft: { values: readonly unknown[] } | null): boolean {
  return JSON.stringify(run?.values ?? null) === JSON.stringify(draft?.values ?? null)
}

/** The sentence under the grid on a result's K-factors: used, their source, where their uncertainty is. */
export function kFactorNote(k: NonNullable<ResultDetail['kFactors']>): string {
  const source = k.source ? `source: ${k.source}` : 'no source given'
  const error = !k.error
    ? 'No K-factor uncertainty was given.'
    : k.addedInQuadrature
      ? 'Their uncertainty δ(K) Δ is shown apart and also added in quadrature to the PDF band (±Δ ⊕ δ(K)).'
      : 'Their uncertainty δ(K) Δ is shown apart from the PDF band, not added to it.'
  return `The values are multiplied by per-bin K-factors (${source}). ${error} K-factors are your responsibility.`
}

/**
 * The result version shown for each of the study's sets: the one chosen in the view, else the
 * newest finished one, else the newest of any state.
 */
export function shownResults(study: StudyDetail, view: StudyView): ResultRow[] {
  return study.setIds.flatMap((setId) => {
    const mine = study.results.filter(r => r.setId === setId)
    const chosen = mine.find(r => r.id === view.versionBySet[setId]) ?? mine.find(r => r.state === 'done') ?? mine[0]
    return chosen ? [chosen] : []
  })
}

/** The query of a result's bands for the view's choices (the set's default when nothing is chosen). */
export function bandsQuery(view: StudyView, kind: string) {
  const p = view.prescriptionByKind[kind]
  return { ...(p && p !== 'auto' ? { prescription: p } : {}), ...(view.clPercent ? { cl: view.clPercent } : {}) }
}

/**
 * The finished results shown on a study's page with their bands for the view's prescription and
 * CL (GET …/results/[rid]?prescription=&cl=, recomputed from the stored members, no new job).
 */
export async function useStudyResults(workspaceId: Ref<string | null>, study: Ref<StudyDetail | undefined>, view: StudyView, setKinds: Ref<Record<string, string>>, binsOffset?: Ref<number>) {
  const done = computed(() => (study.value ? shownResults(study.value, view).filter(r => r.state === 'done') : []))
  // Past a few thousand bins the API sends one page of bins (ResultDetail.bins); binsOffset picks it.
  const page = computed(() => (binsOffset?.value ? { binsOffset: binsOffset.value } : {}))
  const requests = computed(() => done.value.map(r => ({ id: r.id, query: { ...bandsQuery(view, setKinds.value[r.setId] ?? ''), ...page.value } })))
  const key = computed(() => `study-results-${study.value?.id}-${JSON.stringify(requests.value)}`)
  const fetcher = useRequestFetch() // forwards the session cookie during the server render
  const { data, pending, error, refresh } = await useAsyncData(key, () =>
    Promise.all(requests.value.map(r => fetcher<ResultDetail>(`/api/workspaces/${workspaceId.value}/results/${r.id}`, { query: r.query }))),
  // Client-side only: the bands stay out of the server-rendered page (the first paint shows the
  // study and its bins; the bands follow).
  { default: () => [] as ResultDetail[], server: false, lazy: true })
  return { done, details: data, pending, error, refresh }
}

const AXES: Record<VariableName, AxisSpec> = { x: { label: 'x', log: true }, q2: { label: 'Q²', unit: 'GeV²', log: true }, m: { label: 'M', unit: 'GeV', log: true }, y: { label: 'y' }, z: { label: 'z' }, sqrtS: { label: '√s', unit: 'GeV' } }

/** True when all values are positive and span more than a factor 30 (worth a log axis). */
export function spansDecades(values: ArrayLike<number>): boolean {
  const v = Array.from(values).filter(Number.isFinite)
  return v.length > 1 && v.every(a => a > 0) && Math.max(...v) / Math.min(...v) > 30
}

/**
 * Where the bins sit on the plot's horizontal axis: the chosen variable, else the one whose
 * values differ most between bins; edges for ranges, points otherwise; bin numbers without kinematics.
 */
export function binAxis(bins: readonly SpecBin[], variables: readonly VariableSpec[], chosen: VariableName | null) {
  const spread = (n: VariableName) => new Set(bins.map(b => b[n] ?? b[`${n}Min`])).size
  const name = chosen && variables.some(v => v.name === chosen) ? chosen : [...variables].sort((a, b) => spread(b.name) - spread(a.name))[0]?.name ?? null
  if (!name) return { variable: null, positions: { lo: bins.map((_, i) => i + 1) } as BinPositions, axis: { label: 'bin' } as AxisSpec, draw: 'bars' as const }
  const ranged = bins.every(b => b[`${name}Min`] !== undefined && b[`${name}Max`] !== undefined)
  const positions: BinPositions = ranged
    ? { lo: bins.map(b => b[`${name}Min`]!), hi: bins.map(b => b[`${name}Max`]!) }
    : { lo: bins.map(b => b[name] ?? b[`${name}Min`] ?? Number.NaN) }
  const axis = { ...AXES[name], log: Boolean(AXES[name].log) && spansDecades(positions.hi ?? positions.lo) }
  // Repeated positions (another variable changes) read better as points than as a line.
  const draw = ranged || new Set(positions.lo as number[]).size === bins.length ? 'band' as const : 'bars' as const
  return { variable: name, positions, axis, draw }
}
