import { and, eq, getTableColumns } from 'drizzle-orm'
import type { Role } from '../../../shared/utils/roles'
import { tables as t } from '../../database/client'

// Guards of the workflow routes: the row if `userId` is a member of its workspace with at least
// `role` and the row belongs to that workspace; else 404 (missing, or another workspace's) or
// 403 (role too low). Every route calls one of these instead of its own ownership query.

// Columns of error_sets without the file bytes: what every route but the download needs.
const { content: _content, ...setColumns } = getTableColumns(t.errorSets)
export { setColumns }

/** An error set of workspace `workspaceId` (without its file bytes). */
export async function requireSet(workspaceId: string, setId: string, userId: string, role: Role) {
  const access = await requireMembership(workspaceId, userId, role)
  const [set] = await useDB().select(setColumns).from(t.errorSets)
    .where(and(eq(t.errorSets.id, setId), eq(t.errorSets.workspaceId, workspaceId)))
  if (!set) throw createError({ statusCode: 404, statusMessage: 'Error set not found' })
  return { ...access, set }
}

/** A set build (build-from-fit request) of workspace `workspaceId`. */
export async function requireSetBuild(workspaceId: string, buildId: string, userId: string, role: Role) {
  const access = await requireMembership(workspaceId, userId, role)
  const [build] = await useDB().select().from(t.setBuilds)
    .where(and(eq(t.setBuilds.id, buildId), eq(t.setBuilds.workspaceId, workspaceId)))
  if (!build) throw createError({ statusCode: 404, statusMessage: 'Set build not found' })
  return { ...access, build }
}

/** A study of workspace `workspaceId`. */
export async function requireStudy(workspaceId: string, studyId: string, userId: string, role: Role) {
  const access = await requireMembership(workspaceId, userId, role)
  const [study] = await useDB().select().from(t.studies)
    .where(and(eq(t.studies.id, studyId), eq(t.studies.workspaceId, workspaceId)))
  if (!study) throw createError({ statusCode: 404, statusMessage: 'Study not found' })
  return { ...access, study }
}

/** A result (one version of a study on a set) whose study is in workspace `workspaceId`. */
export async function requireResult(workspaceId: string, resultId: string, userId: string, role: Role) {
  const access = await requireMembership(workspaceId, userId, role)
  const [row] = await useDB().select({ result: t.results, study: t.studies }).from(t.results)
    .innerJoin(t.studies, eq(t.studies.id, t.results.studyId))
    .where(and(eq(t.results.id, resultId), eq(t.studies.workspaceId, workspaceId)))
  if (!row) throw createError({ statusCode: 404, statusMessage: 'Result not found' })
  return { ...access, ...row }
}

/** A measurement attached to study `studyId` of workspace `workspaceId`. */
export async function requireMeasurement(workspaceId: string, studyId: string, measurementId: string, userId: string, role: Role) {
  const access = await requireStudy(workspaceId, studyId, userId, role)
  const [measurement] = await useDB().select().from(t.measurements)
    .where(and(eq(t.measurements.id, measurementId), eq(t.measurements.studyId, studyId)))
  if (!measurement) throw createError({ statusCode: 404, statusMessage: 'Measurement not found' })
  return { ...access, measurement }
}

/** 409 when `result` is approved: an approved version is frozen. */
export function assertNotFrozen(result: { reviewState: string, version: number }) {
  if (result.reviewState === 'approved') {
    throw createError({ statusCode: 409, statusMessage: `Version ${result.version} is approved and frozen; run the study again to make a new version` })
  }
}
