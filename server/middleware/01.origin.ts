import { verifyRequestOrigin } from 'lucia'

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS'])

// Cross-site request forgery guard: every mutating API request must come from our own origin.
export default defineEventHandler((event) => {
  if (SAFE.has(event.method) || !event.path.startsWith('/api/')) return
  const origin = getRequestHeader(event, 'origin') ?? refererOrigin(getRequestHeader(event, 'referer'))
  const allowed = [new URL(useSettings().appOrigin).host, getRequestHost(event)]
  if (!origin) {
    throw createError({ statusCode: 403, statusMessage: 'Request refused: no Origin or Referer header on a state-changing request' })
  }
  if (!verifyRequestOrigin(origin, allowed)) {
    throw createError({ statusCode: 403, statusMessage: `Request refused: origin ${origin} is not this site` })
  }
})

function refererOrigin(referer: string | undefined) {
  if (!referer) return undefined
  try {
    return new URL(referer).origin
  } catch {
    return undefined
  }
}
