import type { GridAxes } from '../interpolation/axes'
import { EDGE_SLACK } from '../interpolation/stencil'
import { rapidityReach } from '../kernels/kinematics'
import type { CombineOp } from '../kernels/ratios'
import type { KernelContext, KernelDefinition, VariableName } from '../kernels/registry'
import { kernelDefinition, kernelKind } from '../kernels/registry'
import type { Term } from '../kernels/terms'
import { gaussLegendreOn } from '../quadrature'
import type { BinColumn, StudySpec } from './spec'

/**
 * Expansion of a study into quadrature points: for every bin, the list of LO terms (linear or
 * bilinear forms at one kinematic point, μ_F scaled by κ) and their quadrature weights, so that
 * bin value = Σ_i weight_i · term_i. Both the precomputed plan and the direct evaluator start
 * from this list, so they compute the same sums in different orders.
 */

/** Grids the study is evaluated on: the main set, and optionally a second set (beam 2 of a pA collision, or the nuclear set of a nuclear ratio). */
export interface StudyAxes {
  main: GridAxes
  second?: GridAxes
}

/** One bin's points. */
export interface ExpandedBin {
  terms: Term[]
  weights: number[]
}

/** Where each side of a part's forms takes its densities from. */
export type DensitySource = 'main' | 'second'

/** One observable of a study (two for a ratio or asymmetry). */
export interface ExpandedPart {
  kernel: string
  kind: 'linear' | 'bilinear'
  /** Source of beam 1 (or of the only density of a linear form). */
  source1: DensitySource
  /** Source of beam 2 (bilinear forms only; equal to source1 for linear ones). */
  source2: DensitySource
  bins: ExpandedBin[]
}

/** A kinematic or reach problem of one bin. */
export interface ReachIssue {
  /** 1-based bin row. */
  bin: number
  /** 'kinematics': beyond the physical limit (never computable); 'grid': outside the set's nodes (computable with frozen edge values). */
  kind: 'kinematics' | 'grid'
  message: string
}

/** A study expanded into points. */
export interface ExpandedStudy {
  parts: ExpandedPart[]
  /** How two parts combine (composites only). */
  op?: CombineOp
  nBins: number
  /** Problems: points beyond the kinematic limit or outside a grid. */
  issues: ReachIssue[]
}

interface Range {
  lo: number
  hi: number
}

function axesRange(a: GridAxes): { x: Range, q2: Range } {
  return { x: { lo: a.x[0]!, hi: a.x[a.x.length - 1]! }, q2: { lo: a.q2[0]!, hi: a.q2[a.q2.length - 1]! } }
}

function inside(v: number, r: Range): boolean {
  return v >= r.lo * (1 - EDGE_SLACK) && v <= r.hi * (1 + EDGE_SLACK)
}

function fmt(v: number): string {
  return Number(v.toPrecision(4)).toString()
}

function outsideMessage(what: string, v: number, r: Range, unit: string, where: string): string {
  // The momentum-fraction axis of a fragmentation set is z (its grid's x axis read as z).
  const axis = what.startsWith('μ') ? 'Q²' : what.startsWith('z') ? 'z' : 'x'
  const side = v < r.lo ? `below the set's smallest ${axis} node ${fmt(r.lo)}${unit}` : `above the set's largest ${axis} node ${fmt(r.hi)}${unit}`
  // In a bin over a range the value is at a quadrature node: the bin as entered says more.
  const ranged = where.includes(' to ')
  return ranged ? `${what}${where} reaches ${side}` : `${what} = ${fmt(v)}${unit}${where} is ${side}`
}

const NAMES: Record<VariableName, [string, string]> = { x: ['x', ''], q2: ['Q²', ' GeV²'], m: ['M', ' GeV'], y: ['y', ''], z: ['z', ''], sqrtS: ['√s', ' GeV'] }

/** The bin as the user entered it (points and ranges, never a quadrature node): " (bin as entered: x = 0.01, Q² 1e+04 to 2e+05 GeV²)". */
function describeBin(row: StudySpec['bins'][number], variables: readonly { name: VariableName }[]): string {
  const parts = variables.flatMap(({ name }) => {
    const [label, unit] = NAMES[name]
    const point = row[name as BinColumn]
    if (point !== undefined) return [`${label} = ${fmt(point)}${unit}`]
    const lo = row[`${name}Min` as BinColumn]
    const hi = row[`${name}Max` as BinColumn]
    return lo !== undefined && hi !== undefined ? [`${label} ${fmt(lo)} to ${fmt(hi)}${unit}`] : []
  })
  return parts.length > 0 ? ` (bin as entered: ${parts.join(', ')})` : ''
}

/** v rounded to 3 significant digits towards the side that stays in reach. */
function roundInside(v: number, up: boolean): number {
  if (v === 0) return 0
  const step = 10 ** (Math.floor(Math.log10(Math.abs(v))) - 2)
  return Number(((up ? Math.ceil(v / step) : Math.floor(v / step)) * step).toPrecision(3))
}

/**
 * How to bring a bin in reach by narrowing one of its ranges: from the failing point towards
 * an in-reach part of the user's range, the boundary found by bisection (60 halvings), quoted
 * as "; narrow Q² to at most 9.99e+04 GeV²". Empty when no range of the bin gets it in reach.
 */
function narrowing(row: StudySpec['bins'][number], variables: readonly { name: VariableName }[], point: Partial<Record<VariableName, number>>, reachable: (p: Partial<Record<VariableName, number>>) => boolean): string {
  for (const { name } of variables) {
    const lo = row[`${name}Min` as BinColumn]
    const hi = row[`${name}Max` as BinColumn]
    const t = point[name]
    if (lo === undefined || hi === undefined || t === undefined) continue
    const at = (v: number) => reachable({ ...point, [name]: v })
    const candidates = Array.from({ length: 9 }, (_, k) => lo + (hi - lo) * k / 8).sort((a, b) => Math.abs(a - t) - Math.abs(b - t))
    const good = candidates.find(at)
    if (good === undefined) continue
    let bad = t
    let ok = good
    for (let k = 0; k < 60; k++) {
      const mid = (bad + ok) / 2
      if (at(mid)) ok = mid
      else bad = mid
    }
    const [label, unit] = NAMES[name]
    const up = good > t
    return `; narrow ${label} to ${up ? 'at least' : 'at most'} ${fmt(roundInside(ok, up))}${unit}`
  }
  return ''
}

/** Names of a term's momentum fractions in messages: x, or z for a fragmentation set's side. */
interface FractionNames { x: string, x1: string, x2: string }
const DEFAULT_FRACTIONS: FractionNames = { x: 'x', x1: 'x₁', x2: 'x₂' }

/** The fraction names of a kernel with these variables: z for e⁺e⁻ (linear in z), x and z for semi-inclusive DIS. */
function fractionNames(variables: readonly { name: VariableName }[]): FractionNames {
  if (!variables.some(v => v.name === 'z')) return DEFAULT_FRACTIONS
  return variables.some(v => v.name === 'x') ? { x: 'x', x1: 'x', x2: 'z' } : { x: 'z', x1: 'z', x2: 'z' }
}

/** Checks a term against the grids; returns a message for the first coordinate outside (`where` follows the value). */
function termReach(term: Term, where: string, r1: ReturnType<typeof axesRange>, r2: ReturnType<typeof axesRange>, names: FractionNames = DEFAULT_FRACTIONS): string | null {
  if (term.kind === 'linear') {
    if (!inside(term.x, r1.x)) return outsideMessage(names.x, term.x, r1.x, '', where)
    if (!inside(term.mu2GeV2, r1.q2)) return outsideMessage('μ_F²', term.mu2GeV2, r1.q2, ' GeV²', where)
    return null
  }
  if (!inside(term.x1, r1.x)) return outsideMessage(names.x1, term.x1, r1.x, '', where)
  if (!inside(term.x2, r2.x)) return outsideMessage(names.x2, term.x2, r2.x, '', where)
  if (!inside(term.mu2GeV2, r1.q2)) return outsideMessage('μ_F²', term.mu2GeV2, r1.q2, ' GeV²', where)
  if (!inside(term.mu2GeV2, r2.q2)) return outsideMessage('μ_F²', term.mu2GeV2, r2.q2, ' GeV² (beam-2 set)', where)
  return null
}

/**
 * Variables integrated in their logarithm: Q² and M, whose integrands fall steeply (≈ 1/Q⁴,
 * 1/M³), so a wide bin needs the rule in ln v (see shared/physics/README.md, "Study evaluation").
 */
export const LOG_VARIABLES: ReadonlySet<VariableName> = new Set<VariableName>(['q2', 'm'])

/**
 * Quadrature points (value, weight) of one variable of one bin: Gauss–Legendre of `order` points
 * in v for x and y, in u = ln v for Q² and M (∫ f dv = ∫ f v du, so each weight carries the
 * Jacobian v); divided by the range's length for rangeMode 'average'.
 */
export function variableNodes(spec: Pick<StudySpec, 'rangeMode'>, row: StudySpec['bins'][number], name: VariableName, order: number): Array<[number, number]> {
  const point = row[name as BinColumn]
  if (point !== undefined) return [[point, 1]]
  const lo = row[`${name}Min` as BinColumn]!
  const hi = row[`${name}Max` as BinColumn]!
  const scale = spec.rangeMode === 'average' ? 1 / (hi - lo) : 1
  if (LOG_VARIABLES.has(name) && lo > 0) {
    const { nodes, weights } = gaussLegendreOn(order, Math.log(lo), Math.log(hi))
    return Array.from(nodes, (u, i) => {
      const v = Math.exp(u)
      return [v, weights[i]! * v * scale] as [number, number]
    })
  }
  const { nodes, weights } = gaussLegendreOn(order, lo, hi)
  return Array.from(nodes, (v, i) => [v, weights[i]! * scale] as [number, number])
}

function expandPart(spec: StudySpec, def: KernelDefinition, options: Record<string, unknown>, useSecond: boolean, axes: StudyAxes, context: KernelContext, issues: Map<number, { kind: 'kinematics' | 'grid', message: string }>): ExpandedPart {
  const secondAvailable = axes.second !== undefined
  const kind = kernelKind(def, options)
  const source1: DensitySource = kind === 'linear' && useSecond && secondAvailable ? 'second' : 'main'
  const source2: DensitySource = kind === 'linear' ? source1 : (secondAvailable && useSecond ? 'second' : 'main')
  const a1 = source1 === 'second' ? axes.second! : axes.main
  const a2 = source2 === 'second' ? axes.second! : axes.main
  const r1 = axesRange(a1)
  const r2 = axesRange(a2)
  const evaluate = def.prepare(options, { ...context, renormalisationScaleFactor: spec.renormalisationScaleFactor ?? 1 })
  const variables = def.variables(options)
  const names = fractionNames(variables)
  const kappa2 = spec.scaleFactor * spec.scaleFactor
  /** Whether a point of a bin evaluates and lies inside the grids (for the narrowing hint). */
  const reachable = (p: Partial<Record<VariableName, number>>) => {
    try {
      const term = evaluate(p)
      return termReach({ ...term, mu2GeV2: term.mu2GeV2 * kappa2 }, '', r1, r2, names) === null
    } catch (error) {
      if (error instanceof RangeError) return false
      throw error
    }
  }
  // Long decimals in a kernel's message are quadrature nodes, not what the user typed.
  const shortNumbers = (m: string) => m.replace(/-?\d+\.\d{6,}(e[+-]?\d+)?/g, n => fmt(Number(n)))
  const bins: ExpandedBin[] = spec.bins.map((row, index) => {
    const given = describeBin(row, variables)
    const terms: Term[] = []
    const weights: number[] = []
    // Tensor product of the variables' quadrature points.
    let points: Array<[Partial<Record<VariableName, number>>, number]> = [[{}, 1]]
    for (const v of variables) {
      const nodes = variableNodes(spec, row, v.name, spec.quadratureOrder)
      points = points.flatMap(([p, w]) => nodes.map(([value, wv]) => [{ ...p, [v.name]: value }, w * wv] as [Partial<Record<VariableName, number>>, number]))
    }
    for (const [point, weight] of points) {
      let inner: Array<[Partial<Record<VariableName, number>>, number]> = [[point, weight]]
      if (def.fullRapidityMass) {
        const mass = def.fullRapidityMass(options, point)
        const xLo = Math.max(r1.x.lo, r2.x.lo)
        const xHi = Math.min(r1.x.hi, r2.x.hi)
        // The whole rapidity range stops where one x reaches the grid's largest node (the rest,
        // x > x_max, carries a negligible share); the other x then falls to τ/x_max, which the
        // grid must reach — otherwise a sizeable part of the integral would be cut away.
        const tauOverXHi = (mass / def.sqrtS!(options)) ** 2 / xHi
        if (tauOverXHi < xLo * (1 - EDGE_SLACK) && !issues.has(index)) {
          issues.set(index, { kind: 'grid', message: `the full rapidity range at M = ${fmt(mass)} GeV needs x down to τ/x_max = ${fmt(tauOverXHi)}, below the set's smallest x node ${fmt(xLo)}` })
        }
        const reach = rapidityReach(mass, def.sqrtS!(options), xLo, xHi)
        if (!reach) {
          if (!issues.has(index)) issues.set(index, { kind: 'grid', message: `M = ${fmt(mass)} GeV at √s = ${fmt(def.sqrtS!(options))} GeV cannot be produced with both x inside the set's x range [${fmt(xLo)}, ${fmt(xHi)}]` })
          continue
        }
        const { nodes, weights: wy } = gaussLegendreOn(spec.fullRangeOrder, reach[0], reach[1])
        inner = Array.from(nodes, (y, i) => [{ ...point, y }, weight * wy[i]!] as [Partial<Record<VariableName, number>>, number])
      }
      for (const [p, w] of inner) {
        let term: Term
        try {
          term = evaluate(p)
        } catch (error) {
          if (!(error instanceof RangeError)) throw error
          if (!issues.has(index) || issues.get(index)!.kind === 'grid') {
            const hint = def.fullRapidityMass ? '' : narrowing(row, variables, p, reachable)
            issues.set(index, { kind: 'kinematics', message: `${shortNumbers(error.message)}${given}${hint}` })
          }
          continue
        }
        term = { ...term, mu2GeV2: term.mu2GeV2 * kappa2 }
        const why = issues.has(index) ? null : termReach(term, given, r1, r2, names)
        if (why) issues.set(index, { kind: 'grid', message: `${why}${def.fullRapidityMass ? '' : narrowing(row, variables, p, reachable)}` })
        terms.push(term)
        weights.push(w)
      }
    }
    return { terms, weights }
  })
  return { kernel: def.id, kind, source1, source2, bins }
}

/**
 * Expands a validated study on the given grid axes into weighted LO terms per bin, collecting
 * (not throwing) the first kinematic or grid-reach problem of each bin. Kernel options must
 * already be validated (parseStudySpec). RangeError only for missing context (e.g. α_s).
 * @example expandStudy(spec, { main: set }, {}).parts[0].bins[0].terms.length // 8 for a y range of order 8
 */
export function expandStudy(spec: StudySpec, axes: StudyAxes, context: KernelContext = {}): ExpandedStudy {
  const def = kernelDefinition(spec.kernel)
  const issues = new Map<number, { kind: 'kinematics' | 'grid', message: string }>()
  let parts: ExpandedPart[]
  let op: CombineOp | undefined
  if (def.composite) {
    op = def.op
    parts = def.parts(spec.options).map(p => expandPart(spec, kernelDefinition(p.kernel) as KernelDefinition, p.options, p.useSecond, axes, context, issues))
  } else {
    // A plain hadron–hadron kernel takes beam 2 from the second set when one is given.
    parts = [expandPart(spec, def, spec.options, kernelKind(def, spec.options) === 'bilinear', axes, context, issues)]
  }
  const sorted = [...issues.entries()].sort((a, b) => a[0] - b[0])
  return {
    parts,
    op,
    nBins: spec.bins.length,
    issues: sorted.map(([i, { kind, message }]) => ({ bin: i + 1, kind, message: `bin ${i + 1}: ${message}` }))
  }
}

/**
 * The bins of a study that a set cannot reach: points beyond the kinematic limit, or x, x₁, x₂
 * or μ_F² outside the set's nodes (with the scale factor applied). Empty when all is in reach.
 * @example checkReach(spec, { main: set }) // [{ bin: 4, message: 'bin 4: x₂ = 3.1e-7 (at M = 20, y = 2.4) is below …' }]
 */
export function checkReach(spec: StudySpec, axes: StudyAxes, context: KernelContext = {}): ReachIssue[] {
  return expandStudy(spec, axes, context).issues
}
