import { randomUUID } from 'node:crypto'
import { hashPassword } from '../../server/domain/accounts/password'
import type { Role } from '../../shared/utils/roles'
import { tables, testDB } from './db'
import { ApiClient } from './http'

export const TEST_PASSWORD = 'test-password-42'

/** A fresh address per call: tests never share accounts. */
export const uniqueEmail = (tag = 'user') => `${tag}-${randomUUID().slice(0, 8)}@tests.sheaf.test`

export interface TestUser { id: string, email: string, name: string, password: string, client: ApiClient }

/** A verified user written straight into the database, with a signed-in client. */
export async function createUser(o: { tag?: string, verified?: boolean, signIn?: boolean } = {}): Promise<TestUser> {
  const email = uniqueEmail(o.tag)
  const name = `Test ${o.tag ?? 'user'}`
  const [row] = await testDB().insert(tables.users).values({
    email, name, passwordHash: await hashPassword(TEST_PASSWORD), emailVerifiedAt: o.verified === false ? null : new Date()
  }).returning()
  const client = new ApiClient()
  if (o.signIn !== false && o.verified !== false) await client.signIn(email, TEST_PASSWORD)
  return { id: row!.id, email, name, password: TEST_PASSWORD, client }
}

export interface TestWorkspace {
  id: string
  owner: TestUser
  analyst: TestUser
  viewer: TestUser
  /** Signed in, but not a member. */
  outsider: TestUser
  byRole: Record<Role, TestUser>
}

/** A workspace created through the API by its owner, with an analyst and a viewer added. */
export async function createWorkspace(name = 'Test collaboration'): Promise<TestWorkspace> {
  const [owner, analyst, viewer, outsider] = await Promise.all(['owner', 'analyst', 'viewer', 'outsider'].map(tag => createUser({ tag })))
  const res = await owner!.client.post('/api/workspaces', { name })
  if (res.status !== 201) throw new Error(`workspace creation answered ${res.status}`)
  const id = res.body.id as string
  await testDB().insert(tables.memberships).values([
    { workspaceId: id, userId: analyst!.id, role: 'analyst' },
    { workspaceId: id, userId: viewer!.id, role: 'viewer' }
  ])
  return { id, owner: owner!, analyst: analyst!, viewer: viewer!, outsider: outsider!, byRole: { owner: owner!, analyst: analyst!, viewer: viewer! } }
}
