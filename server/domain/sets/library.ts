import { and, asc, count, desc, eq, getTableColumns, inArray, or } from 'drizzle-orm'
import type { DB } from '../../database/client'
import { tables as t } from '../../database/client'
import type { ErrorSetRow } from '../../database/schema'
import { conflictOnUnique, fail } from '../errors'
import { findJsonProblem } from '../../../shared/utils/storable'
import { formatPath } from '../../../shared/physics/json-path'
import { densityOf } from '../../../shared/physics/fragmentation/species'

/** A set's row without its file. */
export type SetRow = Omit<ErrorSetRow, 'content'>

/** Columns of error_sets without the file bytes: what everything but the download needs. */
const { content: _content, ...columns } = getTableColumns(t.errorSets)
export const setColumns = columns

/**
 * What the API shows of an error set (never its bytes). `header` only in the detail. `density`
 * says what the grid holds (parton densities unless the header says fragmentation); `target` of
 * a fragmentation set is the neutral NO_TARGET (shared/physics/sets/header.ts), to be ignored.
 */
export function publicSet(s: SetRow, addedBy: { id: string, name: string } | null, withHeader = false) {
  return {
    id: s.id, name: s.name, family: s.family, version: s.version, kind: s.kind,
    memberCount: s.memberCount, confidenceLevelPercent: s.confidenceLevelPercent,
    xMin: s.xMin, xMax: s.xMax, q2MinGeV2: s.q2Min, q2MaxGeV2: s.q2Max,
    target: s.target, density: densityOf(s.header), origin: s.origin, fileName: s.fileName, sizeBytes: s.sizeBytes, sha256: s.sha256,
    addedBy, createdAt: s.createdAt, updatedAt: s.updatedAt,
    ...(withHeader ? { header: s.header } : {})
  }
}

/** The workspace's sets, newest first, with who added each. */
export async function listSets(db: DB, workspaceId: string) {
  const rows = await db.select({ set: setColumns, user: { id: t.users.id, name: t.users.name } })
    .from(t.errorSets)
    .leftJoin(t.users, eq(t.users.id, t.errorSets.addedBy))
    .where(eq(t.errorSets.workspaceId, workspaceId))
    .orderBy(desc(t.errorSets.createdAt))
  return rows.map(r => publicSet(r.set, r.user?.id ? r.user : null))
}

/** The name of a user, or null. */
export async function userBrief(db: DB, userId: string | null) {
  if (!userId) return null
  const [u] = await db.select({ id: t.users.id, name: t.users.name, email: t.users.email }).from(t.users).where(eq(t.users.id, userId))
  return u ?? null
}

/** Number of results (any version, any state) computed with set `setId` (as main or second set). */
export async function resultsUsingSet(db: DB, setId: string) {
  const [row] = await db.select({ n: count() }).from(t.results)
    .where(or(eq(t.results.setId, setId), eq(t.results.secondSetId, setId)))
  return row?.n ?? 0
}

/** The unique constraint on (workspace, name, version) of error_sets. */
export const SET_NAME_UNIQUE = 'error_sets_workspace_id_name_version_unique'

const nameTaken = (name: string, version: string) => ({
  message: `A set named ${name} version ${version} is already in this workspace; choose another name`,
  data: { fields: { name: `${name} version ${version} is already in this workspace` } }
})

/** 409 when a set with this name and version already exists in the workspace (other than `exceptId`). */
export async function assertSetNameFree(db: DB, workspaceId: string, name: string, version: string, exceptId?: string) {
  const rows = await db.select({ id: t.errorSets.id }).from(t.errorSets)
    .where(and(eq(t.errorSets.workspaceId, workspaceId), eq(t.errorSets.name, name), eq(t.errorSets.version, version)))
  if (rows.some(r => r.id !== exceptId)) {
    const { message, data } = nameTaken(name, version)
    fail(409, message, data)
  }
}

/**
 * Runs `write`, which stores set name `name` with `version`; the same 409 as assertSetNameFree
 * when a concurrent upload, build or rename took the name between that check and this write.
 */
export function whileSetNameFree<T>(name: string, version: string, write: () => Promise<T>): Promise<T> {
  const { message, data } = nameTaken(name, version)
  return conflictOnUnique(SET_NAME_UNIQUE, write, message, data)
}

/**
 * 400 when the header of an uploaded set file holds text the database cannot store (a NUL, a
 * lone surrogate) or a number beyond the double range, naming the header field.
 */
export function assertStorableHeader(header: unknown, fileName: string) {
  const problem = findJsonProblem(header)
  if (!problem) return
  const path = ['set', ...problem.path]
  const message = `header field ${formatPath(path)}: ${problem.message}`
  fail(400, `${fileName || 'The file'} is not a valid set file: ${message}`, { issues: [{ message, path, file: fileName }] })
}

/** The sets `ids` of workspace `workspaceId` (without bytes), in the order given; 400 naming a missing one. */
export async function setsOfWorkspace(db: DB, workspaceId: string, ids: readonly string[], field = 'setIds') {
  if (ids.length === 0) return []
  const rows = await db.select(setColumns).from(t.errorSets)
    .where(and(eq(t.errorSets.workspaceId, workspaceId), inArray(t.errorSets.id, [...ids])))
    .orderBy(asc(t.errorSets.name))
  const byId = new Map(rows.map(r => [r.id, r]))
  const missing = ids.map((id, i) => ({ id, i })).filter(({ id }) => !byId.has(id))
  if (missing.length) {
    fail(400, 'Some error sets are not in this workspace', { issues: missing.map(({ id, i }) => ({ message: `${field}[${i}]: no error set ${id} in this workspace`, path: [field, i] })) })
  }
  return ids.map(id => byId.get(id)!)
}

/** 422 unless `x` lies within [lo, hi], the x nodes of the set(s) asked about. */
export function assertXInside(x: number, lo: number, hi: number) {
  if (x < lo || x > hi) fail(422, `x = ${x} is outside the grid (${lo} to ${hi})`, { fields: { x: 'outside the grid' } })
}

/** 422 unless `q2` (GeV²) lies within [lo, hi], the Q² nodes of the set(s) asked about. */
export function assertQ2Inside(q2: number, lo: number, hi: number) {
  if (q2 < lo || q2 > hi) {
    fail(422, `Q² = ${q2} GeV² is outside the grid (${lo} to ${hi} GeV²)`, { fields: { q2: 'outside the grid' } })
  }
}
