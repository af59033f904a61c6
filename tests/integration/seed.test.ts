import { execFileSync } from 'node:child_process'
import { fileURLToPath } from 'node:url'
import { inArray } from 'drizzle-orm'
import { describe, expect, it } from 'vitest'
import { DEMO_USERS, DEMO_WORKSPACE } from '../../scripts/seed/01-demo-users'
import { tables, testDB } from '../support/db'
import { ApiClient } from '../support/http'

const root = fileURLToPath(new URL('../..', import.meta.url))
const seed = () => execFileSync(`${root}node_modules/.bin/tsx`, ['scripts/seed.ts'], { cwd: root, env: process.env, encoding: 'utf8' })

describe('seed', () => {
  it('is idempotent and gives the README demo users their roles', async () => {
    seed()
    seed()
    const emails = DEMO_USERS.map(u => u.email)
    const users = await testDB().select().from(tables.users).where(inArray(tables.users.email, emails))
    expect(users).toHaveLength(3)
    for (const u of DEMO_USERS) {
      const client = new ApiClient()
      await client.signIn(u.email, u.password)
      const me = await client.get('/api/auth/me')
      expect(me.body.memberships.filter((m: { name: string }) => m.name === DEMO_WORKSPACE))
        .toEqual([expect.objectContaining({ role: u.role })])
    }
  }, 60_000)
})
