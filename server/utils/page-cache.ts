// The study page's server render, kept per viewer and per version of what it shows. A render
// depends on who asks (the user, their workspaces and roles, the chosen workspace), the address
// (study id and query) and the data read (studyPageVersion: the study, its versions, measurements
// and the workspace's sets). Every request still validates the session and reads the memberships
// and the version (three small queries); only a request whose key matches a stored render gets
// that render instead of a new one. Keyed by the user and their roles, so no user ever receives
// another's page. At most SHEAF_PAGE_CACHE_BYTES (default 32 MiB), an entry lives 10 minutes.
import { createHash } from 'node:crypto'
import type { H3Event } from 'h3'
import { LRUCache } from 'lru-cache'
import { membershipsOf } from '../domain/accounts/members'
import { studyPageVersion } from '../domain/studies/page-version'

interface StoredPage { body: string, headers: Record<string, string> }

const pages = new LRUCache<string, StoredPage>({
  maxSize: Number(process.env.SHEAF_PAGE_CACHE_BYTES ?? 32 * 1024 * 1024),
  sizeCalculation: p => p.body.length + 256,
  ttl: 10 * 60_000
})

/** The response headers a stored page is sent with (the rest come from the request hooks). */
const KEPT_HEADERS = ['content-type', 'content-security-policy']

const STUDY_PAGE = /^\/studies\/([0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12})(?:\?.*)?$/i

interface PageKey { key: string, workspaceId: string, studyId: string, version: string }

/**
 * The cache key of a GET of a study page by a signed-in member, or null (not a study page, no
 * valid session, no workspace, a study of no workspace of theirs: rendered as usual, not kept).
 */
async function studyPageKey(event: H3Event): Promise<PageKey | null> {
  if (event.method !== 'GET' || hasAuthorization(event)) return null
  const studyId = STUDY_PAGE.exec(event.path)?.[1]?.toLowerCase()
  if (!studyId) return null
  const lucia = useLucia()
  const sessionId = getCookie(event, lucia.sessionCookieName)
  if (!sessionId) return null
  const { session, user } = await lucia.validateSession(sessionId)
  if (!session) return null
  const db = useDB()
  const memberships = await membershipsOf(db, user.id)
  // The workspace the page shows, chosen as the session store chooses it (cookie, else the first).
  const wanted = getCookie(event, 'sheaf_workspace')
  const workspaceId = (memberships.find(m => m.workspaceId === wanted) ?? memberships[0])?.workspaceId
  if (!workspaceId) return null
  const version = await studyPageVersion(db, workspaceId, studyId)
  if (version === null) return null
  const key = createHash('sha256')
    .update(JSON.stringify([event.path, user.id, user.email, user.name, user.emailVerified, memberships, workspaceId, version]))
    .digest('base64url')
  return { key, workspaceId, studyId, version }
}

/**
 * Request side (server/middleware/03.page-cache.ts): the stored render for this request's key,
 * sent with its headers, or undefined (the renderer runs and keepStudyPage stores its answer).
 */
export async function cachedStudyPage(event: H3Event): Promise<string | undefined> {
  const page = await studyPageKey(event)
  if (!page) return undefined
  const hit = pages.get(page.key)
  if (hit) {
    setResponseHeaders(event, hit.headers)
    return hit.body
  }
  event.context.studyPage = page
  return undefined
}

/**
 * Render side (server/plugins/page-cache.ts, on render:response): keeps a 200 answer of a study
 * page under the key found before the render, when nothing it reads changed during the render
 * (the version read again) and it sets no cookie.
 */
export async function keepStudyPage(event: H3Event, response: { body?: unknown, statusCode?: number }) {
  const page = event.context.studyPage as PageKey | undefined
  if (!page || typeof response.body !== 'string' || (response.statusCode ?? 200) !== 200) return
  if (getResponseStatus(event) !== 200 || event.node.res.getHeader('set-cookie')) return
  if (await studyPageVersion(useDB(), page.workspaceId, page.studyId) !== page.version) return
  const headers: Record<string, string> = {}
  for (const name of KEPT_HEADERS) {
    const value = event.node.res.getHeader(name) ?? (response as { headers?: Record<string, string> }).headers?.[name]
    if (typeof value === 'string') headers[name] = value
  }
  pages.set(page.key, { body: response.body, headers })
}
