import { spawn } from 'node:child_process'
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'
import { ApiClient } from '../support/http'
import { isHealthy } from '../support/stack'
import { uniqueEmail } from '../support/users'

const root = fileURLToPath(new URL('../..', import.meta.url))

describe('outbox of the mail fake', () => {
  it('lists the messages the app sent, with their links', async () => {
    const email = uniqueEmail('outbox')
    await new ApiClient().post('/api/auth/register', { email, name: 'Outbox Reader', password: 'parton-shower-3' })
    const deadline = Date.now() + 10_000
    let message: { subject: string, to: string[], links: string[] } | undefined
    while (!message && Date.now() < deadline) {
      const res = await new ApiClient().get('/api/outbox')
      expect(res.status).toBe(200)
      message = res.body.messages.find((m: { to: string[] }) => m.to.includes(email))
      if (!message) await new Promise(r => setTimeout(r, 100))
    }
    expect(message!.subject).toBe('Confirm your e-mail address for Sheaf')
    expect(message!.links).toHaveLength(1)
    expect(new URL(message!.links[0]!).pathname).toBe('/verify')
  })

  it('answers 404 when the fake is not in use (production)', async () => {
    const port = 3190
    const child = spawn(process.execPath, ['.output/server/index.mjs'], {
      cwd: root, stdio: 'ignore',
      env: { ...process.env, SHEAF_MAIL_FAKE: '0', HOST: '127.0.0.1', PORT: String(port), APP_ORIGIN: `http://127.0.0.1:${port}` }
    })
    try {
      const url = `http://127.0.0.1:${port}`
      const deadline = Date.now() + 30_000
      while (!(await isHealthy(url))) {
        if (Date.now() > deadline) throw new Error('second app instance did not start')
        await new Promise(r => setTimeout(r, 150))
      }
      const res = await fetch(`${url}/api/outbox`)
      expect(res.status).toBe(404)
    } finally {
      child.kill('SIGTERM')
    }
  })
})
