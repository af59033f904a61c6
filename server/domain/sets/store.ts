// Reading stored error sets and storing new ones. Parsed sets are kept in an LRU cache keyed by
// the file's SHA-256 and bounded by the files' total size, so a server or worker keeps a few
// sets hot without growing (SHEAF_SET_CACHE_BYTES, default 256 MiB). Each workspace may store
// set files up to its quota (SHEAF_WORKSPACE_QUOTA_BYTES, default 2 GiB): a set that does not
// fit is refused with 413 and nothing is stored.
import { createHash } from 'node:crypto'
import { eq, sql } from 'drizzle-orm'
import { LRUCache } from 'lru-cache'
import type { DB, Tx } from '../../database/client'
import { tables as t } from '../../database/client'
import { parseSetFile, readSetHeader } from '../../../shared/physics/sets/parse'
import type { ErrorSet } from '../../../shared/physics/types'
import { fail } from '../errors'
import { formatBytes, LIMITS } from '../limits'

const cacheBytes = Number(process.env.SHEAF_SET_CACHE_BYTES) || 256 * 1024 * 1024

const cache = new LRUCache<string, { set: ErrorSet, bytes: number }>({
  maxSize: cacheBytes,
  // A set larger than the whole budget is still kept alone, as before: the last one used.
  sizeCalculation: entry => Math.max(1, Math.min(entry.bytes, cacheBytes))
})

/** The parsed members of stored set `setId` (cached by content hash); RangeError if it is gone. */
export async function loadErrorSet(db: DB, setId: string): Promise<ErrorSet> {
  const [meta] = await db.select({ sha256: t.errorSets.sha256 }).from(t.errorSets).where(eq(t.errorSets.id, setId))
  if (!meta) throw new RangeError(`Error set ${setId} no longer exists`)
  const hit = cache.get(meta.sha256)
  if (hit) return hit.set
  const [row] = await db.select({ content: t.errorSets.content }).from(t.errorSets).where(eq(t.errorSets.id, setId))
  if (!row) throw new RangeError(`Error set ${setId} no longer exists`)
  const set = parseSetFile(row.content)
  cache.set(meta.sha256, { set, bytes: row.content.byteLength })
  return set
}

export const sha256Hex = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex')

/** The columns of an error_sets row described by a set file's header (bytes already parsed). */
export function setRowFields(bytes: Uint8Array) {
  const s = readSetHeader(bytes)
  return {
    family: s.header.family, version: s.header.version, kind: s.header.kind,
    memberCount: s.header.memberCount, confidenceLevelPercent: s.header.confidenceLevelPercent,
    xMin: s.range.xMin, xMax: s.range.xMax, q2Min: s.range.q2MinGeV2, q2Max: s.range.q2MaxGeV2,
    target: s.header.target, header: s.header,
    axes: { x: Array.from(s.x), q2: Array.from(s.q2), flavours: [...s.flavours] }
  }
}

/** Bytes of set files stored in workspace `workspaceId`. */
export async function storedSetBytes(db: Tx | DB, workspaceId: string): Promise<number> {
  const [row] = await db.select({ bytes: sql<number>`coalesce(sum(${t.errorSets.sizeBytes}), 0)::float8` })
    .from(t.errorSets).where(eq(t.errorSets.workspaceId, workspaceId))
  return Number(row?.bytes ?? 0)
}

/**
 * 413 unless `addingBytes` more fit the workspace's quota, the numbers in the message and in
 * data.quota. `what` names the newcomer ("toy.sheafset (12 MiB)", "the built set (about 40 MiB)").
 */
export async function assertQuota(db: Tx | DB, workspaceId: string, addingBytes: number, what: string, quotaBytes = LIMITS.workspaceQuotaBytes) {
  const used = await storedSetBytes(db, workspaceId)
  if (used + addingBytes <= quotaBytes) return
  fail(413, `This workspace stores ${formatBytes(used)} of set files and its quota is ${formatBytes(quotaBytes)}: ${what} does not fit (${formatBytes(Math.max(0, quotaBytes - used))} left). Delete sets you no longer need, or ask for a larger quota (SHEAF_WORKSPACE_QUOTA_BYTES)`, {
    quota: { usedBytes: used, addingBytes, quotaBytes }
  })
}

/**
 * Inserts a checked set file as a new error set of `workspaceId` (inside `tx`); its id. The
 * workspace row is locked first (inside a transaction), so concurrent inserts cannot overrun the
 * quota together; 413 (assertQuota) when the file does not fit.
 */
export async function insertErrorSet(tx: Tx | DB, o: { workspaceId: string, name: string, fileName: string, bytes: Uint8Array, origin: 'upload' | 'build', addedBy: string | null }, quotaBytes = LIMITS.workspaceQuotaBytes) {
  await tx.select({ id: t.workspaces.id }).from(t.workspaces).where(eq(t.workspaces.id, o.workspaceId)).for('update')
  await assertQuota(tx, o.workspaceId, o.bytes.byteLength, `${o.fileName || o.name} (${formatBytes(o.bytes.byteLength)})`, quotaBytes)
  const content = Buffer.from(o.bytes.buffer, o.bytes.byteOffset, o.bytes.byteLength)
  const sha256 = sha256Hex(content)
  const [row] = await tx.insert(t.errorSets).values({
    workspaceId: o.workspaceId, name: o.name, ...setRowFields(content), origin: o.origin, fileName: o.fileName,
    sizeBytes: content.byteLength, sha256, content, addedBy: o.addedBy
  }).returning({ id: t.errorSets.id })
  return row!.id
}
