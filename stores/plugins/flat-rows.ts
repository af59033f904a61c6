/**
 * Long lists of flat records in the server-rendered page's payload (a study's 10,000 bins) are
 * written as JSON text. Nuxt's own payload format walks every value of the payload to keep
 * references, `undefined` and the like: for 10,000 bins it took about 100 ms to write on the
 * server (a third of the first server render of a 10,000-bin study page) and about 20 ms to read
 * in the browser; as JSON text, a few ms each. Only arrays that JSON carries exactly are taken:
 * 256 or more plain objects whose values are finite numbers (not −0), strings, booleans or null.
 */
const MIN_ROWS = 256

type FlatRow = Record<string, string | number | boolean | null>

/** True for an array that JSON carries exactly and that is long enough to be worth it. */
export function isFlatRows(value: unknown): value is FlatRow[] {
  if (!Array.isArray(value) || value.length < MIN_ROWS) return false
  for (const row of value) {
    if (row === null || typeof row !== 'object' || Object.getPrototypeOf(row) !== Object.prototype) return false
    for (const key in row) {
      const v = (row as Record<string, unknown>)[key]
      if (v === null || typeof v === 'string' || typeof v === 'boolean') continue
      if (typeof v !== 'number' || !Number.isFinite(v) || Object.is(v, -0)) return false
    }
  }
  return true
}

/** The payload reducer: the rows as JSON text, or false to leave the value to Nuxt. */
export const reduceFlatRows = (value: unknown): string | false => isFlatRows(value) && JSON.stringify(value)

/** The payload reviver. */
export const reviveFlatRows = (text: string): FlatRow[] => JSON.parse(text) as FlatRow[]
