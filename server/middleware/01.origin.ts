const SAFE = new Set(['GET', 'HEAD', 'OPTIONS'])

// Cross-site request forgery guard: every mutating API request must come from one of our own
// origins — APP_ORIGIN, or a host of SHEAF_ALLOWED_HOSTS under APP_ORIGIN's scheme — compared
// by scheme, host and port. The request's own Host is never trusted for this (DNS rebinding).
export default defineEventHandler((event) => {
  if (SAFE.has(event.method) || !event.path.startsWith('/api/')) return
  // Authenticated by its Authorization header alone (cookies ignored): nothing to forge.
  if (hasAuthorization(event)) return
  const origin = getRequestHeader(event, 'origin') ?? refererOrigin(getRequestHeader(event, 'referer'))
  if (!origin) {
    throw createError({ statusCode: 403, statusMessage: 'Request refused: no Origin or Referer header on a state-changing request' })
  }
  if (!ourOrigins().has(normalOrigin(origin) ?? '')) {
    throw createError({ statusCode: 403, statusMessage: `Request refused: origin ${origin.slice(0, 200)} is not this site` })
  }
})

let origins: Set<string> | undefined
function ourOrigins() {
  if (!origins) {
    const { appOrigin, allowedHosts } = useSettings()
    const { protocol } = new URL(appOrigin)
    origins = new Set([appOrigin, ...allowedHosts.map(host => `${protocol}//${host}`)])
  }
  return origins
}

/** scheme://host[:port] as URL.origin spells it (default port dropped), or undefined. */
function normalOrigin(value: string) {
  try {
    const url = new URL(value)
    return url.protocol === 'http:' || url.protocol === 'https:' ? url.origin : undefined
  } catch {
    return undefined
  }
}

function refererOrigin(referer: string | undefined) {
  return referer ? normalOrigin(referer) : undefined
}
