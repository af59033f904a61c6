import { STATUS_CODES, type ServerResponse } from 'node:http'

// The last look at every response head before it is written, whichever route, error handler or
// asset answered: the HTTP reason phrase stays short (error messages travel in the JSON body as
// statusMessage/message/data; a phrase over MAX_REASON characters becomes the standard one for
// the status) and no x-powered-by header goes out.
export const MAX_REASON = 120

/** The reason phrase to send for `status`: `phrase` when printable ASCII of at most MAX_REASON characters. */
export function reasonPhrase(status: number, phrase: string | undefined): string {
  const text = (phrase ?? '').replace(/[^\t\x20-\x7E]/g, '').trim()
  return text && text.length <= MAX_REASON ? text : (STATUS_CODES[status] ?? 'Unknown')
}

export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('request', (event) => {
    const res = event.node.res
    const writeHead = res.writeHead
    // Node writes the head through writeHead, also implicitly on the first write or end.
    res.writeHead = function (this: ServerResponse, status: number, ...rest: unknown[]) {
      if (typeof rest[0] === 'string') rest[0] = reasonPhrase(status, rest[0])
      else this.statusMessage = reasonPhrase(status, this.statusMessage)
      this.removeHeader('x-powered-by')
      return (writeHead as (...args: unknown[]) => ServerResponse).apply(this, [status, ...rest])
    } as typeof res.writeHead
  })
})
