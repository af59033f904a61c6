import type { Role } from '../../shared/utils/roles'
import { ROLES } from '../../shared/utils/roles'
import { ApiClient } from './http'
import type { TestWorkspace } from './users'

/**
 * One workspace route for the role matrix. Later features append their routes to a list of
 * these and call `expectRoleMatrix`.
 */
export interface WorkspaceRoute {
  method: 'GET' | 'POST' | 'PATCH' | 'DELETE'
  /** Path with the workspace id filled in; ids of other rows come from `ws`. */
  path: (ws: TestWorkspace) => string
  body?: (ws: TestWorkspace) => unknown
  minRole: Role
  /** False for routes whose allowed call destroys what the matrix needs (checked elsewhere). */
  tryAllowed?: boolean
}

export const rolesBelow = (min: Role) => ROLES.slice(0, ROLES.indexOf(min))

/** Anonymous 401, outsider 404, each weaker role 403, the minimal role 2xx. Returns the failures. */
export async function roleMatrixFailures(ws: TestWorkspace, routes: WorkspaceRoute[]): Promise<string[]> {
  const failures: string[] = []
  for (const r of routes) {
    const path = r.path(ws)
    const body = r.body?.(ws)
    const call = (c: ApiClient) => c.request(r.method, path, r.method === 'GET' || r.method === 'DELETE' ? undefined : body ?? {})
    const expect = async (who: string, c: ApiClient, ok: (s: number) => boolean, want: string) => {
      const res = await call(c)
      if (!ok(res.status)) failures.push(`${r.method} ${path} as ${who}: ${res.status}, expected ${want}`)
    }
    await expect('anonymous', new ApiClient(), s => s === 401, '401')
    await expect('outsider', ws.outsider.client, s => s === 404, '404')
    for (const weak of rolesBelow(r.minRole)) await expect(weak, ws.byRole[weak].client, s => s === 403, '403')
    if (r.tryAllowed !== false) await expect(r.minRole, ws.byRole[r.minRole].client, s => s >= 200 && s < 300, '2xx')
  }
  return failures
}
