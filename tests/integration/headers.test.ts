import { createHash } from 'node:crypto'
import { describe, expect, it } from 'vitest'
import { testEnv } from '../support/env'
import { rawRequest } from '../support/raw-http'
import { createUser } from '../support/users'

const app = new URL(testEnv().appUrl)

/** The directives of a Content-Security-Policy header by name. */
function directives(csp: string | null | undefined) {
  return new Map((csp ?? '').split(';').map(d => d.trim().split(/\s+/)).filter(d => d[0]).map(([name, ...values]) => [name!, values]))
}

/** 'sha256-…' of each inline script of a page that is not a JSON data block. */
function inlineScripts(html: string) {
  return [...html.matchAll(/<script\b([^>]*)>([\s\S]*?)<\/script>/gi)]
    .filter(([, attrs]) => !/\bsrc=/.test(attrs!) && !/application\/json/.test(attrs!))
    .map(([, , body]) => `'sha256-${createHash('sha256').update(body!).digest('base64')}'`)
}

function expectCommonHeaders(headers: Headers, what: string) {
  expect(headers.get('x-content-type-options'), what).toBe('nosniff')
  expect(headers.get('referrer-policy'), what).toMatch(/^(same-origin|no-referrer|strict-origin)$/)
  expect(headers.has('x-powered-by'), what).toBe(false)
  expect(directives(headers.get('content-security-policy')).get('frame-ancestors'), what).toEqual(["'none'"])
}

describe('security headers', () => {
  it('give a rendered page a policy that allows exactly its own inline scripts', async () => {
    const res = await fetch(`${app.origin}/signin`, { headers: { accept: 'text/html' } })
    expect(res.status).toBe(200)
    expectCommonHeaders(res.headers, 'page')
    const csp = directives(res.headers.get('content-security-policy'))
    const scriptSrc = csp.get('script-src')!
    expect(scriptSrc).toContain("'self'")
    expect(scriptSrc).not.toContain("'unsafe-inline'")
    expect(scriptSrc).not.toContain("'unsafe-eval'")
    expect(csp.get('object-src')).toEqual(["'none'"])
    expect(csp.get('base-uri')).toEqual(["'none'"])
    const html = await res.text()
    const inline = inlineScripts(html)
    expect(inline.length).toBeGreaterThan(0) // Nuxt writes its runtime config inline
    for (const hash of inline) expect(scriptSrc).toContain(hash)
    expect(scriptSrc.filter(s => s.startsWith("'sha256-"))).toHaveLength(inline.length)
  })

  it('come with API answers, errors, error pages and the bundle', async () => {
    const page = await (await fetch(`${app.origin}/signin`)).text()
    const asset = page.match(/<script[^>]+src="(\/_nuxt\/[^"]+\.js)"/)?.[1]
    expect(asset).toBeTruthy()
    const checks: Array<[string, RequestInit?]> = [
      ['/api/health'],
      ['/api/no-such-route'],
      ['/api/auth/me'],
      ['/no-such-page', { headers: { accept: 'text/html' } }],
      [asset!]
    ]
    for (const [path, init] of checks) {
      const res = await fetch(`${app.origin}${path}`, init)
      expectCommonHeaders(res.headers, path)
    }
    const foreign = await rawRequest(`${app.origin}${asset}`, { headers: { host: `evil.example:${app.port}` } })
    expect(foreign.status).toBe(421)
  })
})

describe('the status line', () => {
  it('stays short when a message quotes 100 KB of user text, which the JSON body still carries', async () => {
    const owner = await createUser({ tag: 'long-message' })
    const ws = await owner.client.post('/api/workspaces', { name: 'Long messages' })
    expect(ws.status).toBe(201)
    const kernel = `k${'q'.repeat(100_000)}`
    const path = `/api/workspaces/${ws.body.id}/studies/validate`
    const res = await owner.client.post(path, { spec: { kernel, bins: [{ x: 0.01, q2: 10 }] } })
    expect(res.status).toBe(400)
    expect(res.body.statusMessage).toContain(kernel)

    const raw = await rawRequest(`${app.origin}${path}`, {
      method: 'POST',
      headers: { 'host': app.host, 'origin': app.origin, 'content-type': 'application/json', 'cookie': [...owner.client.cookies].map(([k, v]) => `${k}=${v}`).join('; ') },
      body: JSON.stringify({ spec: { kernel, bins: [{ x: 0.01, q2: 10 }] } })
    })
    expect(raw.status).toBe(400)
    expect(raw.statusText).toBe('Bad Request')
    expect(JSON.parse(raw.body).statusMessage).toContain(kernel)
  })

  it('keeps a short message as the reason phrase', async () => {
    const res = await rawRequest(`${app.origin}/api/auth/me`, { headers: { host: app.host } })
    expect(res.status).toBe(401)
    expect(res.statusText).toBe('Sign in to continue')
  })
})
