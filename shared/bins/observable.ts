/**
 * The observable a study reports, named and given its unit from the bin layout. One function for
 * the page, the axis titles and every export, so they can never disagree.
 *
 * A kernel gives a quantity differential in some of its bin variables (Drell–Yan: d²σ/dM dy).
 * In each bin a variable is a point or a range:
 * - a point keeps the derivative (d²σ/dM dy at M, y);
 * - a range that the study integrates over removes that derivative (y from −2.5 to 2.5
 *   integrated: dσ/dM, and the unit loses nothing since y has none; M from 100 to 200 GeV
 *   integrated: the unit pb/GeV × GeV = pb). A range over a variable the quantity is not
 *   differential in (F₂ over a Q² range) gives ∫ F₂ dQ², its unit multiplied by the variable's;
 * - a range the study averages over (rangeMode 'average': the integral divided by the width)
 *   keeps the derivative and the unit and is written ⟨…⟩.
 * (Common practice of analysis notes: a cross-section binned in a variable is quoted as the
 * integral over the bin, or as the bin average of the differential one, ⟨dσ/dM⟩.)
 *
 * A study reports in one unit: bins whose layout gives another unit than bin 1 are refused by
 * {@link observableIssues}, located by bin and column; bins that only change the name are
 * named per bin.
 */
import { kernelDefinition, type KernelDefinition, type VariableName } from '../physics/kernels/registry'
import { kernelVariables, type StudySpec } from '../physics/study/spec'

/** What the observable is called and measured in. */
export interface Observable {
  /** Plain text ("dσ/dM", "⟨d²σ/dM dy⟩", "σ"). */
  name: string
  /** The name as LaTeX math without dollars. */
  latex: string
  /** Unit ("pb/GeV", "μb", "GeV²"); null when dimensionless. */
  unit: string | null
  /** Each bin's name, when the bins give different names (in the same unit). */
  perBin?: string[]
}

/** One problem of the bin layout, located like the engine's issues. */
export interface ObservableIssue {
  /** 1-based bin. */
  bin: number
  column: string
  path: Array<string | number>
  message: string
}

/** The part of a study the observable depends on (a StudySpec, or a draft with the same fields). */
export type ObservableSpec = Pick<StudySpec, 'kernel' | 'options' | 'bins'> & { rangeMode?: string }

/** The kernels that give a derivative: base symbol and the variables it is differential in, in print order. */
const DIFFERENTIAL: Record<string, VariableName[]> = {
  'drell-yan': ['m', 'y'],
  'dis-nc-d2sigma': ['x', 'q2'],
  'dis-cc-d2sigma': ['x', 'y'],
  'w-plus': ['y'], 'w-minus': ['y'], 'z': ['y'], 'higgs-ggf': ['y']
}

const SYMBOL: Record<VariableName, { text: string, latex: string }> = {
  x: { text: 'x', latex: 'x' }, q2: { text: 'Q²', latex: 'Q^{2}' }, y: { text: 'y', latex: 'y' }, m: { text: 'M', latex: 'M' },
  z: { text: 'z', latex: 'z' }, sqrtS: { text: '√s', latex: '\\sqrt{s}' }
}

/** LaTeX of the kernels' plain quantities that are not derivatives. */
const QUANTITY_LATEX: Record<string, string> = {
  'F₂': 'F_{2}', 'F_L': 'F_{L}', '2xF₁': '2xF_{1}', 'xF₃': 'xF_{3}', 'σ_r': '\\sigma_{r}', 'σ': '\\sigma',
  'user expression': '\\mathrm{user\\ expression}',
  '(1/σ_tot) dσ^h/dz': '(1/\\sigma_{\\mathrm{tot}})\\,\\mathrm{d}\\sigma^{h}/\\mathrm{d}z',
  'M^h': 'M^{h}', 'M^h/M^h̄': 'M^{h}/M^{\\bar{h}}', 'M^h − M^h̄': 'M^{h} - M^{\\bar{h}}', 'R^{h/h′}': 'R^{h/h\\prime}'
}

const SUPER: Record<string, string> = { 2: '²', 3: '³', 4: '⁴' }

/** Cross-section units as people read them (μb, not ub). */
export const unitText = (unit: string) => (unit === 'ub' ? 'μb' : unit)

/** "pb/GeV", "pb", "pb·GeV", "GeV²" from a base unit ('' for a pure number) and a power of GeV. */
function unitOf(base: string, power: number): string | null {
  const gev = (p: number) => `GeV${p === 1 ? '' : SUPER[p] ?? `^${p}`}`
  if (power === 0) return base || null
  if (power < 0) return `${base || '1'}/${gev(-power)}`
  return base ? `${base}·${gev(power)}` : gev(power)
}

type Layout = Map<VariableName, 'point' | 'range'>

/** How bin `row` gives each of the kernel's variables. */
function layoutOf(row: ObservableSpec['bins'][number], names: readonly VariableName[]): Layout {
  const r = row as Record<string, unknown>
  return new Map(names.map(n => [n, r[`${n}Min`] !== undefined || r[`${n}Max`] !== undefined ? 'range' : 'point']))
}

/** The observable of one single (non-composite) kernel for one bin layout. */
function singleObservable(def: KernelDefinition, options: Record<string, unknown>, layout: Layout, mode: 'integrate' | 'average'): Observable {
  const variables = def.variables(options)
  const differential = DIFFERENTIAL[def.id] ?? []
  const ranged = variables.filter(v => layout.get(v.name) === 'range')
  const averaged = mode === 'average' && ranged.length > 0
  const integrated = mode === 'integrate' ? ranged : []
  const kept = differential.filter(n => !integrated.some(v => v.name === n))
  let name: string
  let latex: string
  if (differential.length) {
    const n = kept.length
    const d = (text: boolean) => (n > 1 ? (text ? `d${SUPER[n]}` : `\\mathrm{d}^{${n}}`) : (text ? 'd' : '\\mathrm{d}'))
    name = n === 0 ? 'σ' : `${d(true)}σ/${kept.map(k => `d${SYMBOL[k].text}`).join(' ')}`
    latex = n === 0 ? '\\sigma' : `${d(false)}\\sigma/${kept.map(k => `\\mathrm{d}${SYMBOL[k].latex}`).join('\\,')}`
  }
  else {
    const user = def.id === 'user' ? (options as { unitLabel?: string }).unitLabel : undefined
    name = def.quantity
    latex = QUANTITY_LATEX[def.quantity] ?? def.quantity.replace(/^dL_(\w+)\/dτ$/, '\\mathrm{d}L_{$1}/\\mathrm{d}\\tau')
    if (user) latex = QUANTITY_LATEX['user expression']!
  }
  // Ranges integrated over a variable the quantity is not differential in: ∫ F₂ dQ².
  const extra = integrated.filter(v => !differential.includes(v.name))
  if (extra.length) {
    name = `${'∫'.repeat(extra.length)} ${name} ${extra.map(v => `d${SYMBOL[v.name].text}`).join(' ')}`
    latex = `${'\\int'.repeat(extra.length)} ${latex}\\,${extra.map(v => `\\mathrm{d}${SYMBOL[v.name].latex}`).join('\\,')}`
  }
  if (averaged) {
    name = `⟨${name}⟩`
    latex = `\\langle ${latex} \\rangle`
  }
  // The unit: the kernel's, times the unit of each integrated variable.
  let unit: string | null
  const userLabel = def.id === 'user' ? (options as { unitLabel?: string }).unitLabel : undefined
  if (userLabel) unit = userLabel
  else {
    const power = -def.gevPower + integrated.reduce((p, v) => p + v.gevPower, 0)
    const base = def.crossSection ? unitText(String((options as { unit?: string }).unit ?? 'pb')) : ''
    unit = unitOf(base, power)
  }
  return { name, latex, unit }
}

/** What a DIS nuclear ratio divides by, in the words of its name. */
const DIS_RATIO_DENOMINATORS: Readonly<Record<string, string>> = { proton: 'p', isospin: '(Z p + N n)/A', isoscalar: '½(p + n)', deuteron: 'D' }

/**
 * The name of a DIS nuclear ratio: the structure function's ratio per nucleon, nucleus over its
 * reference, e.g. "F₂ ratio per nucleon, A over ½(p + n)".
 */
function disNuclearRatioName(quantity: string, options: Record<string, unknown>): string {
  const denominator = typeof options.denominator === 'string' ? options.denominator : 'proton'
  return `${quantity} ratio per nucleon, A over ${DIS_RATIO_DENOMINATORS[denominator] ?? denominator}`
}

/** The observable of bin `row` of the spec (0-based `index` only for messages). */
export function binObservable(spec: ObservableSpec, row: ObservableSpec['bins'][number]): Observable {
  const def = kernelDefinition(spec.kernel)
  const mode = spec.rangeMode === 'average' ? 'average' : 'integrate'
  const options = spec.options as Record<string, unknown>
  const names = kernelVariables(def, options).map(v => v.name)
  const layout = layoutOf(row, names)
  if (!def.composite) return singleObservable(def, options, layout, mode)
  // A composite with a name of its own (multiplicities and their ratios): a pure number per bin,
  // the ratio of the bin's integrals whatever the layout.
  if (def.quantity) return { name: def.quantity, latex: QUANTITY_LATEX[def.quantity] ?? '', unit: null }
  // A ratio or asymmetry is a pure number; its title names the quantity of its parts.
  const [part] = def.parts(options)
  const inner = kernelDefinition(part.kernel) as KernelDefinition
  const innerObs = singleObservable(inner, part.options, layout, mode)
  if (def.id === 'nuclear-ratio' && part.kernel.startsWith('dis-')) return { name: disNuclearRatioName(innerObs.name, options), latex: '', unit: null }
  const name = def.title.includes(inner.quantity) ? def.title.replace(inner.quantity, innerObs.name) : def.title
  return { name, latex: '', unit: null }
}

/**
 * Every bin's observable, worked out once per layout: a bin's observable depends on the bin only
 * through which variables are ranges, and 10,000 bins have a handful of layouts (the page works
 * out the observable of a 10,000-bin study while it loads). Bins of one layout share one object.
 */
function binObservables(spec: ObservableSpec): Observable[] {
  const names = kernelVariables(kernelDefinition(spec.kernel), spec.options as Record<string, unknown>).map(v => v.name)
  const ends = names.map(n => [`${n}Min`, `${n}Max`] as const)
  const byLayout = new Map<string, Observable>()
  return spec.bins.map((row) => {
    const r = row as Record<string, unknown>
    let key = ''
    for (const [lo, hi] of ends) key += r[lo] !== undefined || r[hi] !== undefined ? 'r' : 'p'
    let o = byLayout.get(key)
    if (!o) byLayout.set(key, o = binObservable(spec, row))
    return o
  })
}

/**
 * The issues of a study whose bins do not all give the unit of bin 1 (a ranged M beside a point
 * M: pb beside pb/GeV), at most `limit`. Bins that change only the name (x integrated in some
 * bins of a d²σ/dx dQ² study, at a point in others; the unit stays pb) are allowed: the name is
 * then given per bin ({@link Observable.perBin}).
 */
export function observableIssues(spec: ObservableSpec, limit = 20): ObservableIssue[] {
  return spec.bins.length ? issuesOf(spec, binObservables(spec), limit) : []
}

/** {@link observableIssues} from the bins' observables, worked out once by the caller. */
function issuesOf(spec: ObservableSpec, each: readonly Observable[], limit: number): ObservableIssue[] {
  const def = kernelDefinition(spec.kernel)
  const names = kernelVariables(def, spec.options as Record<string, unknown>).map(v => v.name)
  const first = each[0]!
  const firstLayout = layoutOf(spec.bins[0]!, names)
  const issues: ObservableIssue[] = []
  const describe = (o: Observable) => `${o.name} [${o.unit ?? 'dimensionless'}]`
  for (let i = 1; i < spec.bins.length && issues.length < limit; i++) {
    const row = spec.bins[i]!
    const o = each[i]!
    if (o.unit === first.unit) continue
    const layout = layoutOf(row, names)
    const variable = names.find(n => layout.get(n) !== firstLayout.get(n)) ?? names[0]!
    const column = layout.get(variable) === 'range' ? `${variable}Min` : variable
    issues.push({
      bin: i + 1, column, path: ['bins', i, column],
      message: `bin ${i + 1}, column ${column}: this bin gives ${describe(o)} but bin 1 gives ${describe(first)}; `
        + `a study reports in one unit, so give ${SYMBOL[variable].text} as a range in every bin or as a point in every bin`
    })
  }
  return issues
}

/**
 * The observable of a study. When its bins give different names in one unit, `name` and `latex`
 * list them ("dσ/dx or σ") and `perBin` gives each bin's. Throws a RangeError naming the first
 * bin and column whose unit differs (see {@link observableIssues}).
 * @example studyObservable({ kernel: 'drell-yan', options: { sqrtSGeV: 13000 }, bins: [{ mMin: 100, mMax: 200, yMin: -2.5, yMax: 2.5 }] }).unit // 'pb'
 */
export function studyObservable(spec: ObservableSpec): Observable {
  if (!spec.bins.length) return binObservable(spec, {})
  const each = binObservables(spec)
  const [issue] = issuesOf(spec, each, 1)
  if (issue) throw new RangeError(issue.message)
  const distinct = [...new Map(each.map(o => [o.name, o])).values()]
  if (distinct.length === 1) return distinct[0]!
  return {
    name: distinct.map(o => o.name).join(' or '),
    latex: distinct.every(o => o.latex) ? distinct.map(o => o.latex).join('\\ \\mathrm{or}\\ ') : '',
    unit: distinct[0]!.unit,
    perBin: each.map(o => o.name)
  }
}

/** {@link studyObservable}, or null for a study that mixes units (the page then shows the kernel's own words). */
export function studyObservableOrNull(spec: ObservableSpec): Observable | null {
  try {
    return studyObservable(spec)
  }
  catch (err) {
    if (err instanceof RangeError) return null
    throw err
  }
}
