// Just enough MIME decoding for the local mail fake to show what nodemailer sent: headers with
// folding and encoded words, multipart bodies, quoted-printable and base64 parts.
// No Nitro imports: scripts/mail-fake.ts uses it.

export interface ParsedMail {
  subject: string
  from: string
  to: string[]
  text: string
  html: string | null
}

interface Part { headers: Map<string, string>, body: string }

function splitHeaders(raw: string): Part {
  const normal = raw.replace(/\r\n/g, '\n')
  const end = normal.indexOf('\n\n')
  const head = end < 0 ? normal : normal.slice(0, end)
  const body = end < 0 ? '' : normal.slice(end + 2)
  const headers = new Map<string, string>()
  for (const line of head.replace(/\n[ \t]+/g, ' ').split('\n')) {
    const colon = line.indexOf(':')
    if (colon > 0) headers.set(line.slice(0, colon).trim().toLowerCase(), line.slice(colon + 1).trim())
  }
  return { headers, body }
}

function param(header: string, name: string): string | undefined {
  const m = header.match(new RegExp(`${name}\\s*=\\s*(?:"([^"]*)"|([^;\\s]+))`, 'i'))
  return m ? (m[1] ?? m[2]) : undefined
}

function bytesToText(bytes: Buffer, charset = 'utf-8'): string {
  try {
    return new TextDecoder(charset).decode(bytes)
  } catch {
    return bytes.toString('utf8')
  }
}

/** Quoted-printable (RFC 2045 §6.7) to bytes. */
export function decodeQuotedPrintable(input: string): Buffer {
  const soft = input.replace(/=\r?\n/g, '')
  const out: number[] = []
  for (let i = 0; i < soft.length; i++) {
    const hex = soft.slice(i + 1, i + 3)
    if (soft[i] === '=' && /^[0-9A-Fa-f]{2}$/.test(hex)) {
      out.push(parseInt(hex, 16))
      i += 2
    } else {
      out.push(...Buffer.from(soft[i]!, 'utf8'))
    }
  }
  return Buffer.from(out)
}

/** Encoded words in headers (RFC 2047), e.g. =?UTF-8?Q?Caf=C3=A9?=. */
export function decodeHeader(value: string): string {
  return value
    .replace(/\?=\s+=\?/g, '?==?')
    .replace(/=\?([^?]+)\?([bqBQ])\?([^?]*)\?=/g, (_, charset: string, enc: string, text: string) => {
      const bytes = enc.toUpperCase() === 'B'
        ? Buffer.from(text, 'base64')
        : decodeQuotedPrintable(text.replace(/_/g, ' '))
      return bytesToText(bytes, charset)
    })
}

function decodeBody(part: Part): string {
  const encoding = (part.headers.get('content-transfer-encoding') ?? '7bit').toLowerCase()
  const charset = param(part.headers.get('content-type') ?? '', 'charset') ?? 'utf-8'
  if (encoding === 'base64') return bytesToText(Buffer.from(part.body.replace(/\s+/g, ''), 'base64'), charset)
  if (encoding === 'quoted-printable') return bytesToText(decodeQuotedPrintable(part.body), charset)
  return part.body
}

function leaves(part: Part): Part[] {
  const type = part.headers.get('content-type') ?? 'text/plain'
  if (!/^multipart\//i.test(type)) return [part]
  const boundary = param(type, 'boundary')
  if (!boundary) return []
  const chunks = part.body.split(`--${boundary}`)
  return chunks.slice(1)
    .filter(chunk => !chunk.startsWith('--'))
    // The line break before each delimiter belongs to the delimiter (RFC 2046 §5.1.1).
    .flatMap(chunk => leaves(splitHeaders(chunk.replace(/\r\n/g, '\n').replace(/^\n/, '').replace(/\n$/, ''))))
}

function addresses(value: string | undefined): string[] {
  if (!value) return []
  return decodeHeader(value).split(',').map((a) => {
    const angled = a.match(/<([^>]+)>/)
    return (angled ? angled[1]! : a).trim().toLowerCase()
  }).filter(Boolean)
}

/** Parse one RFC 5322 message as received over SMTP. */
export function parseMail(raw: string): ParsedMail {
  const top = splitHeaders(raw)
  let text = ''
  let html: string | null = null
  for (const leaf of leaves(top)) {
    const type = (leaf.headers.get('content-type') ?? 'text/plain').toLowerCase()
    if (type.startsWith('text/html') && html === null) html = decodeBody(leaf)
    else if (type.startsWith('text/plain') && !text) text = decodeBody(leaf)
  }
  return {
    subject: decodeHeader(top.headers.get('subject') ?? '(no subject)'),
    from: addresses(top.headers.get('from'))[0] ?? '',
    to: addresses(top.headers.get('to')),
    text: text.replace(/\n$/, ''),
    html
  }
}

/** Every http(s) link in a text body, in order, without duplicates. */
export function extractLinks(text: string): string[] {
  return [...new Set(text.match(/https?:\/\/[^\s<>"')]+/g) ?? [])]
}
