// Checks of a study against the engine (structure, kernel, bins) and against the sets it runs
// on (kinematic reach). No Nitro imports: the worker re-checks a snapshot before running.
import { makeAlphas } from '../../../shared/physics/alphas'
import { isFragmentation } from '../../../shared/physics/fragmentation/species'
import { MZ_GEV } from '../../../shared/physics/constants'
import { ExpressionError } from '../../../shared/physics/kernels/expression'
import { kernelDefinition, type KernelContext, type KernelDefinition } from '../../../shared/physics/kernels/registry'
import { buildUserKernel, type UserKernelOptions } from '../../../shared/physics/kernels/user-kernel'
import { checkReach, type StudyAxes } from '../../../shared/physics/study/expand'
import { checkStudySpec, type StudyIssue, type StudySpec } from '../../../shared/physics/study/spec'
import type { SetHeader } from '../../../shared/physics/types'
import { twoSetVariation, type TwoSetVariation } from '../../../shared/physics/uncertainty/two-sets'
import { observableIssues } from '../../../shared/bins/observable'
import { DomainError } from '../errors'
import { formatCount, LIMITS, type Limits } from '../limits'

/** The part of an error_sets row the checks need. */
export interface SetForCheck {
  id: string
  name: string
  version: string
  header: SetHeader
  axes: { x: number[], q2: number[], flavours: number[] }
}

/** A reach problem of one bin for one set: 1-based bin, the set, and the located message. */
export interface ReachProblem {
  setId: string
  setName: string
  bin: number
  kind: 'kinematics' | 'grid'
  message: string
}

export const axesOf = (s: SetForCheck): StudyAxes['main'] => ({
  x: Float64Array.from(s.axes.x), q2: Float64Array.from(s.axes.q2), flavours: s.axes.flavours
})

/**
 * Which of two sets is the engine's main set and which its second (beam 2 of a p–A collision,
 * the nuclear set of a nuclear ratio, the fragmentation set of a hadron study): the one with a
 * nucleus target, or holding fragmentation functions, is the second. `varying` is the set whose
 * members a result evaluates (the result's set), `partner` the study's second set. Without a
 * partner the varying set is the main one. How the partner's members vary is runVariation's.
 */
export function pairRoles<T extends { header: SetHeader }>(varying: T, partner: T | null | undefined) {
  if (!partner) return { main: varying, second: null, varyingRole: 'main' as const }
  const nuclear = (s: T) => s.header.target?.type === 'nucleus' || isFragmentation(s.header)
  return nuclear(varying) && !nuclear(partner)
    ? { main: partner, second: varying, varyingRole: 'second' as const }
    : { main: varying, second: partner, varyingRole: 'main' as const }
}

/** How a result varies its two sets, and how many member rows its run evaluates and stores. */
export interface RunVariation {
  variation: TwoSetVariation
  /**
   * Rows of the run: the result's set's members ('central', 'paired'), or those plus the
   * partner's members other than its central one ('apart'; uncertainty/two-sets.ts splitApart).
   */
  rows: number
  /** Members of the result's set and of the partner (0 without one). */
  setMembers: number
  partnerMembers: number
}

/**
 * The variation of a result on `set` with the study's second set `partner` (twoSetVariation:
 * paired for one family's sets of the same layout, apart for fragmentation or when the study
 * asks `varySecondSet`, else the partner at its central member) and its row count.
 * @example runVariation({ varySecondSet: true }, proton, lead).rows // proton members + lead members − 1
 */
export function runVariation(spec: Pick<StudySpec, 'varySecondSet'>, set: { header: SetHeader }, partner: { header: SetHeader } | null | undefined): RunVariation {
  const variation = twoSetVariation(set.header, partner?.header ?? null, spec.varySecondSet === true)
  const setMembers = set.header.memberCount
  const partnerMembers = partner?.header.memberCount ?? 0
  return { variation, rows: variation === 'apart' ? setMembers + partnerMembers - 1 : setMembers, setMembers, partnerMembers }
}

/**
 * 400 located at `varySecondSet` when the study asks to vary a second set it does not have.
 * (With a second set every combination is valid: one family's sets are paired anyway.)
 */
export function variationProblem(spec: Pick<StudySpec, 'varySecondSet'>, partner: unknown): DomainError | null {
  if (!spec.varySecondSet || partner) return null
  const message = 'varySecondSet: the study has no second set to vary; choose a second set (secondSetId) or leave varySecondSet out'
  return new DomainError(400, message, { issues: [{ message, path: ['varySecondSet'], column: 'varySecondSet' }], fields: { varySecondSet: 'no second set to vary' } })
}

/** What the kernels need from the set beyond its grid: the one-loop α_s of its header and its flavour scheme. */
export function kernelContextOf(header: SetHeader): KernelContext {
  const alphas = makeAlphas({ value: header.alphasMzCentral, scaleGeV2: MZ_GEV * MZ_GEV }, header.scheme)
  return { alphas, scheme: header.scheme }
}

/**
 * The engine's structural check: the validated spec, or the issues located by bin and column.
 * A user kernel is also compiled here, so a broken expression is one issue at
 * options.expression whatever sets the study runs on (the reach check would repeat it per set).
 */
export function checkSpec(input: unknown): { spec: StudySpec, issues: [] } | { spec: null, issues: StudyIssue[] } {
  const r = checkStudySpec(input)
  if (!r.ok) return { spec: null, issues: r.issues }
  // One observable per study: bins that change its name or unit are refused, located.
  const mixed = observableIssues(r.spec)
  if (mixed.length) return { spec: null, issues: mixed }
  const kernelIssue = r.spec.kernel === 'user' ? userKernelIssue(r.spec.options as UserKernelOptions) : null
  return kernelIssue ? { spec: null, issues: [kernelIssue] } : { spec: r.spec, issues: [] }
}

/** Why the user kernel with these (schema-checked) options does not compile, or null. */
function userKernelIssue(options: UserKernelOptions): StudyIssue | null {
  try {
    buildUserKernel(options)
    return null
  } catch (err) {
    if (err instanceof ExpressionError) return { column: 'options.expression', path: ['options', 'expression'], message: err.message }
    if (err instanceof RangeError) return { column: 'options', path: ['options'], message: err.message }
    throw err
  }
}

/**
 * Every bin that `set` (with `second` for two-set kernels) cannot reach. A kernel needing α_s that
 * cannot get it from the header reports one problem rather than throwing.
 */
export function reachProblems(spec: StudySpec, set: SetForCheck, second?: SetForCheck | null): ReachProblem[] {
  try {
    const roles = pairRoles(set, second)
    const axes: StudyAxes = { main: axesOf(roles.main), ...(roles.second ? { second: axesOf(roles.second) } : {}) }
    return checkReach(spec, axes, kernelContextOf(roles.main.header)).map(i => ({
      setId: set.id, setName: `${set.name} ${set.version}`, bin: i.bin, kind: i.kind, message: `${set.name} ${set.version}: ${i.message}`
    }))
  } catch (err) {
    if (!(err instanceof RangeError)) throw err
    return [{ setId: set.id, setName: `${set.name} ${set.version}`, bin: 0, kind: 'kinematics', message: `${set.name} ${set.version}: ${err.message}` }]
  }
}

/** The single kernels a study evaluates (two for a ratio or asymmetry) with their options. */
function kernelParts(spec: StudySpec): Array<{ def: KernelDefinition, options: Record<string, unknown> }> {
  const def = kernelDefinition(spec.kernel)
  return def.composite
    ? def.parts(spec.options).map(p => ({ def: kernelDefinition(p.kernel) as KernelDefinition, options: p.options }))
    : [{ def, options: spec.options }]
}

/**
 * How many quadrature points the engine expands a (validated) study into, without expanding it:
 * per bin and part, quadratureOrder points for each kernel variable given as a range (1 for a
 * point), times fullRangeOrder for kernels that integrate the whole rapidity range; the parts
 * of a ratio or asymmetry add up (study/expand.ts does the same tensor product).
 * @example quadraturePoints({ kernel: 'drell-yan', bins: [{ mMin: 60, mMax: 70, yMin: 0, yMax: 1 }], quadratureOrder: 8, … }) // 64
 */
export function quadraturePoints(spec: StudySpec): number {
  let total = 0
  for (const part of kernelParts(spec)) {
    const variables = part.def.variables(part.options)
    const full = part.def.fullRapidityMass ? spec.fullRangeOrder : 1
    for (const row of spec.bins) {
      let n = full
      for (const v of variables) if (row[v.name] === undefined) n *= spec.quadratureOrder
      total += n
    }
  }
  return total
}

/**
 * The study's size against the budgets, before anything is expanded or stored: 413 with the
 * cap in the message for more than `limits.studyMaxBins` bins or `limits.studyMaxPoints`
 * quadrature points.
 */
export function studySizeProblem(spec: StudySpec, limits: Limits = LIMITS): DomainError | null {
  const bins = spec.bins.length
  if (bins > limits.studyMaxBins) {
    return new DomainError(413, `A study may have at most ${formatCount(limits.studyMaxBins)} bins; this one has ${formatCount(bins)}. Split it into several studies`, {
      issues: [{ message: `at most ${formatCount(limits.studyMaxBins)} bins`, path: ['bins'] }], maxBins: limits.studyMaxBins, bins
    })
  }
  const points = quadraturePoints(spec)
  if (points > limits.studyMaxPoints) {
    const fullRange = kernelParts(spec).some(p => p.def.fullRapidityMass)
    return new DomainError(413, `This study's ${formatCount(bins)} bins expand into ${formatCount(points)} quadrature points; a study may have at most ${formatCount(limits.studyMaxPoints)}. Lower quadratureOrder (now ${spec.quadratureOrder} points per ranged variable)${fullRange ? ` or fullRangeOrder (now ${spec.fullRangeOrder})` : ''}, or split the study`, {
      issues: [{ message: `at most ${formatCount(limits.studyMaxPoints)} quadrature points`, path: ['quadratureOrder'] }], maxPoints: limits.studyMaxPoints, points
    })
  }
  return null
}

/**
 * 413 when running `members` members on the study's bins exceeds `limits.runMaxValues`, else null.
 * `rows` counts an apart run's members of both sets (runVariation); default the set's members.
 */
export function runSizeProblem(spec: StudySpec, set: { name: string, version: string, memberCount: number }, limits: Limits = LIMITS, rows = set.memberCount): DomainError | null {
  const values = rows * spec.bins.length
  if (values <= limits.runMaxValues) return null
  const both = rows === set.memberCount ? '' : ` (${formatCount(rows)} with the second set's members, varied apart)`
  return new DomainError(413, `${set.name} ${set.version} has ${formatCount(set.memberCount)} members${both}; on ${formatCount(spec.bins.length)} bins a run would hold ${formatCount(values)} values, and a run may hold at most ${formatCount(limits.runMaxValues)} (members × bins). Use fewer bins or a set with fewer members`, {
    issues: [{ message: `members × bins at most ${formatCount(limits.runMaxValues)}`, path: ['setIds'] }], maxValues: limits.runMaxValues, values
  })
}
