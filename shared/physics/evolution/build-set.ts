/**
 * Building error sets from a parametrised input: every member's parameter vector is bound
 * (sum rules imposed member by member), evaluated at μ₀² and evolved with one shared evolution
 * plan, so the convolution matrices and step programme are computed once per set.
 */
import { makeAlphas } from '../alphas'
import { MZ_GEV } from '../constants'
import { bindParameters } from '../input/bind'
import { evaluateXf } from '../input/evaluate'
import { fragmentationProblem } from '../input/fragmentation'
import type { InputModel } from '../input/model'
import { hessianMembers } from '../fit/hessian'
import { replicaParameters } from '../fit/replicas'
import { checkMemberCount } from '../sets/validate'
import type { ErrorSet, MemberGrid, SetHeader, SetKind } from '../types'
import { createEvolutionPlan, evolveMember, type EvolutionPlan, type EvolutionSetup } from './xspace'

/** How to turn the fit into members. */
export type MemberRequest =
  /** Hessian eigenvector pairs p_k^± = p₀ ± T√λ_k e_k (kind 'hessian-pairs', 1 + 2n members). */
  | { type: 'hessian', tolerance: number, confidenceLevelPercent: number }
  /** Monte-Carlo replicas; member 0 is the mean of the replica grids (kind 'replicas', 1 + N). */
  | { type: 'replicas', count: number, seed: number, confidenceLevelPercent?: number }
  /**
   * Explicit parameter vectors, central first, for a set of the given kind; one vector gives a
   * one-member set (the central member alone).
   */
  | { type: 'parameters', kind: SetKind, confidenceLevelPercent: number, vectors: ArrayLike<number>[], description: string }

/** Grid and numerics of an evolution built from a model (defaults: the model's grid block). */
export type ModelEvolutionOptions = Pick<EvolutionSetup, 'x' | 'q2' | 'interpolationDegree' | 'maxStep' | 'taylorOrder'>

/** Options of `buildErrorSet`. */
export interface BuildSetOptions extends ModelEvolutionOptions {
  /** Called after each finished member with (membersDone, total); awaited if it returns a promise. */
  onProgress?: (membersDone: number, total: number) => void | Promise<void>
  /** Extra provenance text (who built the set, from which file). */
  provenance?: string
}

/**
 * The evolution plan for a model: its μ₀², α_s, scheme and grid request, overridden by `options`.
 * @example planForModel(model).q2.length // 42 for the default grid with two interior thresholds
 */
export function planForModel(model: InputModel, options: ModelEvolutionOptions = {}): EvolutionPlan {
  const g = model.grid
  return createEvolutionPlan({
    startScaleGeV2: model.startScaleGeV2,
    alphas: model.alphas,
    scheme: model.scheme,
    x: options.x ?? (g?.x ? { count: g.x.count, min: g.x.min, max: g.x.max } : undefined),
    q2: options.q2 ?? (g?.q2 ? { count: g.q2.count, maxGeV2: g.q2.maxGeV2 } : undefined),
    interpolationDegree: options.interpolationDegree,
    maxStep: options.maxStep,
    taylorOrder: options.taylorOrder,
    direction: model.density?.type === 'fragmentation' ? 'timelike' : 'spacelike'
  })
}

/**
 * What a fragmentation set records about its grid: the species and that x is read as z, with the
 * usual LO caution. Nothing for parton densities.
 */
function densityProvenance(model: InputModel): string[] {
  const d = model.density
  if (d?.type !== 'fragmentation') return []
  return [`fragmentation functions z·D_i^h(z, Q²) of the partons i into ${d.hadron} (the grid's x axis is z), evolved with the LO timelike kernels; LO fragmentation functions are rough`]
}

/**
 * For a fragmentation input, refuses the first member that is negative on the z nodes or gives
 * one parton a momentum fraction above 1 (input/fragmentation.ts), before anything is evolved.
 */
function checkFragmentationMembers(model: InputModel, plan: EvolutionPlan, vectors: ArrayLike<number>[], label: (k: number) => string): void {
  if (model.density?.type !== 'fragmentation') return
  vectors.forEach((params, k) => {
    const problem = fragmentationProblem(bindParameters(model, params, label(k)), plan.x, label(k))
    if (problem) throw new RangeError(`${model.name}: ${problem}`)
  })
}

/**
 * What a nuclear set built from a family records about its nucleus (see shared/physics/README.md,
 * "Nuclear families"): the nucleus, the family and the A-dependence used. Nothing for a proton
 * fit, nor for a modification without A-dependence built for its own target, whose set stays
 * byte for byte what it was before families existed.
 */
export function nucleusProvenance(model: InputModel): string[] {
  const lines = model.massNumberDependence ?? []
  const own = model.documentNucleus
  if (model.target.type !== 'nucleus' || !own) return []
  const other = own.z !== model.target.z || own.a !== model.target.a
  if (lines.length === 0 && !other) return []
  const where = `nucleus Z = ${model.target.z}, A = ${model.target.a} from family ${model.family} (document target Z = ${own.z}, A = ${own.a})`
  return [lines.length > 0
    ? `${where}; A-dependence (δ = (A − 2Z)/A): ${lines.join('; ')}`
    : `${where}; A-dependence: none, the same modification for every nucleus`]
}

/**
 * One member of a model evolved onto the plan's grid.
 * @param params the parameter vector (default: the central values).
 * @param label names the member in error messages.
 * @example evolveModel(model, planForModel(model)) // central member
 */
export function evolveModel(model: InputModel, plan: EvolutionPlan, params: ArrayLike<number> = model.central, label = 'central member'): MemberGrid {
  const bound = bindParameters(model, params, label)
  return evolveMember(plan, evaluateXf(bound, plan.x))
}

/**
 * A whole error set from a model: members per `request` (default: the model's `members` block),
 * each evolved with one shared plan; header filled (kind, confidence level, α_s(M_Z) of the
 * central member, scheme, target, provenance naming the fit and the engine method).
 *
 * Cost: one plan (matrices ~10–20 ms, cached) plus one evolution per member (see the speed test).
 * @throws RangeError when there is no member request, the fit has no covariance, the member count
 * does not fit the kind (checkMemberCount, before any evolution), or a member's parameters fail
 * (divergent sum-rule integral, normalisation ≤ 0); the message names the member.
 * @example await buildErrorSet(model, undefined, { onProgress: (d, t) => job.updateProgress(d / t) })
 */
export async function buildErrorSet(model: InputModel, request?: MemberRequest, options: BuildSetOptions = {}): Promise<ErrorSet> {
  const req: MemberRequest | undefined = request ?? (model.members
    ? (model.members.type === 'hessian'
        ? { type: 'hessian', tolerance: model.members.tolerance, confidenceLevelPercent: model.members.confidenceLevelPercent }
        : { type: 'replicas', count: model.members.count, seed: model.members.seed, confidenceLevelPercent: model.members.confidenceLevelPercent })
    : undefined)
  if (!req) throw new RangeError(`${model.name}: say how to build members (Hessian tolerance or replica count); the input has no members block`)
  let vectors: ArrayLike<number>[]
  let kind: SetKind
  let description: string
  let cl: number
  if (req.type === 'parameters') {
    if (req.vectors.length < 1) throw new RangeError('an error set needs at least one parameter vector: the central member')
    vectors = req.vectors
    kind = req.kind
    cl = req.confidenceLevelPercent
    description = req.description
  } else {
    if (!model.covariance) throw new RangeError(`${model.name}: members need the parameter covariance, which the input does not give`)
    if (req.type === 'hessian') {
      const h = hessianMembers(model.central, model.covariance, req.tolerance)
      vectors = [model.central, ...h.members]
      kind = 'hessian-pairs'
      cl = req.confidenceLevelPercent
      description = `${h.eigenvalues.length} Hessian eigenvector pairs at tolerance T = ${req.tolerance} (Δχ² = ${(req.tolerance ** 2).toPrecision(5)}), members 2k−1/2k = pair k +/−, largest eigenvalue first`
    } else {
      vectors = replicaParameters(model.central, model.covariance, req.count, req.seed)
      kind = 'replicas'
      cl = req.confidenceLevelPercent ?? 68
      description = `${req.count} Monte-Carlo replicas p₀ + L z (Cholesky), Philox4x32-10 seed ${req.seed}; member 0 is the replica mean`
    }
  }
  const plan = planForModel(model, options)
  const total = req.type === 'replicas' ? vectors.length + 1 : vectors.length
  const alphasMz = makeAlphas(model.alphas, model.scheme)(MZ_GEV * MZ_GEV)
  const provenance = [
    `${model.name} ${model.version} (family ${model.family})${model.baseline ? `, nuclear modification of ${model.baseline.name} ${model.baseline.version} at its central values` : ''}`,
    ...nucleusProvenance(model),
    ...densityProvenance(model),
    `members: ${description}`,
    `engine: Sheaf ${plan.method}`,
    ...(options.provenance ? [options.provenance] : [])
  ].join('; ')
  const header: SetHeader = {
    name: model.name,
    family: model.family,
    version: model.version,
    kind,
    confidenceLevelPercent: cl,
    alphasMzCentral: alphasMz,
    order: 'LO',
    scheme: model.scheme,
    target: model.target,
    provenance,
    memberCount: total,
    ...(model.density?.type === 'fragmentation' ? { density: model.density } : {})
  }
  checkMemberCount(header)
  const labelOf = (k: number) => (req.type === 'replicas' ? `replica ${k + 1}` : `member ${k}`)
  checkFragmentationMembers(model, plan, vectors, labelOf)
  const members: Float64Array[] = []
  let done = 0
  for (let k = 0; k < vectors.length; k++) {
    members.push(evolveModel(model, plan, vectors[k]!, labelOf(k)).values)
    done++
    await options.onProgress?.(done, total)
  }
  if (req.type === 'replicas') {
    const mean = new Float64Array(members[0]!.length)
    for (const m of members) for (let i = 0; i < mean.length; i++) mean[i]! += m[i]!
    for (let i = 0; i < mean.length; i++) mean[i]! /= members.length
    members.unshift(mean)
    await options.onProgress?.(total, total)
  }
  return {
    header,
    x: Float64Array.from(plan.x),
    q2: Float64Array.from(plan.q2),
    flavours: [...plan.flavours],
    members
  }
}
