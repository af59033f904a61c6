// What a finished result shows never changes (a new run is a new result), so the server keeps
// the bands of each (result, prescription, CL) and the scale variation it has read, and the spec
// snapshot of any result (written once, when the version is made; the result guard needs it on
// every request and it holds all of the study's bins), in an LRU
// of at most SHEAF_RESULT_CACHE_BYTES (default 64 MiB, counted as 8 bytes a number): a study
// page's repeated requests skip the database and the parse of megabytes of JSON. Only finished
// results' bands and scale are cached, and a result id is never reused.
import { LRUCache } from 'lru-cache'
import type { ScaleVariationJson, SpecSnapshot, StoredBands } from '../../database/schema'

const MAX_BYTES = Number(process.env.SHEAF_RESULT_CACHE_BYTES ?? 64 * 1024 * 1024)

type Entry = { bands: StoredBands } | { scale: ScaleVariationJson | null } | { snapshot: SpecSnapshot }

const size = (e: Entry) => {
  // A snapshot's bins: a few numbers and a label each, about 100 bytes in memory.
  if ('snapshot' in e) return 100 * Math.max(1, e.snapshot.spec.bins.length) + 1024
  if ('bands' in e) return 8 * 11 * Math.max(1, e.bands.central.length) + 64
  return e.scale ? 8 * (e.scale.values.length + 3) * Math.max(1, e.scale.nominal.length) + 64 : 64
}

const cache = new LRUCache<string, Entry>({ maxSize: MAX_BYTES, sizeCalculation: size })

type Kind = 'bands' | 'scale' | 'snapshot'
type Value<K extends Kind> = Extract<Entry, Record<K, unknown>> extends Record<K, infer V> ? V : never

/** The entry `key` of kind `kind`, else `read()` stored under that key. */
async function readThrough<K extends Kind>(key: string, kind: K, read: () => Promise<Value<K>>): Promise<Value<K>> {
  const hit = cache.get(key) as Partial<Record<K, Value<K>>> | undefined
  if (hit && kind in hit) return hit[kind] as Value<K>
  const value = await read()
  cache.set(key, { [kind]: value } as unknown as Entry)
  return value
}

/** The bands of finished result `resultId` for a prescription and CL, read through the cache. */
export const cachedBands = (resultId: string, prescription: string, clPercent: number, read: () => Promise<StoredBands>) =>
  readThrough(`bands:${resultId}:${prescription}:${clPercent}`, 'bands', read)

/** The scale variation of finished result `resultId`, read through the cache. */
export const cachedScale = (resultId: string, read: () => Promise<ScaleVariationJson | null>) =>
  readThrough(`scale:${resultId}`, 'scale', read)

/** The spec snapshot of result `resultId` (never changed once written), read through the cache. */
export const cachedSnapshot = (resultId: string, read: () => Promise<SpecSnapshot>) =>
  readThrough(`snapshot:${resultId}`, 'snapshot', read)
