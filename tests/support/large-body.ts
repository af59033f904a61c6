import { request } from 'node:http'

export interface LargeBodyAnswer {
  status: number
  body: any
  headers: Record<string, string | string[] | undefined>
  /** Bytes handed to the connection when the answer arrived. */
  bytesSent: number
  /** Whether the whole body had been sent when the answer arrived. */
  uploadFinished: boolean
  /** Milliseconds from the first byte sent to the answer. */
  elapsedMs: number
}

export interface LargeBodyRequest {
  url: string
  method?: string
  headers?: Record<string, string>
  /** Sent first, e.g. '{"email":"a@b.test","password":"'. */
  head: string
  /** Sent last, e.g. '"}'. */
  tail: string
  /** Total body size in bytes; the middle is filled with `fill`. */
  totalBytes: number
  /** Fill character (default 'x'); '[' makes an over-deep document. */
  fill?: string
  /** Send a Content-Length (default) or stream the body chunked without one. */
  declareLength?: boolean
}

/**
 * POST a large body in 64 KiB chunks over node:http, stopping as soon as the server answers,
 * and report how much had been sent by then. node:http rather than fetch because fetch cannot
 * show an answer that arrives while the body is still being sent.
 */
export function sendLargeBody(opts: LargeBodyRequest): Promise<LargeBodyAnswer> {
  const fill = Buffer.alloc(64 * 1024, opts.fill ?? 'x')
  const head = Buffer.from(opts.head)
  const tail = Buffer.from(opts.tail)
  const middle = opts.totalBytes - head.length - tail.length
  if (middle < 0) throw new Error('totalBytes is smaller than head and tail')
  const headers: Record<string, string | number> = { 'content-type': 'application/json', ...opts.headers }
  if (opts.declareLength ?? true) headers['content-length'] = opts.totalBytes
  else headers['transfer-encoding'] = 'chunked'

  return new Promise((resolve, reject) => {
    const started = Date.now()
    let bytesSent = 0
    let answered = false
    let uploadFinished = false
    const req = request(opts.url, { method: opts.method ?? 'POST', headers })
    req.on('response', (res) => {
      answered = true
      const sentAtAnswer = bytesSent
      const finishedAtAnswer = uploadFinished
      const elapsedMs = Date.now() - started
      const chunks: Buffer[] = []
      res.on('data', (c: Buffer) => chunks.push(c))
      res.on('end', () => {
        const text = Buffer.concat(chunks).toString('utf8')
        let body: unknown = text
        try {
          body = JSON.parse(text)
        } catch { /* keep the text */ }
        req.destroy()
        resolve({ status: res.statusCode ?? 0, body, headers: res.headers, bytesSent: sentAtAnswer, uploadFinished: finishedAtAnswer, elapsedMs })
      })
      res.on('error', reject)
    })
    // Once the server has answered, a reset of the rest of the upload is expected.
    req.on('error', (err) => {
      if (!answered) reject(err)
    })

    const write = (buf: Buffer) => {
      bytesSent += buf.length
      return req.write(buf)
    }
    let left = middle
    const pump = () => {
      while (!answered && left > 0) {
        const n = Math.min(left, fill.length)
        left -= n
        if (!write(n === fill.length ? fill : fill.subarray(0, n))) return void req.once('drain', pump)
      }
      if (answered) return
      write(tail)
      uploadFinished = true
      req.end()
    }
    write(head)
    pump()
  })
}
