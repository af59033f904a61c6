import { describe, expect, it } from 'vitest'
import { ApiClient } from '../support/http'
import { outboxKey, readOutbox, waitForMail, type OutboxEntry } from '../support/outbox'
import { startSecondApp } from '../support/second-app'
import { createUser, uniqueEmail } from '../support/users'

const mailTo = (messages: OutboxEntry[], email: string) => messages.filter(m => m.to.includes(email))

describe('outbox of the mail fake', () => {
  it('lists every message the app sent, with their links, to the operator with the key', async () => {
    const email = uniqueEmail('outbox')
    await new ApiClient().post('/api/auth/register', { email, name: 'Outbox Reader', password: 'parton-shower-3' })
    await waitForMail(email)
    const res = await readOutbox()
    expect(res.status).toBe(200)
    expect(res.body.everything).toBe(true)
    const [message] = mailTo(res.body.messages, email)
    expect(message!.subject).toBe('Confirm your e-mail address for Sheaf')
    expect(message!.links).toHaveLength(1)
    expect(new URL(message!.links[0]!).pathname).toBe('/verify')
  })

  it('does not hand another user\'s reset link to someone without the key', async () => {
    const victim = await createUser({ tag: 'victim', signIn: false })
    const since = new Date()
    const attacker = new ApiClient()
    expect((await attacker.post('/api/auth/reset-request', { email: victim.email })).status).toBe(200)
    const sent = await waitForMail(victim.email, /new Sheaf password/, since)

    const anonymous = await attacker.get('/api/outbox')
    expect(anonymous.status).toBe(401)
    expect(anonymous.body.statusMessage).toMatch(/key/)
    expect(anonymous.body.statusMessage).toMatch(/npm start/)
    expect(JSON.stringify(anonymous.body)).not.toContain(victim.email)

    const someoneElse = await createUser({ tag: 'attacker' })
    const signedIn = await someoneElse.client.get('/api/outbox')
    expect(signedIn.status).toBe(200)
    expect(signedIn.body.everything).toBe(false)
    expect(mailTo(signedIn.body.messages, victim.email)).toEqual([])
    expect(JSON.stringify(signedIn.body)).not.toContain('/reset')

    const operator = await readOutbox()
    const reset = mailTo(operator.body.messages, victim.email).find(m => m.id === sent.id)
    expect(reset!.links.some(l => new URL(l).pathname === '/reset')).toBe(true)
  })

  it('shows a signed-in user without the key only the mail addressed to them', async () => {
    const [me, other] = await Promise.all([createUser({ tag: 'own-mail' }), createUser({ tag: 'other-mail', signIn: false })])
    const since = new Date()
    await Promise.all([me, other].map(u => new ApiClient().post('/api/auth/reset-request', { email: u.email })))
    await Promise.all([me, other].map(u => waitForMail(u.email, /new Sheaf password/, since)))

    const res = await me.client.get('/api/outbox')
    expect(res.status).toBe(200)
    expect(res.body.messages.length).toBeGreaterThan(0)
    for (const m of res.body.messages as OutboxEntry[]) expect(m.to).toContain(me.email)
    expect(mailTo(res.body.messages, other.email)).toEqual([])
  })

  it('refuses a wrong or empty key with 401, signed in or not', async () => {
    const user = await createUser({ tag: 'wrong-key' })
    for (const client of [new ApiClient(), user.client]) {
      for (const key of [`${outboxKey()}x`, outboxKey().slice(0, -1), 'guess', '']) {
        const res = await readOutbox(client, key)
        expect(res.status, `key ${JSON.stringify(key)}`).toBe(401)
        expect(res.body.messages).toBeUndefined()
      }
    }
  })

  it('answers 404 when the fake is not in use (production), key or not', async () => {
    const app = await startSecondApp(90, { SHEAF_MAIL_FAKE: '0' })
    try {
      expect((await fetch(`${app.url}/api/outbox`)).status).toBe(404)
      expect((await fetch(`${app.url}/api/outbox`, { headers: { 'x-outbox-key': outboxKey() } })).status).toBe(404)
    } finally {
      await app.stop()
    }
  })
})
