// What an error may say in a log. A failed query reaches us as drizzle's DrizzleQueryError, whose
// message and `params` carry the statement's bound parameters (password hashes, token hashes,
// whole set files), around pg's DatabaseError, whose `detail` can quote row values. Logs keep
// PostgreSQL's message and SQLSTATE only; other errors keep their first line.

/** pg's DatabaseError as far as a log needs it. */
export interface DatabaseFailure { message: string, code: string }

const SQLSTATE = /^[0-9A-Z]{5}$/
const MAX_DEPTH = 8

/** The errors of `err`'s cause chain, outermost first. */
function chain(err: unknown): unknown[] {
  const out: unknown[] = []
  for (let e = err; e != null && out.length < MAX_DEPTH && !out.includes(e); e = (e as { cause?: unknown }).cause) out.push(e)
  return out
}

/** pg's DatabaseError: an Error with a SQLSTATE in `code` and a `severity`. */
function isDatabaseError(e: unknown): e is Error & { code: string, severity: string } {
  if (!(e instanceof Error)) return false
  const { code, severity } = e as Error & { code?: unknown, severity?: unknown }
  return typeof code === 'string' && SQLSTATE.test(code) && typeof severity === 'string'
}

/** drizzle's DrizzleQueryError (the query text and its bound parameters). */
function isQueryError(e: unknown): boolean {
  return e instanceof Error && 'params' in e && 'query' in e
}

/** The PostgreSQL error somewhere in `err`'s cause chain, or undefined. */
export function databaseFailure(err: unknown): DatabaseFailure | undefined {
  const db = chain(err).find(isDatabaseError)
  return db ? { message: db.message.split('\n')[0]!.slice(0, 300), code: db.code } : undefined
}

/** True when `err` or one of its causes came from a database query (and may carry its parameters). */
export function isDatabaseFailure(err: unknown): boolean {
  return chain(err).some(e => isDatabaseError(e) || isQueryError(e))
}

/**
 * One line for a log: `database error 23505: duplicate key value violates unique constraint …`
 * for a failed query (a query that never reached PostgreSQL gives its cause's first line, never
 * the query's own message), otherwise the error's first line.
 */
export function logText(err: unknown): string {
  const db = databaseFailure(err)
  if (db) return `database error ${db.code}: ${db.message}`
  const links = chain(err)
  const query = links.findIndex(isQueryError)
  if (query >= 0) {
    const cause = links.slice(query + 1).find(e => e instanceof Error)
    return `database query failed: ${cause instanceof Error ? cause.message.split('\n')[0]!.slice(0, 300) : 'no reason given'}`
  }
  const text = err instanceof Error ? err.message : String(err)
  return text.split('\n')[0]!.slice(0, 1000)
}
