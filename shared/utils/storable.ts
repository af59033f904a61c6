// Text and JSON the database can store as sent. PostgreSQL refuses a NUL character (U+0000) in
// text and jsonb, and a lone UTF-16 surrogate is not Unicode text at all (jsonb refuses its
// escape; a text column would silently turn it into U+FFFD). JSON.parse turns a number beyond
// the double range (1e309) into Infinity, which JSON.stringify would store as null. Every string
// of the form and route schemas goes through `storableString()`, every free JSON document
// (a study spec, a fit document) through `storableJson()`, so such input is a 400 naming the
// field, the line and the column instead of a database error.
import { z } from 'zod'

/** How deep a JSON document may nest (objects and arrays); the real documents need fewer than 10. */
export const MAX_JSON_DEPTH = 64

const SUSPECT = /[\0\uD800-\uDFFF]/

/**
 * The first character of `text` that cannot be stored: its index and what it is ("a NUL
 * character (U+0000)", "a lone UTF-16 surrogate (U+D800)"), or null when the text is clean.
 * @example unstorableCharacter('a\u0000b') // { index: 1, what: 'a NUL character (U+0000)' }
 */
export function unstorableCharacter(text: string): { index: number, what: string } | null {
  if (!SUSPECT.test(text)) return null
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i)
    if (c === 0) return { index: i, what: 'a NUL character (U+0000)' }
    if (c < 0xD800 || c > 0xDFFF) continue
    if (c <= 0xDBFF) {
      const next = text.charCodeAt(i + 1)
      if (next >= 0xDC00 && next <= 0xDFFF) {
        i++
        continue
      }
    }
    return { index: i, what: `a lone UTF-16 surrogate (U+${c.toString(16).toUpperCase()})` }
  }
  return null
}

/** "line 3, column 7" in a text of several lines, else "character 7" (1-based). */
export function positionIn(text: string, index: number): string {
  const before = text.slice(0, index)
  const lines = before.split(/\r\n|\r|\n/)
  if (lines.length === 1 && !/[\r\n]/.test(text)) return `character ${index + 1}`
  return `line ${lines.length}, column ${lines.at(-1)!.length + 1}`
}

/** The message for a string that cannot be stored, or null. */
export function unstorableMessage(text: string): string | null {
  const bad = unstorableCharacter(text)
  return bad && `holds ${bad.what} at ${positionIn(text, bad.index)}; remove it`
}

/** z.string() that refuses a NUL character or a lone surrogate, saying where it is. */
export function storableString(params?: Parameters<typeof z.string>[0]) {
  return z.string(params).superRefine((text, ctx) => {
    const message = unstorableMessage(text)
    if (message) ctx.addIssue({ code: 'custom', message: `The text ${message}`, input: text })
  })
}

/** A problem of a JSON value: where (a zod-style path) and what. */
export interface JsonProblem { path: Array<string | number>, message: string }

const LONE = /\0|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g
/** A key shown in a message with the offending characters escaped. */
const shownKey = (key: string) => `"${key.slice(0, 60).replace(LONE, c => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`)}${key.length > 60 ? '…' : ''}"`

/**
 * The first thing in a parsed JSON value that cannot be stored as sent: a string or key with a
 * NUL or a lone surrogate, a number that is not finite (1e309 parses to Infinity), or nesting
 * deeper than `maxDepth`. Walks without recursion, so a hostile depth cannot overflow the stack.
 */
export function findJsonProblem(value: unknown, maxDepth = MAX_JSON_DEPTH): JsonProblem | null {
  const stack: Array<{ value: unknown, path: Array<string | number>, depth: number }> = [{ value, path: [], depth: 0 }]
  while (stack.length) {
    const { value: v, path, depth } = stack.pop()!
    if (typeof v === 'string') {
      const message = unstorableMessage(v)
      if (message) return { path, message: `The text ${message}` }
    } else if (typeof v === 'number') {
      if (!Number.isFinite(v)) return { path, message: 'The number is too large for a double-precision number (at most about 1.8e308)' }
    } else if (v !== null && typeof v === 'object') {
      if (depth >= maxDepth) return { path, message: `The document nests deeper than ${maxDepth} levels` }
      const entries: Array<[string | number, unknown]> = Array.isArray(v) ? v.map((item, i) => [i, item]) : Object.entries(v)
      for (let i = entries.length - 1; i >= 0; i--) {
        const [key, item] = entries[i]!
        if (typeof key === 'string') {
          const message = unstorableMessage(key)
          if (message) return { path, message: `The key ${shownKey(key)} ${message}` }
        }
        stack.push({ value: item, path: [...path, key], depth: depth + 1 })
      }
    }
  }
  return null
}

/** z.unknown() for a free JSON document: refuses what findJsonProblem finds, at its path. */
export function storableJson() {
  return z.unknown().superRefine((value, ctx) => {
    const problem = findJsonProblem(value)
    if (problem) ctx.addIssue({ code: 'custom', message: problem.message, path: problem.path, input: value })
  })
}
