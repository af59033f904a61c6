// Reading stored error sets and storing new ones. No Nitro imports: the worker loads sets and
// stores built ones with these; the server's routes call them with useDB().
import { createHash } from 'node:crypto'
import { eq } from 'drizzle-orm'
import type { DB } from '../../database/client'
import { tables as t } from '../../database/client'
import { parseSetFile, readSetHeader } from '../../../shared/physics/sets/parse'
import type { ErrorSet } from '../../../shared/physics/types'

type Tx = Parameters<Parameters<DB['transaction']>[0]>[0]

// Parsed sets by sha256, newest last; bounded by their total size so a server or worker keeps a
// few sets hot without growing.
const cache = new Map<string, { set: ErrorSet, bytes: number }>()
const CACHE_BYTES = Number(process.env.SHEAF_SET_CACHE_BYTES) || 256 * 1024 * 1024

function remember(sha: string, set: ErrorSet, bytes: number) {
  cache.delete(sha)
  cache.set(sha, { set, bytes })
  let total = [...cache.values()].reduce((a, c) => a + c.bytes, 0)
  for (const [key, entry] of cache) {
    if (total <= CACHE_BYTES || cache.size === 1) break
    cache.delete(key)
    total -= entry.bytes
  }
}

/** The parsed members of stored set `setId` (cached by content hash); RangeError if it is gone. */
export async function loadErrorSet(db: DB, setId: string): Promise<ErrorSet> {
  const [meta] = await db.select({ sha256: t.errorSets.sha256 }).from(t.errorSets).where(eq(t.errorSets.id, setId))
  if (!meta) throw new RangeError(`Error set ${setId} no longer exists`)
  const hit = cache.get(meta.sha256)
  if (hit) {
    remember(meta.sha256, hit.set, hit.bytes)
    return hit.set
  }
  const [row] = await db.select({ content: t.errorSets.content }).from(t.errorSets).where(eq(t.errorSets.id, setId))
  const set = parseSetFile(row!.content)
  remember(meta.sha256, set, row!.content.byteLength)
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

/** Inserts a checked set file as a new error set of `workspaceId` (inside `tx`). */
export async function insertErrorSet(tx: Tx | DB, o: { workspaceId: string, name: string, fileName: string, bytes: Uint8Array, origin: 'upload' | 'build', addedBy: string | null }) {
  const content = Buffer.from(o.bytes.buffer, o.bytes.byteOffset, o.bytes.byteLength)
  const sha256 = sha256Hex(content)
  const [row] = await tx.insert(t.errorSets).values({
    workspaceId: o.workspaceId, name: o.name, ...setRowFields(content), origin: o.origin, fileName: o.fileName,
    sizeBytes: content.byteLength, sha256, content, addedBy: o.addedBy
  }).returning({ id: t.errorSets.id })
  return row!.id
}
