import { request } from 'node:http'

export interface RawResponse { status: number, statusText: string, headers: Record<string, string | string[] | undefined>, body: string }

/**
 * One HTTP/1.1 request with exactly these headers, Host included (fetch always sends the URL's
 * own host): for the Host allow-list and for reading the raw status line.
 */
export function rawRequest(url: string, o: { method?: string, headers?: Record<string, string>, body?: string } = {}): Promise<RawResponse> {
  return new Promise((resolve, reject) => {
    const req = request(url, { method: o.method ?? 'GET', headers: o.headers }, (res) => {
      const chunks: Buffer[] = []
      res.on('data', (c: Buffer) => chunks.push(c))
      res.on('end', () => resolve({ status: res.statusCode!, statusText: res.statusMessage ?? '', headers: res.headers, body: Buffer.concat(chunks).toString('utf8') }))
      res.on('error', reject)
    })
    req.on('error', reject)
    req.end(o.body)
  })
}
