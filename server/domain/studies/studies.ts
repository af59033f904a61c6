import { and, asc, desc, eq, getTableColumns, inArray } from 'drizzle-orm'
import type { DB } from '../../database/client'
import { tables as t } from '../../database/client'
import type { Result, Study } from '../../database/schema'
import { resultUnit, type StudySpec } from '../../../shared/physics/study/spec'
import type { SetHeader } from '../../../shared/physics/types'
import { slotIssues } from '../../../shared/utils/set-match'
import { DomainError, fail } from '../errors'
import { setsOfWorkspace } from '../sets/library'
import { LIMITS } from '../limits'
import { checkSpec, reachProblems, runSizeProblem, runVariation, studySizeProblem, variationProblem, type ReachProblem } from './check'

/** What the API shows of a study. */
export const publicStudy = (s: Study) => ({
  id: s.id, name: s.name, description: s.description, spec: s.spec, setIds: s.setIds,
  secondSetId: s.secondSetId, prescription: s.prescription, clPercent: s.clPercent,
  revision: s.revision, createdBy: s.createdBy, createdAt: s.createdAt, updatedAt: s.updatedAt,
  unit: safeUnit(s.spec)
})

function safeUnit(spec: StudySpec) {
  try {
    return resultUnit(spec)
  } catch {
    return null
  }
}

/**
 * Columns of results without the spec snapshot (the study's bins as run, megabytes for a large
 * study): what lists of versions need. A version's own route reads the snapshot.
 */
const { specSnapshot: _snapshot, ...resultListColumns } = getTableColumns(t.results)
export type ResultListRow = Omit<Result, 'specSnapshot'>

/** What the API shows of a result version (no member values). */
export const publicResult = (r: ResultListRow) => ({
  id: r.id, studyId: r.studyId, setId: r.setId, secondSetId: r.secondSetId, version: r.version,
  studyRevision: r.studyRevision, state: r.state, phase: r.phase,
  progress: { done: r.membersDone, total: r.membersTotal },
  binCount: r.binCount, error: r.error, cancelRequested: r.cancelRequested,
  reviewState: r.reviewState, frozen: r.reviewState === 'approved', engineVersion: r.engineVersion,
  requestedBy: r.requestedBy, startedAt: r.startedAt, finishedAt: r.finishedAt,
  createdAt: r.createdAt, updatedAt: r.updatedAt
})

export interface StudyInput {
  spec: unknown
  setIds: string[]
  secondSetId: string | null
}

/**
 * The validated spec of a study, its sets and second set, or: 400 with `data.issues` (engine
 * issues located by bin and column, or a set that is not in the workspace), 413 when the study
 * is over the bins or quadrature-points budget or a set's members × bins is over the run budget
 * (server/domain/limits.ts), 400 with `data.issues` at `setIds[i]` / `secondSetId` for a set in a
 * slot that reads the other density (parton densities or fragmentation functions), or a missing
 * or unused second set (shared/utils/set-match.ts `slotIssues`), 422 with `data.issues` when a bin lies beyond the kinematic limit
 * or outside a set's grid. The budgets come before the reach check, which expands every point.
 */
export async function validateStudy(db: DB, workspaceId: string, input: StudyInput) {
  const checked = checkSpec(input.spec)
  if (!checked.spec) {
    fail(400, `The study has ${checked.issues.length} problem${checked.issues.length > 1 ? 's' : ''}: ${checked.issues[0]!.message}`, { issues: checked.issues.map(i => ({ message: i.message, bin: i.bin, column: i.column, path: i.path })) })
  }
  const tooLarge = studySizeProblem(checked.spec)
  if (tooLarge) throw tooLarge
  const sets = await setsOfWorkspace(db, workspaceId, input.setIds)
  const [second] = input.secondSetId ? await setsOfWorkspace(db, workspaceId, [input.secondSetId], 'secondSetId') : [null]
  const slots = slotIssues(checked.spec.kernel, sets.map(densityOfRow), second ? densityOfRow(second) : null)
  if (slots.length) fail(400, `${slots.length === 1 ? 'A set does not fit its slot' : `${slots.length} sets do not fit their slots`}: ${slots[0]!.message}`, { issues: slots })
  const unvaried = variationProblem(checked.spec, second)
  if (unvaried) throw unvaried
  for (const s of sets) {
    const runTooLarge = runSizeProblem(checked.spec, s, LIMITS, runVariation(checked.spec, s, second).rows)
    if (runTooLarge) throw runTooLarge
  }
  const problems: ReachProblem[] = sets.flatMap(s => reachProblems(checked.spec, s, second))
  if (problems.length) throw reachError(problems)
  return { spec: checked.spec, sets, second: second ?? null }
}

/** A set row as the slot check reads it: its name, version and what its header says it holds. */
const densityOfRow = (s: { name: string, version: string, header: SetHeader }) => ({ name: s.name, version: s.version, density: s.header.density ?? null })

export function reachError(problems: ReachProblem[]) {
  return new DomainError(422, `${problems.length} bin${problems.length > 1 ? 's are' : ' is'} out of reach: ${problems[0]!.message}`, { issues: problems.map(p => ({ message: p.message, bin: p.bin, setId: p.setId, kind: p.kind })) })
}

/** The newest version of each (study, set) result, for lists and comparisons. */
export async function latestResults(db: DB, studyIds: readonly string[]) {
  if (studyIds.length === 0) return []
  const rows = await db.select(resultListColumns).from(t.results)
    .where(inArray(t.results.studyId, [...studyIds]))
    .orderBy(desc(t.results.version))
  const seen = new Set<string>()
  return rows.filter((r) => {
    const key = `${r.studyId}:${r.setId}`
    if (seen.has(key)) return false
    seen.add(key)
    return true
  })
}

/**
 * One study's page data in three queries: every result version, newest first (without
 * snapshots), and its measurements together, then the name, version, kind and member count of
 * each set the study or one of its versions names (the page's first paint needs no more of the
 * workspace's library).
 */
export async function studyDetail(db: DB, study: Study) {
  const [results, measurements] = await Promise.all([
    db.select(resultListColumns).from(t.results).where(eq(t.results.studyId, study.id)).orderBy(desc(t.results.version), asc(t.results.createdAt)),
    db.select({ id: t.measurements.id, name: t.measurements.name, pointCount: t.measurements.pointCount, createdAt: t.measurements.createdAt })
      .from(t.measurements).where(eq(t.measurements.studyId, study.id)).orderBy(desc(t.measurements.createdAt))
  ])
  const setIds = [...new Set([...study.setIds, ...(study.secondSetId ? [study.secondSetId] : []), ...results.flatMap(r => (r.secondSetId ? [r.setId, r.secondSetId] : [r.setId]))])]
  const sets = setIds.length
    ? await db.select({ id: t.errorSets.id, name: t.errorSets.name, version: t.errorSets.version, kind: t.errorSets.kind, memberCount: t.errorSets.memberCount })
      .from(t.errorSets).where(and(eq(t.errorSets.workspaceId, study.workspaceId), inArray(t.errorSets.id, setIds)))
    : []
  return { ...publicStudy(study), results: results.map(publicResult), measurements, sets }
}

/** The newest finished version of a study's result on each of `setIds`. */
export async function latestDoneResults(db: DB, studyId: string, setIds: readonly string[]) {
  if (setIds.length === 0) return []
  const rows = await db.select().from(t.results)
    .where(and(eq(t.results.studyId, studyId), inArray(t.results.setId, [...setIds]), eq(t.results.state, 'done')))
    .orderBy(desc(t.results.version))
  const bySet = new Map<string, Result>()
  for (const r of rows) if (!bySet.has(r.setId)) bySet.set(r.setId, r)
  return setIds.flatMap(id => (bySet.has(id) ? [bySet.get(id)!] : []))
}

/** The live-bar view of a result: state, members done / total and percent. */
export const progressOf = (r: Result) => ({
  id: r.id, state: r.state, phase: r.phase, error: r.error, cancelRequested: r.cancelRequested,
  progress: { done: r.membersDone, total: r.membersTotal, percent: r.membersTotal ? Math.round((100 * r.membersDone) / r.membersTotal) : 0 },
  startedAt: r.startedAt, finishedAt: r.finishedAt
})
