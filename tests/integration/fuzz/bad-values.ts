// Arbitraries of values that no schema of Sheaf may accept, and of mutations that break a valid
// JSON document in a way that must be refused whatever else the document holds.
import fc from 'fast-check'
import { DEEP, INF } from './harness'

/** `text` with a NUL or a lone surrogate inserted somewhere. */
export const withUnstorable = (text: fc.Arbitrary<string>) =>
  fc.tuple(text, fc.constantFrom('\u0000', '\uD800', '\uDBFF', '\uDC00', '\uDFFF'), fc.nat())
    .map(([s, bad, at]) => {
      const i = s.length ? at % (s.length + 1) : 0
      return s.slice(0, i) + bad + s.slice(i)
    })

/** `text` with a NUL inserted somewhere: what a multipart field can carry (UTF-8 has no lone surrogates). */
export const withNul = (text: fc.Arbitrary<string>) =>
  fc.tuple(text, fc.nat()).map(([s, at]) => s.slice(0, at % (s.length + 1)) + '\u0000' + s.slice(at % (s.length + 1)))

/** Some readable text (no control characters). */
export const words = fc.string({ unit: fc.constantFrom(...'abcdefghijklmnopqrstuvwxyz ABCXYZ-_0123456789éü'.split('')), minLength: 1, maxLength: 30 })
  .map(s => `a${s}`)

/** A string longer than `max` characters. */
export const overlong = (max: number) => fc.integer({ min: max + 1, max: Math.max(max + 1, 6000) }).map(n => 'x'.repeat(n))

/** A value of the wrong JSON type for a string field. */
export const notAString = fc.constantFrom<unknown>(42, true, null, [], {}, ['a'], { a: 1 })

/** Bad values for a string field whose longest allowed length is `max`. */
export const badText = (max: number) => fc.oneof(withUnstorable(words), overlong(max), notAString)

/** A random JSON leaf path in `doc` (objects and arrays only), or [] for the root. */
export function leafPaths(doc: unknown, prefix: Array<string | number> = []): Array<Array<string | number>> {
  if (doc === null || typeof doc !== 'object') return [prefix]
  const entries: Array<[string | number, unknown]> = Array.isArray(doc) ? doc.map((v, i) => [i, v]) : Object.entries(doc)
  if (!entries.length) return [prefix]
  return entries.flatMap(([k, v]) => leafPaths(v, [...prefix, k]))
}

/** A deep copy of `doc` with the value at `path` replaced. */
export function replaceAt(doc: unknown, path: Array<string | number>, value: unknown): unknown {
  if (!path.length) return value
  const copy = structuredClone(doc) as Record<string | number, unknown>
  let node = copy
  for (const k of path.slice(0, -1)) node = node[k] as Record<string | number, unknown>
  node[path.at(-1)!] = value
  return copy
}

/** A deep copy of `doc` with `key` = `value` added to the object at `path` (or its parent). */
export function addKeyAt(doc: unknown, path: Array<string | number>, key: string, value: unknown): unknown {
  const copy = structuredClone(doc) as Record<string, unknown>
  let node: unknown = copy
  for (const k of path) {
    const next = (node as Record<string | number, unknown>)[k]
    if (next === null || typeof next !== 'object' || Array.isArray(next)) break
    node = next
  }
  if (node !== null && typeof node === 'object' && !Array.isArray(node)) (node as Record<string, unknown>)[key] = value
  return copy
}

/**
 * A mutation that makes any JSON document unstorable, and the path it lands on (a zod-style
 * path from the document root): a leaf replaced by a string with a NUL or a lone surrogate, by
 * 1e309, or by a 200-level nest; or a key with a NUL or a lone surrogate added to an object.
 */
export function unstorableMutation(doc: unknown) {
  const paths = leafPaths(doc)
  return fc.tuple(fc.nat({ max: paths.length - 1 }), fc.constantFrom('string', 'number', 'deep', 'key'), withUnstorable(words))
    .map(([i, kind, text]) => {
      const path = paths[i]!
      if (kind === 'key') return { doc: addKeyAt(doc, path.slice(0, -1), text, 1), path: [] as Array<string | number>, kind }
      const value = kind === 'string' ? text : kind === 'number' ? INF : DEEP
      return { doc: replaceAt(doc, path, value), path, kind }
    })
}
