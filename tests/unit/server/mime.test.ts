import nodemailer, { type SendMailOptions } from 'nodemailer'
import { describe, expect, it } from 'vitest'
import { decodeHeader, decodeQuotedPrintable, extractLinks, parseMail } from '../../../server/domain/mail/mime'
import { invitationMail } from '../../../server/domain/mail/templates'

// Messages are composed by nodemailer itself (stream transport), exactly as the app sends them.
async function compose(message: SendMailOptions) {
  const transport = nodemailer.createTransport({ streamTransport: true, buffer: true, newline: 'windows' })
  const info = await transport.sendMail(message)
  return (info.message as Buffer).toString('utf8')
}

describe('mail fake MIME decoding', () => {
  it('reads subject, addresses, text and html of a multipart message with non-ASCII text', async () => {
    const link = `http://127.0.0.1:3000/invitations/${'x'.repeat(43)}`
    const content = invitationMail('Zoë Ångström', 'Müon Collaboration — forward group', 'analyst', link)
    const raw = await compose({ from: 'Sheaf <no-reply@sheaf.invalid>', to: 'Friend <Friend@Example.test>', ...content })
    const mail = await parseMail(raw)
    expect(mail.subject).toBe(content.subject)
    expect(mail.from).toBe('no-reply@sheaf.invalid')
    expect(mail.to).toEqual(['friend@example.test'])
    expect(mail.text).toBe(content.text)
    expect(mail.html).toBe(content.html)
    expect(extractLinks(mail.text)).toEqual([link])
  })

  it('reads a plain single-part message', async () => {
    const raw = await compose({ from: 'a@x.test', to: 'b@x.test, c@x.test', subject: 'Hi', text: 'plain body' })
    expect(await parseMail(raw)).toMatchObject({ subject: 'Hi', to: ['b@x.test', 'c@x.test'], text: 'plain body', html: null })
  })

  it('decodes RFC 2047 encoded words and RFC 2045 quoted-printable', () => {
    expect(decodeHeader('=?UTF-8?Q?Caf=C3=A9_au_lait?=')).toBe('Café au lait')
    expect(decodeHeader('=?UTF-8?B?w4XDpMO2?= =?UTF-8?B?w7w=?=')).toBe('Åäöü')
    expect(decodeQuotedPrintable('a=3Db=\r\nc').toString()).toBe('a=bc')
  })

  it('lists each link once, in order', () => {
    expect(extractLinks('see https://a.test/x and http://b.test/y?z=1, then https://a.test/x'))
      .toEqual(['https://a.test/x', 'http://b.test/y?z=1,'])
  })
})
