// The workspace's queued work in one list, newest first: study runs (results) and set builds,
// with what, who, state, progress and times.
import { desc, eq } from 'drizzle-orm'
import type { DB } from '../../database/client'
import { tables as t } from '../../database/client'
import type { JobState } from '../../database/schema'

export interface JobEntry {
  id: string
  kind: 'run' | 'build'
  state: JobState
  /** 0 … 1. */
  progress: number
  /** The study's or the built set's name. */
  title: string
  detail: string
  /** Where the app shows it. */
  link: string
  requestedByName: string | null
  queuedAt: Date
  startedAt: Date | null
  finishedAt: Date | null
  error: string | null
}

const fraction = (done: number, total: number) => (total > 0 ? Math.min(1, done / total) : 0)

/** The newest `limit` runs and builds of workspace `workspaceId`. */
export async function listJobs(db: DB, workspaceId: string, limit = 100): Promise<JobEntry[]> {
  const runs = await db.select({ r: t.results, studyName: t.studies.name, who: t.users.name })
    .from(t.results)
    .innerJoin(t.studies, eq(t.studies.id, t.results.studyId))
    .leftJoin(t.users, eq(t.users.id, t.results.requestedBy))
    .where(eq(t.studies.workspaceId, workspaceId))
    .orderBy(desc(t.results.createdAt)).limit(limit)
  const builds = await db.select({ b: t.setBuilds, who: t.users.name })
    .from(t.setBuilds)
    .leftJoin(t.users, eq(t.users.id, t.setBuilds.requestedBy))
    .where(eq(t.setBuilds.workspaceId, workspaceId))
    .orderBy(desc(t.setBuilds.createdAt)).limit(limit)
  const entries: JobEntry[] = [
    ...runs.map(({ r, studyName, who }): JobEntry => ({
      id: r.id, kind: 'run', state: r.state, progress: r.state === 'done' ? 1 : fraction(r.membersDone, r.membersTotal),
      title: studyName, detail: `${r.specSnapshot.set.name} ${r.specSnapshot.set.version}, version ${r.version} · ${r.membersTotal} members × ${r.binCount} bins`,
      link: `/studies/${r.studyId}?result=${r.id}`, requestedByName: who,
      queuedAt: r.createdAt, startedAt: r.startedAt, finishedAt: r.finishedAt, error: r.error
    })),
    ...builds.map(({ b, who }): JobEntry => ({
      id: b.id, kind: 'build', state: b.state, progress: b.state === 'done' ? 1 : fraction(b.progressDone, b.progressTotal),
      title: b.name, detail: b.progressTotal ? `set build · ${b.progressTotal} members` : 'set build',
      link: b.setId ? `/sets/${b.setId}` : '/sets', requestedByName: who,
      queuedAt: b.createdAt, startedAt: b.startedAt, finishedAt: b.finishedAt, error: b.error
    }))
  ]
  return entries.sort((a, b) => b.queuedAt.getTime() - a.queuedAt.getTime()).slice(0, limit)
}
