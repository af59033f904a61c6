import { DrizzleQueryError } from 'drizzle-orm/errors'
import pg from 'pg'
import { describe, expect, it } from 'vitest'
import { databaseFailure, isDatabaseFailure, logText } from '../../../server/domain/log-text'

const HASH = 'scrypt$32768$8$1$c2FsdA$a2V5'

function pgError(message: string, code: string, detail?: string) {
  const e = new pg.DatabaseError(message, 100, 'error')
  Object.assign(e, { code, severity: 'ERROR', detail })
  return e
}

const failedInsert = () => new DrizzleQueryError(
  'insert into "users" ("email", "name", "password_hash") values ($1, $2, $3)',
  ['ada@example.test', 'Ada', HASH],
  pgError('duplicate key value violates unique constraint "users_email_unique"', '23505', 'Key (email)=(ada@example.test) already exists.')
)

describe('logText', () => {
  it('reduces a failed query to PostgreSQL\'s message and SQLSTATE, without its parameters or detail', () => {
    const text = logText(failedInsert())
    expect(text).toBe('database error 23505: duplicate key value violates unique constraint "users_email_unique"')
    expect(text).not.toContain('ada@example.test')
    expect(text).not.toContain(HASH)
  })

  it('finds the database error however deeply it is wrapped', () => {
    const wrapped = new Error('the job failed', { cause: new Error('while saving', { cause: failedInsert() }) })
    expect(databaseFailure(wrapped)).toEqual({ message: 'duplicate key value violates unique constraint "users_email_unique"', code: '23505' })
    expect(isDatabaseFailure(wrapped)).toBe(true)
  })

  it('gives the cause of a query that never reached PostgreSQL, never the query\'s own message', () => {
    const refused = new DrizzleQueryError('select * from "sets" where "bytes" = $1', [Buffer.from('member 0 grid …')], new Error('connect ECONNREFUSED 127.0.0.1:54329'))
    expect(logText(refused)).toBe('database query failed: connect ECONNREFUSED 127.0.0.1:54329')
    expect(logText(new DrizzleQueryError('select $1', ['secret-token']))).toBe('database query failed: no reason given')
  })

  it('keeps the first line of any other error', () => {
    expect(logText(new Error('queue unavailable\n    at somewhere'))).toBe('queue unavailable')
    expect(logText('plain text')).toBe('plain text')
    expect(isDatabaseFailure(new RangeError('x must be in (0, 1)'))).toBe(false)
  })

  it('stops on a cause chain that loops', () => {
    const a = new Error('a')
    const b = new Error('b', { cause: a })
    Object.assign(a, { cause: b })
    expect(logText(a)).toBe('a')
  })
})
