import nodemailer, { type Transporter } from 'nodemailer'
import type { MailContent } from '../mail/templates'

let transport: Transporter | undefined
const useTransport = () => (transport ??= nodemailer.createTransport(useSettings().smtpUrl))

/** Send through SMTP_URL (the local fake or a real relay); 503 when the relay refuses. */
export async function sendMail(to: string, content: MailContent) {
  try {
    await useTransport().sendMail({ from: useSettings().mailFrom, to, ...content })
  } catch (err) {
    console.error('[mail]', (err as Error).message)
    throw createError({ statusCode: 503, statusMessage: 'The e-mail could not be sent; try again in a minute' })
  }
}

/** An absolute link into the app, e.g. appLink('/verify', { token }). */
export function appLink(path: string, query: Record<string, string> = {}) {
  const url = new URL(path, useSettings().appOrigin)
  for (const [k, v] of Object.entries(query)) url.searchParams.set(k, v)
  return url.toString()
}
