// E-mail to the requester when a queued job ends, sent from the worker through nodemailer
// (SMTP_URL: the local fake in development and tests). Only for jobs that ran at least
// SHEAF_MAIL_AFTER_MS milliseconds (default 3000; 0 mails every job). No Nitro imports.
import { eq } from 'drizzle-orm'
import { createTransport, type Transporter } from 'nodemailer'
import type { DB } from '../../database/client'
import { tables as t } from '../../database/client'
import type { MailContent } from '../../mail/templates'
import { buildEndedMail, runEndedMail, setPagePath, studyPagePath } from './mail-texts'

let transport: Transporter | undefined

/** Milliseconds a job must have run before its end is mailed. */
export function mailAfterMs() {
  const v = Number(process.env.SHEAF_MAIL_AFTER_MS)
  return Number.isFinite(v) && v >= 0 ? v : 3000
}

const appUrl = (path: string) => new URL(path, process.env.APP_ORIGIN ?? 'http://127.0.0.1:3000').toString()

/** Sends one message; a mail failure is logged, never thrown (the job's outcome stands). */
export async function sendWorkerMail(to: string, content: MailContent) {
  try {
    transport ??= createTransport(process.env.SMTP_URL ?? 'smtp://127.0.0.1:2525')
    await transport.sendMail({ from: process.env.SHEAF_MAIL_FROM ?? 'Sheaf <no-reply@sheaf.invalid>', to, ...content })
  } catch (err) {
    console.error('[worker mail]', (err as Error).message)
  }
}

async function requesterEmail(db: DB, userId: string | null) {
  if (!userId) return null
  const [u] = await db.select({ email: t.users.email }).from(t.users).where(eq(t.users.id, userId))
  return u?.email ?? null
}

const ranLongEnough = (startedAt: Date | null, finishedAt: Date | null) =>
  startedAt !== null && (finishedAt ?? new Date()).getTime() - startedAt.getTime() >= mailAfterMs()

/** Mails the requester of result `resultId` that its job ended, if it ran long enough. */
export async function notifyRunEnded(db: DB, resultId: string) {
  const [row] = await db.select({ r: t.results, studyName: t.studies.name, setName: t.errorSets.name })
    .from(t.results)
    .innerJoin(t.studies, eq(t.studies.id, t.results.studyId))
    .innerJoin(t.errorSets, eq(t.errorSets.id, t.results.setId))
    .where(eq(t.results.id, resultId))
  if (!row || !['done', 'failed', 'cancelled'].includes(row.r.state)) return
  if (!ranLongEnough(row.r.startedAt, row.r.finishedAt)) return
  const to = await requesterEmail(db, row.r.requestedBy)
  if (!to) return
  await sendWorkerMail(to, runEndedMail({
    studyName: row.studyName, setName: row.setName, version: row.r.version,
    state: row.r.state as 'done' | 'failed' | 'cancelled', error: row.r.error,
    durationMs: (row.r.finishedAt ?? new Date()).getTime() - row.r.startedAt!.getTime(),
    link: appUrl(studyPagePath(row.r.studyId, row.r.id))
  }))
}

/** Mails the requester of set build `buildId` that it ended, if it ran long enough. */
export async function notifyBuildEnded(db: DB, buildId: string) {
  const [b] = await db.select().from(t.setBuilds).where(eq(t.setBuilds.id, buildId))
  if (!b || !['done', 'failed', 'cancelled'].includes(b.state)) return
  if (!ranLongEnough(b.startedAt, b.finishedAt)) return
  const to = await requesterEmail(db, b.requestedBy)
  if (!to) return
  await sendWorkerMail(to, buildEndedMail({
    name: b.name, state: b.state as 'done' | 'failed' | 'cancelled', error: b.error,
    durationMs: (b.finishedAt ?? new Date()).getTime() - b.startedAt!.getTime(),
    memberCount: b.progressTotal, link: appUrl(b.setId ? setPagePath(b.setId) : '/sets')
  }))
}
