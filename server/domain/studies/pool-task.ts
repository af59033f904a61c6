// The work one thread of the evaluation pool does (server/domain/studies/pool.ts): a run's plan,
// member chunks through it, the bands of one prescription, the factorisation-scale variation.
// Inputs arrive as SharedArrayBuffer-backed typed arrays, so nothing large is copied; member
// values are written straight into the shared output.
import { buildPlan, evaluatePlan, type Plan } from '../../../shared/physics/study/plan'
import { memberAlphasFunctions } from '../../../shared/physics/study/member-alphas'
import type { StudySpec } from '../../../shared/physics/study/spec'
import type { ErrorSet } from '../../../shared/physics/types'
import type { Prescription } from '../../../shared/physics/uncertainty'
import type { ScaleVariationJson, StoredBands } from '../../database/schema'
import { apartStoredBands, bandsFromValues, storedBands, type MemberSource } from '../results/bands'
import { kernelContextOf } from './check'
import { scaleVariationOf } from './scale'

/** Members m0…m1 of the varying set into `out` (members × bins, member-major) at row m0. */
export interface MembersTask {
  op: 'members'
  plan: Plan
  /** The varying set's members m0…m1 (views of shared memory). */
  members: Float64Array[]
  /** The other set's central member when the plan reads two sets. */
  fixed: Float64Array | null
  /** A paired run: the other set's members m0…m1 (member k with member k); replaces `fixed`. */
  partner?: Float64Array[] | null
  varying: 'main' | 'second'
  out: Float64Array
  m0: number
  /**
   * For kernels with α_s (gg → H): the varying main set's α_s(M_Z) values (plain data, so it
   * crosses to a thread) and the set index of `members[0]`; each member runs with its own α_s.
   */
  alphas?: MemberAlphas | null
}

/** What memberAlphasFunctions needs, and where a task's members start in the set. */
export interface MemberAlphas {
  header: Parameters<typeof memberAlphasFunctions>[0]
  first: number
}

export interface BandsTask {
  op: 'bands'
  matrix: { members: number, bins: number, values: Float64Array }
  source: MemberSource
  prescription: Prescription
  clPercent: number
  /** An apart run's second part (apartStoredBands): its members (central first) and its set. */
  second?: { matrix: { members: number, bins: number, values: Float64Array }, source: ApartSecondSource } | null
}

/** What apartStoredBands needs of an apart run's second set. */
export type ApartSecondSource = MemberSource & { name: string, version: string }

export interface ScaleTask {
  op: 'scale'
  spec: StudySpec
  main: ErrorSet
  second: ErrorSet | null
}

/** The plan of a study on a set's grid (with the second set's), built off the worker's main thread. */
export interface PlanTask {
  op: 'plan'
  spec: StudySpec
  main: Omit<ErrorSet, 'members'>
  second: Omit<ErrorSet, 'members'> | null
}

export type PoolTask = MembersTask | BandsTask | ScaleTask | PlanTask

/** The run's plan: the study on the main set's grid with its α_s, and the second set's grid. */
export function planOf(spec: StudySpec, main: Omit<ErrorSet, 'members'>, second: Omit<ErrorSet, 'members'> | null): Plan {
  return buildPlan(spec, main, { ...kernelContextOf(main.header), ...(second ? { second } : {}) })
}

/** Evaluates a members task into its shared output; returns the number of members done. */
export function runMembers(t: Omit<MembersTask, 'op'>): number {
  const memberAlphas = t.alphas && t.plan.alphas
    ? memberAlphasFunctions(t.alphas.header).slice(t.alphas.first, t.alphas.first + t.members.length)
    : undefined
  const others = t.partner ?? (t.fixed ? [t.fixed] : undefined)
  const values = t.varying === 'main'
    ? evaluatePlan(t.plan, t.members, others, memberAlphas ? { memberAlphas } : {})
    : evaluatePlan(t.plan, others ?? [], t.members)
  t.out.set(values, t.m0 * t.plan.nBins)
  return t.members.length
}

export default function task(t: PoolTask): number | StoredBands | ScaleVariationJson | Plan | null {
  if (t.op === 'members') return runMembers(t)
  if (t.op === 'plan') return planOf(t.spec, t.main, t.second)
  if (t.op === 'bands') {
    return t.second
      ? apartStoredBands({ main: t.matrix, second: t.second.matrix }, { set: t.source, second: t.second.source }, t.prescription, t.clPercent)
      : storedBands(bandsFromValues(t.matrix, t.source, t.prescription, t.clPercent))
  }
  return scaleVariationOf(t.spec, t.main, t.second)
}
