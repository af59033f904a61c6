import { existsSync, readFileSync } from 'node:fs'
import { randomUUID } from 'node:crypto'
import { fileURLToPath } from 'node:url'
import { sql } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { testDB } from '../support/db'
import { ApiClient } from '../support/http'
import { uniqueEmail } from '../support/users'

// A failed query is logged with PostgreSQL's message and SQLSTATE only: never the statement's
// bound parameters (here a new user's e-mail, name and password hash). The failure is made by a
// trigger that refuses one marked name, so the sign-up's insert fails inside the server.
const appLog = fileURLToPath(new URL('../../.data/test-app.log', import.meta.url))
const marker = randomUUID().slice(0, 8)
const SQLSTATE = 'SH042'

describe('logs of a failed query', () => {
  beforeAll(async () => {
    await testDB().execute(sql.raw(`
      create or replace function refuse_log_probe() returns trigger language plpgsql as $$
      begin
        raise exception 'log probe refused the row' using errcode = '${SQLSTATE}';
      end $$;
      create trigger refuse_log_probe before insert on users
        for each row when (new.name like 'Log probe %') execute function refuse_log_probe();
    `))
  })
  afterAll(async () => {
    await testDB().execute(sql.raw('drop trigger if exists refuse_log_probe on users; drop function if exists refuse_log_probe()'))
  })

  it('names the SQLSTATE and leaves out the e-mail, name and password hash', async () => {
    expect(existsSync(appLog), 'the test stack writes .data/test-app.log').toBe(true)
    const email = uniqueEmail(`probe-${marker}`)
    const name = `Log probe ${marker}`
    const res = await new ApiClient().post('/api/auth/register', { email, name, password: `hadron-${marker}-77` })
    expect(res.status).toBe(500)
    expect(JSON.stringify(res.body)).not.toContain(marker)

    const deadline = Date.now() + 10_000
    let log = ''
    while (Date.now() < deadline) {
      log = readFileSync(appLog, 'utf8')
      if (log.includes(SQLSTATE)) break
      await new Promise(r => setTimeout(r, 100))
    }
    const line = log.split('\n').find(l => l.includes(SQLSTATE))
    expect(line).toMatch(/database error SH042: log probe refused the row/)
    expect(log).not.toContain(marker)
    expect(log).not.toContain('scrypt$')
    expect(log).not.toMatch(/Failed query|params:/)
  })
})
