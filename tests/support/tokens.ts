import type { Role } from '../../shared/utils/roles'
import { ApiClient, type ApiResponse } from './http'
import type { TestUser } from './users'

/** A client that authenticates by `Authorization: Bearer <secret>` only: no cookies, no Origin. */
export class TokenClient extends ApiClient {
  constructor(readonly secret: string) { super(undefined, null) }

  override request<T = any>(method: string, path: string, body?: unknown, headers: Record<string, string> = {}): Promise<ApiResponse<T>> {
    return super.request<T>(method, path, body, { authorization: `Bearer ${this.secret}`, ...headers })
  }
}

/** Create an API token through the account route as `user`; answers the secret and the listed token. */
export async function createToken(user: TestUser, workspaceId: string, role: Role, o: { name?: string, expiresInDays?: number } = {}) {
  const res = await user.client.post('/api/auth/tokens', { name: o.name ?? `${role} token`, workspaceId, role, expiresInDays: o.expiresInDays ?? 30 })
  if (res.status !== 201) throw new Error(`token creation answered ${res.status}: ${JSON.stringify(res.body)}`)
  return { secret: res.body.secret as string, token: res.body.token, client: new TokenClient(res.body.secret) }
}
