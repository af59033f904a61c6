// MIME decoding for the local mail fake, so it can show what nodemailer sent. The message itself
// is read by mailparser; the two header/body decoders below are the libraries mailparser reads
// with (libmime, libqp), exposed for the tests and for one-off use.
// No Nitro imports: scripts/mail-fake.ts uses it.
import libmime from 'libmime'
import libqp from 'libqp'
import { simpleParser, type AddressObject } from 'mailparser'

export interface ParsedMail {
  subject: string
  from: string
  to: string[]
  text: string
  html: string | null
}

/** Quoted-printable (RFC 2045 §6.7) to bytes. */
export function decodeQuotedPrintable(input: string): Buffer {
  return libqp.decode(input)
}

/** Encoded words in headers (RFC 2047), e.g. =?UTF-8?Q?Caf=C3=A9?=. */
export function decodeHeader(value: string): string {
  return libmime.decodeWords(value)
}

/** Bare, lower-cased addresses of an address header (groups flattened), in order. */
function addresses(header: AddressObject | AddressObject[] | undefined): string[] {
  const objects = header === undefined ? [] : Array.isArray(header) ? header : [header]
  const flat = objects.flatMap(o => o.value).flatMap(a => (a.group ? a.group : [a]))
  return flat.map(a => (a.address ?? '').trim().toLowerCase()).filter(Boolean)
}

/** Parse one RFC 5322 message as received over SMTP. */
export async function parseMail(raw: string | Buffer): Promise<ParsedMail> {
  // Only what nodemailer wrote is wanted: no text made from HTML, no HTML made from text.
  const mail = await simpleParser(raw, { skipHtmlToText: true, skipTextToHtml: true, skipImageLinks: true })
  return {
    subject: mail.subject ?? '(no subject)',
    from: addresses(mail.from)[0] ?? '',
    to: addresses(mail.to),
    // A single-part body reaches us with the line break that ends the message; it is not text.
    text: (mail.text ?? '').replace(/\r?\n$/, ''),
    html: typeof mail.html === 'string' ? mail.html : null
  }
}

/** Every http(s) link in a text body, in order, without duplicates. */
export function extractLinks(text: string): string[] {
  return [...new Set(text.match(/https?:\/\/[^\s<>"')]+/g) ?? [])]
}
