import { describe, expect, it } from 'vitest'
import { hashPassword, verifyPassword } from '../../../server/domain/accounts/password'

describe('scrypt password hashes', () => {
  it('verifies the right password and rejects a wrong one', async () => {
    const hash = await hashPassword('correct-horse-9')
    expect(hash).toMatch(/^scrypt\$32768\$8\$1\$[\w-]{22}\$[\w-]{43}$/)
    expect(await verifyPassword('correct-horse-9', hash)).toBe(true)
    expect(await verifyPassword('correct-horse-8', hash)).toBe(false)
  })

  it('salts every hash separately', async () => {
    const [a, b] = await Promise.all([hashPassword('same-password-1'), hashPassword('same-password-1')])
    expect(a).not.toBe(b)
    expect(a.split('$')[4]).not.toBe(b.split('$')[4])
  })

  it.each([
    ['empty', ''],
    ['other scheme', 'bcrypt$10$abc'],
    ['missing key', 'scrypt$32768$8$1$c2FsdA']
  ])('rejects a malformed stored hash (%s)', async (_, stored) => {
    expect(await verifyPassword('anything-1', stored)).toBe(false)
  })

  it('normalises Unicode so composed and decomposed input match', async () => {
    const hash = await hashPassword('caf\u00e9-latte-1')
    expect(await verifyPassword('cafe\u0301-latte-1', hash)).toBe(true)
  })
})
