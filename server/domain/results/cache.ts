// What a finished result shows never changes (a new run is a new result), so the server keeps
// the bands of each (result, prescription, CL) and the scale variation it has read, in an LRU
// of at most SHEAF_RESULT_CACHE_BYTES (default 64 MiB, counted as 8 bytes a number): a study
// page's repeated requests skip the database and the parse of megabytes of JSON. Only finished
// results are cached, and a result id is never reused.
import { LRUCache } from 'lru-cache'
import type { ScaleVariationJson, StoredBands } from '../../database/schema'

const MAX_BYTES = Number(process.env.SHEAF_RESULT_CACHE_BYTES ?? 64 * 1024 * 1024)

type Entry = { bands: StoredBands } | { scale: ScaleVariationJson | null }

const size = (e: Entry) => {
  if ('bands' in e) return 8 * 11 * Math.max(1, e.bands.central.length) + 64
  return e.scale ? 8 * (e.scale.values.length + 3) * Math.max(1, e.scale.nominal.length) + 64 : 64
}

const cache = new LRUCache<string, Entry>({ maxSize: MAX_BYTES, sizeCalculation: size })

/** The bands of finished result `resultId` for a prescription and CL, read through the cache. */
export async function cachedBands(resultId: string, prescription: string, clPercent: number, read: () => Promise<StoredBands>): Promise<StoredBands> {
  const key = `bands:${resultId}:${prescription}:${clPercent}`
  const hit = cache.get(key)
  if (hit && 'bands' in hit) return hit.bands
  const bands = await read()
  cache.set(key, { bands })
  return bands
}

/** The scale variation of finished result `resultId`, read through the cache. */
export async function cachedScale(resultId: string, read: () => Promise<ScaleVariationJson | null>): Promise<ScaleVariationJson | null> {
  const key = `scale:${resultId}`
  const hit = cache.get(key)
  if (hit && 'scale' in hit) return hit.scale
  const scale = await read()
  cache.set(key, { scale })
  return scale
}
