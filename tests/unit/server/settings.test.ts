import { describe, expect, it } from 'vitest'
import { normalHost, readSettings } from '../../../server/domain/settings'

describe('the Host allow-list and the Outbox key in the settings', () => {
  it('starts with APP_ORIGIN\'s host and adds SHEAF_ALLOWED_HOSTS as URL.host spells them', () => {
    const s = readSettings({ APP_ORIGIN: 'http://127.0.0.1:3000', SHEAF_ALLOWED_HOSTS: ' localhost:3000, SHEAF.example:80 ,[::1]:3000,,127.0.0.1:3000' })
    expect(s.allowedHosts).toEqual(['127.0.0.1:3000', 'localhost:3000', 'sheaf.example', '[::1]:3000'])
    expect(readSettings({ APP_ORIGIN: 'https://sheaf.example.org' }).allowedHosts).toEqual(['sheaf.example.org'])
  })

  it('stops on an entry that is not a bare host', () => {
    for (const bad of ['http://a.example/path', 'user@a.example', 'a.example:notaport', 'a b']) {
      expect(() => readSettings({ SHEAF_ALLOWED_HOSTS: bad }), bad).toThrow(/SHEAF_ALLOWED_HOSTS/)
    }
  })

  it('spells a Host header the way the allow-list does, or refuses it', () => {
    expect(normalHost('LOCALHOST:3000', 'http:')).toBe('localhost:3000')
    expect(normalHost('sheaf.example:443', 'https:')).toBe('sheaf.example')
    expect(normalHost('127.0.0.1:3000.evil.example', 'http:')).toBeNull()
    expect(normalHost('127.0.0.1:3000@evil.example', 'http:')).toBeNull()
    expect(normalHost('evil.example/x', 'http:')).toBeNull()
  })

  it('takes the Outbox key from SHEAF_OUTBOX_KEY, none when empty', () => {
    expect(readSettings({ SHEAF_OUTBOX_KEY: ' k3y ' }).outboxKey).toBe('k3y')
    expect(readSettings({ SHEAF_OUTBOX_KEY: '' }).outboxKey).toBeNull()
    expect(readSettings({}).outboxKey).toBeNull()
  })
})
