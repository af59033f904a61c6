// The one mail sender: nodemailer to SMTP_URL (the local fake in development and tests, a relay
// in production), one transport per process and URL.
import nodemailer, { type Transporter } from 'nodemailer'
import { fail } from '../errors'
import type { Settings } from '../settings'
import type { MailContent } from './templates'

const transports = new Map<string, Transporter>()
const transportFor = (smtpUrl: string) => {
  let tr = transports.get(smtpUrl)
  if (!tr) {
    tr = nodemailer.createTransport(smtpUrl)
    transports.set(smtpUrl, tr)
  }
  return tr
}

/** Sends one message; 503 (DomainError) when the relay refuses. */
export async function sendMail(settings: Pick<Settings, 'smtpUrl' | 'mailFrom'>, to: string, content: MailContent) {
  try {
    await transportFor(settings.smtpUrl).sendMail({ from: settings.mailFrom, to, ...content })
  } catch (err) {
    console.error('[mail]', (err as Error).message)
    fail(503, 'The e-mail could not be sent; try again in a minute')
  }
}

/** Sends one message after the fact (a job's end, a review step): a failure is logged, never thrown. */
export async function sendNotice(settings: Pick<Settings, 'smtpUrl' | 'mailFrom'>, to: string, content: MailContent) {
  await sendMail(settings, to, content).catch(() => {})
}
