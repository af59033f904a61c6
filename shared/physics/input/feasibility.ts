/**
 * Whether a fit can be built, decided before any evolution runs, and how large the built set will
 * be. Each check returns issues of kind 'physics' (a well-formed document whose numbers the
 * evolution would refuse or could not give a meaning to), each with the JSON path at fault:
 *
 * - Integrability (shared/physics/README.md, 6. Sum rules): a term
 *   x·f = A x^a (1−x)^b (1 + Σ c_k x^{k/2}) has a momentum integral ∫₀¹ x·f dx only for a > −1
 *   and b > −1, and a number integral ∫₀¹ f dx = ∫₀¹ (x·f)/x dx only for a > 0 and b > −1
 *   (Euler's Beta function B(p, q) needs p, q > 0; DLMF §5.12). Every term must have the first;
 *   a piece that a valence rule counts (nonzero q − q̄ weight) must have the second. Checked at the
 *   central values, and for every member (Hessian eigenvector shifts or replicas) in
 *   `memberIssues`, which also solves each member's sum rules (positive normalisations) and
 *   evaluates x·f on the x nodes at μ₀² (finite, |x·f| ≤ 1e100).
 * - The output grid: x_min ≥ 1e-9; at least 4 Q² nodes (the interpolation in ln Q² is 4-point,
 *   README 9) and enough for both ends and each interior heavy-quark threshold.
 * - The start scale: above the one-loop Landau pole (README 7), with α_s(μ₀²) ≤ 1.5, the range
 *   the engine accepts for a reference value.
 * - The Hessian tolerance T (Δχ² = T², README 14): 0.1 ≤ T ≤ 20.
 * - Fragmentation inputs (fragmentation.ts): for the central member and every member, z·D ≥ 0 on
 *   the output z nodes and ∫ z·D dz ≤ 1 per parton (in place of the parton-density sum rules).
 */
import { makeAlphas, type AlphasReference } from '../alphas'
import { MZ_GEV } from '../constants'
import { DEFAULT_Q2_GRID, q2Nodes } from '../evolution/q2-grid'
import { DEFAULT_X_GRID, xNodes } from '../evolution/x-grid'
import { hessianMembers } from '../fit/hessian'
import { replicaParameters } from '../fit/replicas'
import type { FlavourScheme } from '../types'
import { bindParameters, numericTerms } from './bind'
import type { InputIssue } from './errors'
import { evaluateXf } from './evaluate'
import { fragmentationProblem } from './fragmentation'
import { N_SLOTS, quarkSlots } from './flavours'
import type { InputModel, ModelPiece } from './model'
import type { GridSpec, MembersSpec } from './schema'

/** The numbers the checks use (see the module comment). */
export const BUILD_LIMITS = {
  /** Smallest x_min of an output grid. */
  minX: 1e-9,
  /** Fewest Q² nodes of an output grid. */
  minQ2Nodes: 4,
  /** Hessian tolerance range: Δχ² = T² from 0.01 to 400. */
  minTolerance: 0.1,
  maxTolerance: 20,
  /** Largest α_s at the start scale (the engine's range for a reference value). */
  maxAlphasAtStart: 1.5,
  /** Largest |x·f| at μ₀² on the x nodes: far beyond any density, well inside Float64 after evolution. */
  maxAbsXf: 1e100
} as const

const physics = (path: string, message: string): InputIssue => ({ path, message, kind: 'physics' })
const fragmentationOf = (model: InputModel) => model.density?.type === 'fragmentation'
const fmt = (v: number) => (Number.isFinite(v) ? Number(v.toPrecision(4)).toString() : String(v))

/** The α_s reference of a document's `alphas` block ("mz" → M_Z²). */
export function alphasReference(alphas: { value: number, scaleGeV2: number | 'mz' }): AlphasReference {
  return { value: alphas.value, scaleGeV2: alphas.scaleGeV2 === 'mz' ? MZ_GEV * MZ_GEV : alphas.scaleGeV2 }
}

/**
 * The one-loop Landau pole Λ² (GeV²) below which α_s of `ref` in `scheme` has no value (0 when
 * there is none above 1e-300 GeV²): bisection in ln μ² to a relative 1e-12.
 * @example landauPoleGeV2({ value: 0.35, scaleGeV2: 2 }, fixed4) // 2·exp(−4π/(β₀(4)·0.35)) = 0.0167…
 */
export function landauPoleGeV2(ref: AlphasReference, scheme: FlavourScheme): number {
  const alphas = makeAlphas(ref, scheme)
  const defined = (lnQ2: number) => {
    try {
      alphas(Math.exp(lnQ2))
      return true
    } catch {
      return false
    }
  }
  let lo = Math.log(1e-300)
  let hi = Math.log(ref.scaleGeV2)
  if (defined(lo)) return 0
  while (hi - lo > 1e-12) {
    const mid = 0.5 * (lo + hi)
    if (defined(mid)) hi = mid
    else lo = mid
  }
  return Math.exp(hi)
}

/**
 * The start scale against the one-loop running: μ₀² above the Landau pole and α_s(μ₀²) ≤ 1.5.
 * The scheme must already be valid (checkScheme).
 * @example startScaleIssues(0.001, { value: 0.13, scaleGeV2: 8315 }, fixed3) // [{ path: 'startScaleGeV2', … }]
 */
export function startScaleIssues(startScaleGeV2: number, ref: AlphasReference, scheme: FlavourScheme, path = 'startScaleGeV2'): InputIssue[] {
  const alphas = makeAlphas(ref, scheme)
  const of = `the one-loop α_s with α_s(${fmt(ref.scaleGeV2)} GeV²) = ${ref.value}`
  let value: number
  try {
    value = alphas(startScaleGeV2)
  } catch {
    return [physics(path, `μ₀² = ${startScaleGeV2} GeV² lies below the Landau pole Λ² ≈ ${fmt(landauPoleGeV2(ref, scheme))} GeV² of ${of}: α_s has no value there; raise μ₀²`)]
  }
  if (!(value <= BUILD_LIMITS.maxAlphasAtStart)) {
    return [physics(path, `α_s(μ₀²) = ${fmt(value)} at μ₀² = ${startScaleGeV2} GeV², just above the Landau pole Λ² ≈ ${fmt(landauPoleGeV2(ref, scheme))} GeV² of ${of}; the evolution starts only where α_s ≤ ${BUILD_LIMITS.maxAlphasAtStart}: raise μ₀²`)]
  }
  return []
}

/**
 * The x range of an output grid: x_min ≥ 1e-9 (min < max < 1 is the document check's).
 * @example xGridIssues({ x: { count: 50, min: 1e-300, max: 0.9 } }) // [{ path: 'grid.x.min', … }]
 */
export function xGridIssues(grid: GridSpec | undefined, prefix = 'grid'): InputIssue[] {
  const x = grid?.x
  if (x && !(x.min >= BUILD_LIMITS.minX)) {
    return [physics(`${prefix}.x.min`, `x_min = ${x.min} is below ${BUILD_LIMITS.minX}, the smallest x the engine builds grids for; choose x_min between ${BUILD_LIMITS.minX} and x_max`)]
  }
  return []
}

/**
 * The Q² nodes of an output grid: at least 4, and (given the start scale and scheme) enough for
 * both ends and every interior threshold (q2Nodes). The default grid is checked when there is
 * no `q2` block. A `maxGeV2` at or below μ₀² is left to the document check.
 * @example q2GridIssues({ q2: { count: 2, maxGeV2: 1e5 } }, 2, scheme) // [{ path: 'grid.q2.count', … }]
 */
export function q2GridIssues(grid: GridSpec | undefined, startScaleGeV2?: number, scheme?: FlavourScheme, prefix = 'grid'): InputIssue[] {
  const q2 = grid?.q2
  if (q2 && q2.count < BUILD_LIMITS.minQ2Nodes) {
    return [physics(`${prefix}.q2.count`, `${q2.count} Q² nodes are too few: the engine interpolates in ln Q² through 4 nodes and needs at least ${BUILD_LIMITS.minQ2Nodes}`)]
  }
  if (startScaleGeV2 === undefined || scheme === undefined || (q2 && !(q2.maxGeV2 > startScaleGeV2))) return []
  try {
    q2Nodes(q2 ?? DEFAULT_Q2_GRID, startScaleGeV2, scheme)
    return []
  } catch (e) {
    return [physics(q2 ? `${prefix}.q2.count` : 'startScaleGeV2', q2 ? (e as Error).message : `the default Q² grid (up to ${DEFAULT_Q2_GRID.maxGeV2} GeV²) does not fit: ${(e as Error).message}; give grid.q2`)]
  }
}

/**
 * The members block: a Hessian tolerance 0.1 ≤ T ≤ 20.
 * @example membersSpecIssues({ type: 'hessian', tolerance: 1e300, confidenceLevelPercent: 68 }) // [{ path: 'members.tolerance', … }]
 */
export function membersSpecIssues(members: MembersSpec | undefined): InputIssue[] {
  if (members?.type !== 'hessian') return []
  const t = members.tolerance
  if (t >= BUILD_LIMITS.minTolerance && t <= BUILD_LIMITS.maxTolerance) return []
  return [physics('members.tolerance', `tolerance T = ${t} is outside ${BUILD_LIMITS.minTolerance}…${BUILD_LIMITS.maxTolerance} (Δχ² = T² from ${fmt(BUILD_LIMITS.minTolerance ** 2)} to ${fmt(BUILD_LIMITS.maxTolerance ** 2)}); published fits use T from 1 to about 10`)]
}

/** One integrability problem of one term for one parameter vector. */
interface TermProblem {
  path: string
  value: number
  /** The rule broken, written after "a = …" / "b = …". */
  rule: string
  /** For a bound-proton term, which baseline term it multiplies. */
  product?: string
  /** The fit parameter the exponent is, when it is one. */
  parameter?: string
}

function valenceRuleOf(model: InputModel, piece: ModelPiece): string | undefined {
  const u = quarkSlots(2)
  const d = quarkSlots(1)
  if (model.sumRules.uValence !== undefined && piece.weights[u.quark] !== piece.weights[u.anti]) return 'u-valence rule ∫(u − ū)dx = 2'
  if (model.sumRules.dValence !== undefined && piece.weights[d.quark] !== piece.weights[d.anti]) return 'd-valence rule ∫(d − d̄)dx = 1'
  return undefined
}

/** Integrability of every term of `model` at parameter vector `params` (see the module comment). */
function termProblems(model: InputModel, params: ArrayLike<number>): TermProblem[] {
  const out: TermProblem[] = []
  model.pieces.forEach((piece, i) => {
    const valence = valenceRuleOf(model, piece)
    numericTerms(piece, params).forEach((t, k) => {
      const source = piece.termSources?.[k] ?? { path: `pieces[${i}].terms[${k}]` }
      const product = source.baselineTerm
      const factors = piece.terms[k]!
      const parameter = (e: 'a' | 'b') => {
        const ref = factors.length === 1 ? factors[0]![e] : undefined
        return typeof ref === 'object' && 'param' in ref ? model.parameterNames[ref.param] : undefined
      }
      const nonFinite = [t.A, ...t.c].find(v => !Number.isFinite(v))
      if (nonFinite !== undefined) {
        out.push({ path: source.path, value: nonFinite, rule: 'a coefficient of this term is not a finite number (an A-dependent coefficient can make it so: check its powers)', product })
        return
      }
      if (!(t.b > -1)) out.push({ path: `${source.path}.b`, value: t.b, rule: 'x·f ∝ (1−x)^b is not integrable at x → 1; the engine needs b > −1', product, parameter: parameter('b') })
      if (!(t.a > -1)) {
        out.push({ path: `${source.path}.a`, value: t.a, rule: 'x·f ∝ x^a is not integrable at x → 0 (the momentum integral ∫₀¹ x·f dx diverges); the engine needs a > −1', product, parameter: parameter('a') })
      } else if (valence && !(t.a > 0)) {
        out.push({ path: `${source.path}.a`, value: t.a, rule: `the ${valence} counts piece "${piece.id}", and its number integral ∫₀¹ f dx diverges at x → 0 unless a > 0`, product, parameter: parameter('a') })
      }
    })
  })
  return out
}

const letter = (p: TermProblem) => `${p.path.slice(p.path.lastIndexOf('.') + 1)}${p.parameter ? ` (parameter ${p.parameter})` : ''}`
const productNote = (p: TermProblem) => (p.product ? ` (the bound-proton term: this modification term times baseline ${p.product})` : '')

/**
 * Integrability of every term at the model's central values (see the module comment).
 * @example centralTermIssues(compileInput(doc)) // [] for every sample fit
 */
export function centralTermIssues(model: InputModel): InputIssue[] {
  return termProblems(model, model.central).map(p => physics(p.path, `${letter(p)} = ${fmt(p.value)} at the central values${productNote(p)}: ${p.rule}`))
}

/** A member's parameter vector and how messages name it. */
export interface MemberVector {
  label: string
  params: ArrayLike<number>
}

/**
 * The parameter vectors a build evolves besides the central one: Hessian pairs p₀ ± T√λ_k e_k
 * (members 2k − 1, 2k) or replicas p₀ + L z_r, exactly as buildErrorSet draws them.
 * @throws RangeError for a covariance the member algorithms refuse.
 * @example memberVectors(model, { type: 'hessian', tolerance: 1, confidenceLevelPercent: 68 })[0].label // 'member 1 (eigenvector 1, up)'
 */
export function memberVectors(model: InputModel, members: MembersSpec): MemberVector[] {
  if (!model.covariance) throw new RangeError('members need the parameter covariance, which the input does not give')
  if (members.type === 'hessian') {
    return hessianMembers(model.central, model.covariance, members.tolerance).members
      .map((params, i) => ({ label: `member ${i + 1} (eigenvector ${Math.floor(i / 2) + 1}, ${i % 2 === 0 ? 'up' : 'down'})`, params }))
  }
  return replicaParameters(model.central, model.covariance, members.count, members.seed)
    .map((params, r) => ({ label: `replica ${r + 1}`, params }))
}

/** First occurrence and count of one kind of failure over the members. */
interface Tally {
  first: string
  value?: number
  count: number
  problem?: TermProblem
}

function tallied(map: Map<string, Tally>, key: string, label: string, extra: Omit<Tally, 'first' | 'count'> = {}) {
  const t = map.get(key)
  if (t) t.count++
  else map.set(key, { first: label, count: 1, ...extra })
}

const andMore = (t: Tally) => (t.count > 1 ? ` (and ${t.count - 1} other member${t.count > 2 ? 's' : ''})` : '')

/**
 * Every problem the evolution would meet with the members of `members` (default: the model's):
 * term integrability at the central values and for each member, each member's sum rules
 * (a solvable system with positive normalisations, bindParameters) and x·f at μ₀² on the output
 * x nodes (finite, |x·f| ≤ 1e100). Member problems are reported once per field, with the first
 * member and how many more, at the field whose spread causes them: `members.tolerance` for
 * Hessian members, `covariance` for replicas (and the term's exponent for a divergent term).
 *
 * Cost: one binding and one evaluation on the x nodes per member (Beta functions and powers,
 * no evolution): about a millisecond per hundred members on the sample fits.
 * @example memberIssues(compileInput(doc)) // [] when every member can be built
 */
export function memberIssues(model: InputModel, members: MembersSpec | undefined = model.members): InputIssue[] {
  const central = centralTermIssues(model)
  if (central.length > 0) return central
  let xs: Float64Array | undefined
  try {
    xs = xNodes(model.grid?.x ?? DEFAULT_X_GRID)
  } catch {
    xs = undefined
  }
  const ruleAt = model.sumRules.momentum !== undefined || model.sumRules.uValence !== undefined || model.sumRules.dValence !== undefined ? 'sumRules' : 'pieces'
  const tooLarge = (v: Float64Array) => v.findIndex(y => !(Math.abs(y) <= BUILD_LIMITS.maxAbsXf))
  const describe = (v: Float64Array, i: number) => `x·f = ${fmt(v[i]!)} at x = ${fmt(xs![Math.floor(i / N_SLOTS)]!)}`
  try {
    const bound = bindParameters(model, model.central, 'the central member')
    const bad = xs ? tooLarge(evaluateXf(bound, xs)) : -1
    if (bad >= 0) return [physics('pieces', `the central member has ${describe(evaluateXf(bound, xs!), bad)} at μ₀², beyond ±${BUILD_LIMITS.maxAbsXf}`)]
    const fragmentation = xs && fragmentationOf(model) ? fragmentationProblem(bound, xs, 'the central member') : undefined
    if (fragmentation) return [physics('pieces', fragmentation)]
  } catch (e) {
    if (!(e instanceof RangeError)) throw e
    return [physics(ruleAt, e.message)]
  }
  if (!members) return []
  let vectors: MemberVector[]
  try {
    vectors = memberVectors(model, members)
  } catch (e) {
    if (!(e instanceof RangeError)) throw e
    return [physics('covariance', e.message)]
  }
  const spreadAt = members.type === 'hessian' ? 'members.tolerance' : 'covariance'
  const spread = members.type === 'hessian'
    ? `the Hessian shifts T√λ_k e_k (T = ${members.tolerance}) reach it: lower the tolerance or check the covariance`
    : 'the replicas the covariance draws reach it: check the covariance'
  const terms = new Map<string, Tally>()
  const binding = new Map<string, Tally>()
  const values = new Map<string, Tally>()
  for (const { label, params } of vectors) {
    const problems = termProblems(model, params)
    if (problems.length > 0) {
      for (const p of problems) tallied(terms, p.path, label, { value: p.value, problem: p })
      continue
    }
    let bound
    try {
      bound = bindParameters(model, params, label)
    } catch (e) {
      if (!(e instanceof RangeError)) throw e
      tallied(binding, 'bind', e.message)
      continue
    }
    if (!xs) continue
    const xf = evaluateXf(bound, xs)
    const bad = tooLarge(xf)
    if (bad >= 0) tallied(values, 'xf', `${label} has ${describe(xf, bad)} at μ₀², beyond ±${BUILD_LIMITS.maxAbsXf}`)
    const fragmentation = fragmentationOf(model) ? fragmentationProblem(bound, xs, label) : undefined
    if (fragmentation) tallied(values, 'fragmentation', fragmentation)
  }
  const issues: InputIssue[] = []
  for (const [path, t] of terms) {
    issues.push(physics(path, `${letter(t.problem!)} = ${fmt(t.value!)} at ${t.first}${andMore(t)}${productNote(t.problem!)}: ${t.problem!.rule}; ${spread}`))
  }
  for (const t of [...binding.values(), ...values.values()]) issues.push(physics(spreadAt, `${t.first}${andMore(t)}; ${spread}`))
  return issues
}

/** How large a built set will be: members, nodes and Float64 values (member-major). */
export interface BuildSize {
  members: number
  xNodes: number
  /** Q² nodes, each interior threshold counted twice as in the set file. */
  q2Nodes: number
  flavours: number
  /** members × xNodes × q2Nodes × flavours. */
  values: number
}

/**
 * The size of the set a build of `model` writes: 1 + 2n members for n parameters (Hessian) or
 * N + 1 (replicas and their mean), on the model's grid (default 100 x × 40 Q² nodes) with the
 * 13 evolved flavours. The file holds 8 bytes per value plus a header.
 * @throws RangeError for a grid q2Nodes refuses (check q2GridIssues first).
 * @example buildSize(compileInput(minimal)).values // 9 × 60 × 22 × 13 = 154440
 */
export function buildSize(model: InputModel, members: MembersSpec | undefined = model.members): BuildSize {
  const nx = (model.grid?.x ?? DEFAULT_X_GRID).count
  const nq = q2Nodes(model.grid?.q2 ?? DEFAULT_Q2_GRID, model.startScaleGeV2, model.scheme).length
  const count = !members ? 1 : members.type === 'hessian' ? 1 + 2 * model.parameterNames.length : members.count + 1
  return { members: count, xNodes: nx, q2Nodes: nq, flavours: N_SLOTS, values: count * nx * nq * N_SLOTS }
}
