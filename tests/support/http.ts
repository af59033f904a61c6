import { randomInt } from 'node:crypto'
import { testEnv } from './env'

export interface ApiResponse<T = any> { status: number, body: T, headers: Headers }

/**
 * A fetch client for the test app with a cookie jar, the Origin header of the app on every
 * request, and its own fake client address (X-Forwarded-For; the test app trusts it) so the
 * per-address sign-in throttle of one test does not leak into another.
 */
export class ApiClient {
  readonly cookies = new Map<string, string>()
  readonly address = `10.${randomInt(256)}.${randomInt(256)}.${randomInt(1, 255)}`
  constructor(readonly baseUrl = testEnv().appUrl, readonly origin: string | null = testEnv().appUrl) {}

  async request<T = any>(method: string, path: string, body?: unknown, headers: Record<string, string> = {}): Promise<ApiResponse<T>> {
    const h: Record<string, string> = { 'x-forwarded-for': this.address }
    if (this.origin) h.origin = this.origin
    if (this.cookies.size) h.cookie = [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ')
    if (body !== undefined) h['content-type'] = 'application/json'
    Object.assign(h, headers)
    const res = await fetch(this.baseUrl + path, {
      method, headers: h, body: body === undefined ? undefined : JSON.stringify(body), redirect: 'manual'
    })
    for (const line of res.headers.getSetCookie()) {
      const [pair] = line.split(';')
      const eq = pair!.indexOf('=')
      const [name, value] = [pair!.slice(0, eq).trim(), pair!.slice(eq + 1).trim()]
      if (value) this.cookies.set(name, value)
      else this.cookies.delete(name)
    }
    const text = await res.text()
    let parsed: unknown = text
    try {
      parsed = text ? JSON.parse(text) : null
    } catch { /* not JSON: keep the text */ }
    return { status: res.status, body: parsed as T, headers: res.headers }
  }

  get<T = any>(path: string) { return this.request<T>('GET', path) }
  post<T = any>(path: string, body?: unknown) { return this.request<T>('POST', path, body ?? {}) }
  patch<T = any>(path: string, body?: unknown) { return this.request<T>('PATCH', path, body ?? {}) }
  delete<T = any>(path: string) { return this.request<T>('DELETE', path) }

  /** Sign in and keep the session cookie; throws unless the server answers 200. */
  async signIn(email: string, password: string) {
    const res = await this.post('/api/auth/signin', { email, password })
    if (res.status !== 200) throw new Error(`sign-in of ${email} answered ${res.status}: ${JSON.stringify(res.body)}`)
    return res
  }
}
