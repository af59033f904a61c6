// Reading JSON request bodies with limits enforced before parsing: the declared Content-Length
// is checked first, then the bytes are counted and the nesting measured while they arrive; past
// a limit the server stops reading at once and answers (the connection is cut shortly after), so
// no more than the limit is ever held in memory and nothing over-deep reaches JSON.parse or zod.
import { createError, readRawBody, type H3Event } from 'h3'

const MiB = 1024 * 1024

/**
 * Byte limits of JSON bodies. 1 MiB by default. A study (create, save, validate) may carry the
 * spec's maximum of 100 000 bins (shared/physics/study/spec.ts): with four full-precision range
 * columns and a label of about 25 characters per bin that is 14.4 MiB, so 16 MiB.
 */
export const JSON_BODY_LIMITS = { default: 1 * MiB, study: 16 * MiB } as const

/** Deepest nesting of arrays and objects a JSON body may have (our documents need under 10). */
export const JSON_MAX_DEPTH = 64

export interface JsonBodyLimits {
  /** Most bytes the body may have (default 1 MiB). */
  maxBytes?: number
  /** Deepest nesting of arrays and objects (default 64). */
  maxDepth?: number
}

/** A byte count for people: "1 MiB", "16 MiB", "512 KiB", "1.50 MiB". */
export function sizeText(bytes: number): string {
  if (bytes >= MiB) return bytes % MiB === 0 ? `${bytes / MiB} MiB` : `${(bytes / MiB).toFixed(2)} MiB`
  return bytes % 1024 === 0 ? `${bytes / 1024} KiB` : `${bytes} bytes`
}

/**
 * Measures the nesting depth of JSON text fed in byte chunks: counts `[` and `{` against `]`
 * and `}` outside strings (quotes and backslash escapes tracked across chunk boundaries; UTF-8
 * continuation bytes are all ≥ 0x80, so they never look like these characters). It does not
 * check the syntax; JSON.parse does that afterwards.
 */
export class JsonDepthMeter {
  /** Deepest nesting seen so far. */
  deepest = 0
  private depth = 0
  private inString = false
  private escaped = false

  /** Feed the next chunk; answers the deepest nesting so far. */
  feed(chunk: Uint8Array): number {
    let { depth, deepest, inString, escaped } = this
    for (let i = 0; i < chunk.length; i++) {
      const c = chunk[i]!
      if (inString) {
        if (escaped) escaped = false
        else if (c === 0x5C) escaped = true // \
        else if (c === 0x22) inString = false // "
      } else if (c === 0x22) {
        inString = true
      } else if (c === 0x5B || c === 0x7B) { // [ {
        if (++depth > deepest) deepest = depth
      } else if (c === 0x5D || c === 0x7D) { // ] }
        depth--
      }
    }
    Object.assign(this, { depth, deepest, inString, escaped })
    return deepest
  }
}

const tooLarge = (maxBytes: number) => createError({
  statusCode: 413,
  statusMessage: `The request body is larger than the limit of ${sizeText(maxBytes)}`,
  data: { maxBytes }
})

const tooDeep = (maxDepth: number) => createError({
  statusCode: 400,
  statusMessage: `The JSON body is nested deeper than ${maxDepth} levels of arrays and objects`,
  data: { maxDepth }
})

/** How long a refused client has to read the answer before its connection is cut. */
const ANSWER_GRACE_MS = 2000

/**
 * Read no more of this request's body. Its answer goes out on the open connection; then the
 * rest of the body is discarded as it arrives, and the connection is cut ANSWER_GRACE_MS later
 * unless the body has meanwhile arrived in full (then it stays usable for the next request). Cutting it at
 * once (Connection: close) would reset it while the client is still sending, and the client
 * could lose the answer.
 */
function stopReading(event: H3Event) {
  const { req, res } = event.node
  req.pause()
  res.once('finish', () => {
    // Discard what is still arriving (nothing is kept), so a keep-alive connection is left clean
    // for the client's next request; cut it only if the rest does not come in time.
    req.resume()
    setTimeout(() => {
      if (!req.complete) req.socket?.destroy()
    }, ANSWER_GRACE_MS).unref()
  })
}

/** A body some layer has already taken off the connection (Nitro's internal fetch). */
function alreadyRead(event: H3Event): boolean {
  const req = event.node.req as unknown as Record<string, unknown>
  return Boolean(event._requestBody || event.web?.request || req.rawBody !== undefined || req.body !== undefined)
}

function hasBody(event: H3Event): boolean {
  const { headers } = event.node.req
  return Number(headers['content-length']) > 0 || /\bchunked\b/i.test(String(headers['transfer-encoding'] ?? ''))
}

/** The raw body, at most `maxBytes`, refused as soon as it passes a limit. */
function readLimited(event: H3Event, maxBytes: number, maxDepth: number): Promise<Buffer> {
  const req = event.node.req
  return new Promise<Buffer>((resolve, reject) => {
    const chunks: Buffer[] = []
    const meter = new JsonDepthMeter()
    let size = 0
    const detach = () => {
      req.off('data', onData)
      req.off('end', onEnd)
      req.off('error', onError)
    }
    const stop = (err: Error) => {
      detach()
      stopReading(event)
      reject(err)
    }
    function onData(chunk: Buffer) {
      size += chunk.length
      if (size > maxBytes) return stop(tooLarge(maxBytes))
      if (meter.feed(chunk) > maxDepth) return stop(tooDeep(maxDepth))
      chunks.push(chunk)
    }
    function onEnd() {
      detach()
      resolve(Buffer.concat(chunks, size))
    }
    function onError() {
      detach()
      reject(createError({ statusCode: 400, statusMessage: 'The request body could not be read to the end' }))
    }
    req.on('data', onData).on('end', onEnd).on('error', onError)
  })
}

// JSON.parse keeps "__proto__" as an own key, which is harmless until some code copies it with
// assignment; drop it (and a "constructor" holding a prototype) the way h3's parser did. The
// reviver costs time, so it runs only when the text could hold such a key.
const RISKY = /__proto__|constructor|\\u/
const safeReviver = (key: string, value: unknown) =>
  key === '__proto__' || (key === 'constructor' && value && typeof value === 'object' && 'prototype' in value) ? undefined : value

/** The parser's complaint, with line and column when it gives a position (V8 does for most). */
function syntaxIssue(text: string, err: Error) {
  const message = err.message.slice(0, 300)
  const at = /at position (\d+)/.exec(err.message)
  if (!at) return { message }
  const position = Number(at[1])
  const before = text.slice(0, position)
  const line = before.split('\n').length
  return { line, column: position - before.lastIndexOf('\n'), message }
}

/**
 * The JSON request body parsed, or undefined when there is none. 413 when it is larger than
 * `maxBytes` (from the Content-Length at once, else as soon as the bytes pass it), 400 when it
 * nests deeper than `maxDepth` or is not JSON.
 */
export async function readJsonBody(event: H3Event, limits: JsonBodyLimits = {}): Promise<unknown> {
  const maxBytes = limits.maxBytes ?? JSON_BODY_LIMITS.default
  const maxDepth = limits.maxDepth ?? JSON_MAX_DEPTH
  let bytes: Buffer
  if (alreadyRead(event)) {
    bytes = (await readRawBody(event, false)) ?? Buffer.alloc(0)
    if (bytes.length > maxBytes) throw tooLarge(maxBytes)
    if (new JsonDepthMeter().feed(bytes) > maxDepth) throw tooDeep(maxDepth)
  } else {
    if (!hasBody(event)) return undefined
    if (Number(event.node.req.headers['content-length']) > maxBytes) {
      stopReading(event)
      throw tooLarge(maxBytes)
    }
    bytes = await readLimited(event, maxBytes, maxDepth)
  }
  const text = bytes.toString('utf8').replace(/^\uFEFF/, '')
  if (!text.trim()) return undefined
  try {
    return RISKY.test(text) ? JSON.parse(text, safeReviver) : JSON.parse(text)
  } catch (err) {
    throw createError({
      statusCode: 400,
      statusMessage: 'The request body is not valid JSON',
      data: { issues: [syntaxIssue(text, err as Error)] }
    })
  }
}
