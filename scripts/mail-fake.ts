// Local fake SMTP server: accepts every message on loopback and stores it in mail_outbox, so
// verification, reset and invitation links can be followed from the Outbox page.
// Env: DATABASE_URL, MAIL_FAKE_PORT (default 2525).
import { SMTPServer } from 'smtp-server'
import { createDB, tables } from '../server/database/client'
import { isDatabaseFailure, logText } from '../server/domain/log-text'
import { parseMail } from '../server/domain/mail/mime'

const port = Number(process.env.MAIL_FAKE_PORT ?? 2525)
const url = process.env.DATABASE_URL
if (!url) throw new Error('DATABASE_URL is not set')
const db = createDB(url, 2)
const MAX_BYTES = 5 * 1024 * 1024

const server = new SMTPServer({
  authOptional: true,
  disabledCommands: ['STARTTLS', 'AUTH'],
  banner: 'Sheaf mail fake',
  size: MAX_BYTES,
  onData(stream, session, callback) {
    const chunks: Buffer[] = []
    stream.on('data', (c: Buffer) => chunks.push(c))
    stream.on('error', callback)
    stream.on('end', () => {
      const bytes = Buffer.concat(chunks)
      parseMail(bytes).then((mail) => {
        const envelopeTo = session.envelope.rcptTo.map(r => r.address.toLowerCase())
        const envelopeFrom = session.envelope.mailFrom ? session.envelope.mailFrom.address : mail.from
        return db.insert(tables.mailOutbox).values({
          mailFrom: envelopeFrom || mail.from,
          mailTo: envelopeTo.length ? envelopeTo : mail.to,
          subject: mail.subject,
          textBody: mail.text,
          htmlBody: mail.html,
          raw: bytes.toString('utf8')
        })
      }).then(() => callback(), (err: unknown) => {
        // The failed insert's own message quotes the message (tokens and all): log and answer without it.
        console.error(`[mail-fake] message not stored: ${logText(err)}`)
        callback(new Error(isDatabaseFailure(err) ? 'The mail fake could not store the message' : 'The mail fake could not read the message'))
      })
    })
  }
})

server.on('error', err => console.error('[mail-fake]', err.message))
server.listen(port, '127.0.0.1', () => console.log(`[mail-fake] listening on 127.0.0.1:${port}`))

function shutdown() {
  server.close(() => { void db.pool.end().then(() => process.exit(0)) })
  setTimeout(() => process.exit(0), 3000).unref()
}
process.on('SIGTERM', shutdown)
process.on('SIGINT', shutdown)
