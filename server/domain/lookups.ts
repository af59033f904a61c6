// Rows of a workspace, looked up for someone who must be a member with at least a given role:
// 404 when the workspace or the row is missing or belongs to another workspace, 403 when the role
// is too low. The server's event guards (server/utils/guards.ts) call these; nothing else writes
// its own ownership query.
import { and, eq, getTableColumns } from 'drizzle-orm'
import type { DB } from '../database/client'
import { tables as t } from '../database/client'
import { roleAtLeast, type Role } from '../../shared/utils/roles'
import { fail } from './errors'
import { setColumns } from './sets/library'
import { cachedSnapshot } from './results/cache'

/** The membership of `userId` in workspace `workspaceId` with at least `minRole`, and the workspace. */
export async function findMembership(db: DB, workspaceId: string, userId: string, minRole: Role) {
  const [row] = await db
    .select({ membership: t.memberships, workspace: t.workspaces })
    .from(t.memberships)
    .innerJoin(t.workspaces, eq(t.workspaces.id, t.memberships.workspaceId))
    .where(and(eq(t.memberships.workspaceId, workspaceId), eq(t.memberships.userId, userId)))
  if (!row) fail(404, 'Workspace not found')
  if (!roleAtLeast(row.membership.role, minRole)) {
    fail(403, `This needs the ${minRole} role or higher`, { role: row.membership.role, required: minRole })
  }
  return row
}

/** An error set of the workspace (without its file bytes). */
export async function findSet(db: DB, workspaceId: string, setId: string) {
  const [set] = await db.select(setColumns).from(t.errorSets)
    .where(and(eq(t.errorSets.id, setId), eq(t.errorSets.workspaceId, workspaceId)))
  if (!set) fail(404, 'Error set not found')
  return set
}

/** A set build (build-from-fit request) of the workspace. */
export async function findSetBuild(db: DB, workspaceId: string, buildId: string) {
  const [build] = await db.select().from(t.setBuilds)
    .where(and(eq(t.setBuilds.id, buildId), eq(t.setBuilds.workspaceId, workspaceId)))
  if (!build) fail(404, 'Set build not found')
  return build
}

/** A study of the workspace. */
export async function findStudy(db: DB, workspaceId: string, studyId: string) {
  const [study] = await db.select().from(t.studies)
    .where(and(eq(t.studies.id, studyId), eq(t.studies.workspaceId, workspaceId)))
  if (!study) fail(404, 'Study not found')
  return study
}

/** A result (one version of a study on a set) whose study is in the workspace, with the study. */
const { specSnapshot: _snapshot, ...resultColumns } = getTableColumns(t.results)

/**
 * A result of the workspace's studies, with its study's id, name and revision (not the study's
 * spec). The spec snapshot (all of the study's bins as run, written once) comes from the result
 * cache after the first read, so each request reads only the small columns.
 */
export async function findResult(db: DB, workspaceId: string, resultId: string) {
  const [row] = await db.select({ result: resultColumns, study: { id: t.studies.id, name: t.studies.name, revision: t.studies.revision } }).from(t.results)
    .innerJoin(t.studies, eq(t.studies.id, t.results.studyId))
    .where(and(eq(t.results.id, resultId), eq(t.studies.workspaceId, workspaceId)))
  if (!row) fail(404, 'Result not found')
  const specSnapshot = await cachedSnapshot(resultId, async () => {
    const [r] = await db.select({ specSnapshot: t.results.specSnapshot }).from(t.results).where(eq(t.results.id, resultId))
    if (!r) fail(404, 'Result not found')
    return r.specSnapshot
  })
  return { result: { ...row.result, specSnapshot }, study: row.study }
}

/** A measurement attached to study `studyId`. */
export async function findMeasurement(db: DB, studyId: string, measurementId: string) {
  const [measurement] = await db.select().from(t.measurements)
    .where(and(eq(t.measurements.id, measurementId), eq(t.measurements.studyId, studyId)))
  if (!measurement) fail(404, 'Measurement not found')
  return measurement
}

/** 409 when `result` is approved: an approved version is frozen. */
export function assertNotFrozen(result: { reviewState: string, version: number }) {
  if (result.reviewState === 'approved') {
    fail(409, `Version ${result.version} is approved and frozen; run the study again to make a new version`)
  }
}
