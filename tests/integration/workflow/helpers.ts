// Helpers of the workflow integration tests: TOY set files written by the engine, multipart
// uploads with a signed-in client, and waiting for a queued result.
import type { ApiClient, ApiResponse } from '../../support/http'
import { toyErrorSet, toyQ2Nodes, toyXNodes } from '../../../shared/physics/sets/toy'
import { writeSetFile } from '../../../shared/physics/sets/write'
import type { SetKind } from '../../../shared/physics/types'
import type { SetDensity } from '../../../shared/physics/fragmentation/species'

export const TOY_SCHEME = { type: 'variable', nf: 5, massesGeV: { charm: 1.5, bottom: 4.75, top: 173 } } as const

/** A TOY error set (engine-generated, not a fit) as set-file bytes. */
export function toySetBytes(o: { kind?: SetKind, errorMembers?: number, name?: string, nx?: number, nq?: number, q2MaxGeV2?: number, density?: SetDensity } = {}) {
  const set = toyErrorSet({
    kind: o.kind ?? 'hessian-pairs',
    errorMembers: o.errorMembers ?? 4,
    name: o.name,
    density: o.density,
    x: toyXNodes(o.nx ?? 40, 1e-5, 0.95),
    q2: toyQ2Nodes({ q2MinGeV2: 2, q2MaxGeV2: o.q2MaxGeV2 ?? 1e5, count: o.nq ?? 16, thresholdsGeV2: [1.5 ** 2, 4.75 ** 2] }),
    scheme: { ...TOY_SCHEME, massesGeV: { ...TOY_SCHEME.massesGeV } }
  })
  return { set, bytes: writeSetFile(set) }
}

/** A multipart POST with the client's cookies, Origin and address (ApiClient sends only JSON). */
export async function postForm<T = any>(client: ApiClient, path: string, fields: Record<string, string | { bytes: Uint8Array, name: string }>): Promise<ApiResponse<T>> {
  const form = new FormData()
  for (const [k, v] of Object.entries(fields)) {
    if (typeof v === 'string') form.append(k, v)
    else form.append(k, new Blob([v.bytes as BlobPart]), v.name)
  }
  const headers: Record<string, string> = { 'x-forwarded-for': client.address }
  if (client.origin) headers.origin = client.origin
  if (client.cookies.size) headers.cookie = [...client.cookies].map(([k, v]) => `${k}=${v}`).join('; ')
  const res = await fetch(client.baseUrl + path, { method: 'POST', headers, body: form })
  const text = await res.text()
  let body: unknown = text
  try {
    body = text ? JSON.parse(text) : null
  } catch { /* keep text */ }
  return { status: res.status, body: body as T, headers: res.headers }
}

/** Uploads a set file; throws unless 201. */
export async function uploadSet(client: ApiClient, workspaceId: string, bytes: Uint8Array, name?: string) {
  const res = await postForm(client, `/api/workspaces/${workspaceId}/sets`, { file: { bytes, name: 'toy.sheafset' }, ...(name ? { name } : {}) })
  if (res.status !== 201) throw new Error(`set upload answered ${res.status}: ${JSON.stringify(res.body)}`)
  return res.body as { id: string, name: string, memberCount: number, kind: SetKind }
}

/** DIS neutral-current F₂ on a proton in `bins` (x, Q²) points inside the TOY grid. */
export function f2Spec(bins = 5) {
  return {
    kernel: 'dis-nc-f2',
    bins: Array.from({ length: bins }, (_, i) => ({ x: 0.001 * 3 ** i, q2: 10 + 10 * i }))
  }
}

/** Polls a result until its state is one of `states` (default: it ended), up to `ms`. */
export async function waitForResult(client: ApiClient, workspaceId: string, resultId: string, states = ['done', 'failed', 'cancelled'], ms = 30_000) {
  const deadline = Date.now() + ms
  for (;;) {
    const res = await client.get(`/api/workspaces/${workspaceId}/results/${resultId}/progress`)
    if (res.status !== 200) throw new Error(`progress answered ${res.status}: ${JSON.stringify(res.body)}`)
    if (states.includes(res.body.state)) return res.body as { state: string, error: string | null, progress: { done: number, total: number, percent: number } }
    if (Date.now() > deadline) throw new Error(`result ${resultId} still ${res.body.state} after ${ms} ms`)
    await new Promise(r => setTimeout(r, 100))
  }
}
