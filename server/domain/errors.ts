// Errors the domain layer throws for bad requests: an HTTP status, a message that says what and
// where, and `data` (field messages or located issues) for the forms. Framework-free: the
// routes let them through unchanged (see DomainError.__h3_error__), the worker and the command
// line print the message.
import { SetFormatError } from '../../shared/physics/sets/errors'

export interface ErrorData {
  fields?: Record<string, string>
  issues?: unknown[]
  [key: string]: unknown
}

export class DomainError extends Error {
  /**
   * H3 (the routes' HTTP layer) passes on an error whose class carries this flag with its own
   * statusCode, statusMessage and data instead of hiding it behind a 500. Duck typing keeps the
   * domain free of framework imports.
   */
  static readonly __h3_error__ = true
  readonly statusMessage: string
  readonly fatal = false
  readonly unhandled = false
  constructor(readonly statusCode: number, message: string, readonly data?: ErrorData) {
    super(message)
    this.name = 'DomainError'
    this.statusMessage = message
  }

  toJSON() {
    return { statusCode: this.statusCode, statusMessage: this.statusMessage, message: this.message, ...(this.data ? { data: this.data } : {}) }
  }
}

/** Throws a DomainError: `fail(409, 'Already running')`. */
export function fail(statusCode: number, message: string, data?: ErrorData): never {
  throw new DomainError(statusCode, message, data)
}

export const isDomainError = (err: unknown): err is DomainError => err instanceof DomainError

/** The 400 for a set file the engine refused: the located problem in data.issues. */
export function setFileRejection(err: unknown, fileName: string) {
  if (err instanceof SetFormatError) {
    return new DomainError(400, `${fileName || 'The file'} is not a valid set file: ${err.message}`, { issues: [err.toJSON()] })
  }
  if (err instanceof RangeError) {
    return new DomainError(400, `${fileName || 'The file'} is not a valid set file: ${err.message}`, { issues: [{ message: err.message }] })
  }
  return err
}

/** A 422 for a physically meaningless request the engine refused with a RangeError; other errors pass. */
export function engineRejection(err: unknown, what: string) {
  if (err instanceof RangeError) {
    return new DomainError(422, `${what}: ${err.message}`, { issues: [{ message: err.message }] })
  }
  return err
}

/** The SQLSTATE of a database error: node-postgres sets `code`, drizzle wraps that error in `cause`. */
export function sqlState(err: unknown): { code?: string, constraint?: string } {
  for (let e: unknown = err, i = 0; e instanceof Error && i < 4; e = e.cause, i++) {
    const { code, constraint } = e as Error & { code?: unknown, constraint?: unknown }
    if (typeof code === 'string' && /^[0-9A-Z]{5}$/.test(code)) return { code, constraint: typeof constraint === 'string' ? constraint : undefined }
  }
  return {}
}

/** SQLSTATE of a unique violation. */
export const UNIQUE_VIOLATION = '23505'

/**
 * Runs `write` (an insert or update, or a transaction holding one); when it breaks the unique
 * constraint `constraint` (SQLSTATE 23505) — another request took the same name a moment
 * earlier — throws a 409 with `message` and `data` instead. Every other error, and a unique
 * violation of another constraint (a bug, not a race), passes unchanged.
 */
export async function conflictOnUnique<T>(constraint: string, write: () => Promise<T>, message: string, data?: ErrorData): Promise<T> {
  try {
    return await write()
  } catch (err) {
    const state = sqlState(err)
    if (state.code === UNIQUE_VIOLATION && state.constraint === constraint) throw new DomainError(409, message, data)
    throw err
  }
}
