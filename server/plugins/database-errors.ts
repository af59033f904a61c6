import { isDatabaseFailure, logText } from '../domain/log-text'

// A failed query must not reach the logs with its bound parameters. drizzle's DrizzleQueryError
// carries the whole statement and its parameters in its message (a password hash, a token hash,
// a whole set file), and Nitro logs an unhandled error with its message, stack and cause. Every
// request goes through the app's handler, so an error from the database is replaced there, before
// H3 wraps and Nitro logs it, by a plain error saying PostgreSQL's message and SQLSTATE only
// (server/domain/log-text.ts), with the original stack frames. The client still gets a bare 500.
export default defineNitroPlugin((nitroApp) => {
  const handler = nitroApp.h3App.handler
  nitroApp.h3App.handler = defineEventHandler(async (event) => {
    try {
      return await handler(event)
    } catch (err) {
      throw isDatabaseFailure(err) && !answered(err) ? quietError(err) : err
    }
  })
})

/** An H3 error a route threw on purpose (a 4xx or 503 with a cause): answered and not logged as it is. */
function answered(err: unknown) {
  const e = err as { constructor?: { __h3_error__?: boolean }, unhandled?: boolean, fatal?: boolean }
  return e.constructor?.__h3_error__ === true && !e.unhandled && !e.fatal
}

/** An Error with only the log line of `err` and the stack frames of the error that carried the query. */
function quietError(err: unknown) {
  const text = logText(err)
  const quiet = new Error(text)
  quiet.stack = `Error: ${text}${framesOf(err)}`
  return quiet
}

/** The "    at …" lines of `err`'s stack without its message (which may quote the parameters). */
function framesOf(err: unknown) {
  if (!(err instanceof Error) || !err.stack) return ''
  const at = err.stack.indexOf(err.message)
  const frames = at >= 0 ? err.stack.slice(at + err.message.length) : ''
  return /^(?:\n\s+at [^\n]*)*$/.test(frames) ? frames : ''
}
