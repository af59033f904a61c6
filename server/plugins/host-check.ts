import type { H3Event } from 'h3'
import { normalHost } from '../domain/settings'

// The Host allow-list: the server answers only for APP_ORIGIN's host and SHEAF_ALLOWED_HOSTS
// (host with port). A page on another domain that resolves to this machine (DNS rebinding)
// sends its own name as Host and gets 421, so it can read nothing. Put first on the app's stack
// rather than in server/middleware, so that the public assets, served before any middleware,
// are checked too.
export default defineNitroPlugin((nitroApp) => {
  nitroApp.h3App.stack.unshift({ route: '/', handler: defineEventHandler(checkHost) })
})

let allowed: { hosts: Set<string>, protocol: string, appOrigin: string } | undefined

/**
 * Answers a refused request itself (421, or 400 without Host) instead of throwing: the error
 * handlers build the request's URL from its Host, which must not be trusted any further.
 */
function checkHost(event: H3Event) {
  if (!allowed) {
    const { appOrigin, allowedHosts } = useSettings()
    allowed = { hosts: new Set(allowedHosts), protocol: new URL(appOrigin).protocol, appOrigin }
  }
  const raw = event.node.req.headers.host
  const host = raw ? normalHost(raw, allowed.protocol) : null
  if (host && allowed.hosts.has(host)) return
  const [statusCode, statusMessage] = raw
    ? [421, `This server does not answer for the host ${raw.slice(0, 100)}; open ${allowed.appOrigin}`]
    : [400, 'A Host header is required']
  setResponseStatus(event, statusCode, statusMessage)
  return { error: true, statusCode, statusMessage, message: statusMessage }
}
