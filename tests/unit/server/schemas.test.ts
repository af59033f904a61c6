import { describe, expect, it } from 'vitest'
import { fieldErrors, inviteSchema, passwordSchema, registerSchema } from '../../../shared/utils/account-schemas'
import { roleAtLeast, ROLES } from '../../../shared/utils/roles'

describe('password strength', () => {
  it.each([
    ['short1!', 'Use at least 10 characters'],
    ['onlyletterslong', 'Include at least one digit or symbol'],
    ['1234567890', 'Include at least one letter']
  ])('rejects %s', (password, message) => {
    const r = passwordSchema.safeParse(password)
    expect(r.success).toBe(false)
    expect(fieldErrors(r.error!)._).toBe(message)
  })

  it('accepts letters with a digit or symbol', () => {
    expect(passwordSchema.safeParse('correct-horse').success).toBe(true)
    expect(passwordSchema.safeParse('Quark gluon 7').success).toBe(true)
  })

  it('refuses a password containing the e-mail name and normalises the address', () => {
    const bad = registerSchema.safeParse({ email: 'Maria@X.test', name: 'M', password: 'xx-maria-2024' })
    expect(bad.success).toBe(false)
    expect(fieldErrors(bad.error!).password).toMatch(/e-mail name/)
    const ok = registerSchema.parse({ email: '  Maria@X.test ', name: ' Maria ', password: 'gluon-fusion-1' })
    expect(ok).toEqual({ email: 'maria@x.test', name: 'Maria', password: 'gluon-fusion-1' })
  })

  it('names each bad field once', () => {
    const r = inviteSchema.safeParse({ email: 'nope', role: 'admin' })
    expect(fieldErrors(r.error!)).toEqual({ email: 'Enter a valid e-mail address', role: 'Choose viewer, analyst or owner' })
  })
})

describe('role order', () => {
  it.each([
    ['viewer', 'viewer', true], ['viewer', 'analyst', false], ['analyst', 'viewer', true],
    ['analyst', 'owner', false], ['owner', 'analyst', true], ['owner', 'owner', true]
  ] as const)('%s at least %s: %s', (role, min, expected) => {
    expect(roleAtLeast(role, min)).toBe(expected)
  })

  it('is viewer < analyst < owner', () => {
    expect(ROLES).toEqual(['viewer', 'analyst', 'owner'])
  })
})
