import { createHash } from 'node:crypto'

// Security headers on every response. Every answer gets nosniff, a same-origin Referrer-Policy,
// no framing and a Content-Security-Policy that allows nothing; a page rendered by Nuxt then gets
// the page policy: scripts only from this origin plus, by their SHA-256, the inline scripts Nuxt
// itself wrote into the head and the end of the body (its runtime config; the JSON payload is
// data and needs no hash). What the page's own body contains is never hashed. Styles stay
// 'unsafe-inline': Vue's style bindings, Plotly and Handsontable set inline styles.

const BASE_HEADERS = {
  'x-content-type-options': 'nosniff',
  'referrer-policy': 'same-origin',
  'x-frame-options': 'DENY',
  'content-security-policy': "default-src 'none'; frame-ancestors 'none'; base-uri 'none'; form-action 'none'"
}

/** The policy of a rendered page whose inline scripts have these hashes ('sha256-…'). */
export function pagePolicy(scriptHashes: string[]): string {
  return [
    "default-src 'self'",
    `script-src 'self'${scriptHashes.map(h => ` '${h}'`).join('')}`,
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self' data:",
    "connect-src 'self'",
    "object-src 'none'",
    "base-uri 'none'",
    "form-action 'self'",
    "frame-ancestors 'none'"
  ].join('; ')
}

const SCRIPT = /<script\b([^>]*)>([\s\S]*?)<\/script\s*>/gi
const DATA_TYPE = /\btype\s*=\s*["']?application\/(?:ld\+)?json\b/i

/** 'sha256-…' of every inline script (not a src, not a JSON data block) in these HTML chunks. */
export function inlineScriptHashes(chunks: string[]): string[] {
  const hashes = new Set<string>()
  for (const chunk of chunks) {
    for (const [, attrs = '', body = ''] of chunk.matchAll(SCRIPT)) {
      if (/\bsrc\s*=/i.test(attrs) || DATA_TYPE.test(attrs)) continue
      hashes.add(`sha256-${createHash('sha256').update(body, 'utf8').digest('base64')}`)
    }
  }
  return [...hashes]
}

export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('request', (event) => {
    setResponseHeaders(event, BASE_HEADERS)
  })
  nitroApp.hooks.hook('render:html', (html, { event }) => {
    const hashes = inlineScriptHashes([...html.head, ...html.bodyPrepend, ...html.bodyAppend])
    setResponseHeader(event, 'content-security-policy', pagePolicy(hashes))
  })
})
