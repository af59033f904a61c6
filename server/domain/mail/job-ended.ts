// E-mail to the requester when a queued job ends (sent by whoever ran it: the worker), only for
// jobs that ran at least settings.mailAfterMs milliseconds.
import { eq } from 'drizzle-orm'
import type { DB } from '../../database/client'
import { tables as t } from '../../database/client'
import { appLink, type Settings } from '../settings'
import { sendNotice } from './send'
import { buildEndedMail, runEndedMail, setPagePath, studyPagePath } from './templates'

const ENDED = ['done', 'failed', 'cancelled'] as const
type Ended = typeof ENDED[number]
const ended = (state: string): state is Ended => (ENDED as readonly string[]).includes(state)

async function requesterEmail(db: DB, userId: string | null) {
  if (!userId) return null
  const [u] = await db.select({ email: t.users.email }).from(t.users).where(eq(t.users.id, userId))
  return u?.email ?? null
}

const durationMs = (startedAt: Date, finishedAt: Date | null) => (finishedAt ?? new Date()).getTime() - startedAt.getTime()

/** Mails the requester of result `resultId` that its job ended, if it ran long enough. */
export async function notifyRunEnded(db: DB, settings: Settings, resultId: string) {
  const [row] = await db.select({ r: t.results, studyName: t.studies.name, setName: t.errorSets.name })
    .from(t.results)
    .innerJoin(t.studies, eq(t.studies.id, t.results.studyId))
    .innerJoin(t.errorSets, eq(t.errorSets.id, t.results.setId))
    .where(eq(t.results.id, resultId))
  if (!row || !ended(row.r.state) || !row.r.startedAt) return
  if (durationMs(row.r.startedAt, row.r.finishedAt) < settings.mailAfterMs) return
  const to = await requesterEmail(db, row.r.requestedBy)
  if (!to) return
  await sendNotice(settings, to, runEndedMail({
    studyName: row.studyName, setName: row.setName, version: row.r.version,
    state: row.r.state, error: row.r.error, durationMs: durationMs(row.r.startedAt, row.r.finishedAt),
    link: appLink(settings, studyPagePath(row.r.studyId, row.r.id))
  }))
}

/** Mails the requester of set build `buildId` that it ended, if it ran long enough. */
export async function notifyBuildEnded(db: DB, settings: Settings, buildId: string) {
  const [b] = await db.select().from(t.setBuilds).where(eq(t.setBuilds.id, buildId))
  if (!b || !ended(b.state) || !b.startedAt) return
  if (durationMs(b.startedAt, b.finishedAt) < settings.mailAfterMs) return
  const to = await requesterEmail(db, b.requestedBy)
  if (!to) return
  await sendNotice(settings, to, buildEndedMail({
    name: b.name, state: b.state, error: b.error, durationMs: durationMs(b.startedAt, b.finishedAt),
    memberCount: b.progressTotal, link: appLink(settings, b.setId ? setPagePath(b.setId) : '/sets')
  }))
}
