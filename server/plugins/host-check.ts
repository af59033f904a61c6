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

function checkHost(event: H3Event) {
  if (!allowed) {
    const { appOrigin, allowedHosts } = useSettings()
    allowed = { hosts: new Set(allowedHosts), protocol: new URL(appOrigin).protocol, appOrigin }
  }
  const raw = event.node.req.headers.host
  if (!raw) throw createError({ statusCode: 400, statusMessage: 'A Host header is required' })
  const host = normalHost(raw, allowed.protocol)
  if (!host || !allowed.hosts.has(host)) {
    throw createError({
      statusCode: 421,
      statusMessage: `This server does not answer for the host ${raw.slice(0, 100)}; open ${allowed.appOrigin}`
    })
  }
}
