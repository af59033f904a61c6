// The workspace's queued work in one list, newest first: study runs (results) and set builds,
// with what, which study or set and version, who, state, progress (and the phase when the worker
// records one), times, place in the queue and a failure's reason; and the counts per state.
import { and, count, desc, eq, getTableColumns, inArray, sql, type SQL } from 'drizzle-orm'
import type { DB } from '../../database/client'
import { tables as t } from '../../database/client'
import type { JobState } from '../../database/schema'
import { queuePlaces } from '../sets/builds'

export type JobKind = 'run' | 'build'

export interface JobEntry {
  id: string
  kind: JobKind
  state: JobState
  /** 0 … 1. */
  progress: number
  /** What the worker is doing now ("evaluating members", "combining", "storing"), when it says. */
  phase: string | null
  /** The study's or the built set's name. */
  title: string
  detail: string
  /** A run: its study, the set and the set's version, the result version. */
  studyId: string | null
  setId: string | null
  setName: string | null
  setVersion: string | null
  version: number | null
  /** Where the app shows it. */
  link: string
  requestedByName: string | null
  queuedAt: Date
  startedAt: Date | null
  finishedAt: Date | null
  /** 1 = next to start on its queue (all workspaces share the workers); null unless queued. */
  queuePosition: number | null
  cancelRequested: boolean
  error: string | null
}

export interface JobFilter {
  kind?: JobKind
  state?: JobState
  limit?: number
}

export type JobCounts = Record<JobState, number>

const fraction = (done: number, total: number) => (total > 0 ? Math.min(1, done / total) : 0)

/**
 * The phase column when the schema has one (the worker side may add it); otherwise null, so the
 * list works with or without it.
 */
function phaseOf(table: typeof t.results | typeof t.setBuilds): SQL<string | null> {
  const cols = getTableColumns(table) as Record<string, unknown>
  return ('phase' in cols ? sql`${cols.phase as SQL}` : sql`null`) as SQL<string | null>
}

/**
 * Place on the run queue of each queued run of `ids` (1 = next), counted over every workspace's
 * queued runs in the order they were queued (runs are queued without priority: first come,
 * first served). Builds take their places from the build queue's own order (sets/builds.ts).
 */
async function runQueuePlaces(db: DB, ids: string[]) {
  if (!ids.length) return new Map<string, number>()
  const ranked = db.select({ id: t.results.id, place: sql<number>`row_number() over (order by ${t.results.createdAt}, ${t.results.id})`.mapWith(Number).as('place') })
    .from(t.results).where(eq(t.results.state, 'queued')).as('ranked')
  const rows = await db.select().from(ranked).where(inArray(ranked.id, ids))
  return new Map(rows.map(r => [r.id, r.place]))
}

/** The newest `limit` runs and builds of workspace `workspaceId` matching `filter`. */
export async function listJobs(db: DB, workspaceId: string, filter: JobFilter = {}): Promise<JobEntry[]> {
  const limit = filter.limit ?? 100
  const runs = filter.kind === 'build'
    ? []
    : await db.select({
        id: t.results.id, state: t.results.state, membersDone: t.results.membersDone, membersTotal: t.results.membersTotal,
        binCount: t.results.binCount, version: t.results.version, studyId: t.results.studyId, setId: t.results.setId,
        // The set from the library, not from the result's specSnapshot: reading the snapshot
        // would load its spec with every bin (megabytes for a large study) for two words.
        setName: t.errorSets.name, setVersion: t.errorSets.version,
        createdAt: t.results.createdAt, startedAt: t.results.startedAt, finishedAt: t.results.finishedAt, error: t.results.error,
        cancelRequested: t.results.cancelRequested, phase: phaseOf(t.results), studyName: t.studies.name, who: t.users.name
      })
        .from(t.results)
        .innerJoin(t.studies, eq(t.studies.id, t.results.studyId))
        .innerJoin(t.errorSets, eq(t.errorSets.id, t.results.setId))
        .leftJoin(t.users, eq(t.users.id, t.results.requestedBy))
        .where(and(eq(t.studies.workspaceId, workspaceId), filter.state ? eq(t.results.state, filter.state) : undefined))
        .orderBy(desc(t.results.createdAt)).limit(limit)
  const builds = filter.kind === 'run'
    ? []
    : await db.select({
        id: t.setBuilds.id, state: t.setBuilds.state, name: t.setBuilds.name, done: t.setBuilds.progressDone, total: t.setBuilds.progressTotal,
        setId: t.setBuilds.setId, setVersion: t.errorSets.version, createdAt: t.setBuilds.createdAt, startedAt: t.setBuilds.startedAt,
        finishedAt: t.setBuilds.finishedAt, error: t.setBuilds.error, cancelRequested: t.setBuilds.cancelRequested,
        phase: phaseOf(t.setBuilds), who: t.users.name
      })
        .from(t.setBuilds)
        .leftJoin(t.users, eq(t.users.id, t.setBuilds.requestedBy))
        .leftJoin(t.errorSets, eq(t.errorSets.id, t.setBuilds.setId))
        .where(and(eq(t.setBuilds.workspaceId, workspaceId), filter.state ? eq(t.setBuilds.state, filter.state) : undefined))
        .orderBy(desc(t.setBuilds.createdAt)).limit(limit)
  const [runPlaces, buildPlaces] = await Promise.all([
    runQueuePlaces(db, runs.filter(r => r.state === 'queued').map(r => r.id)),
    builds.some(b => b.state === 'queued') ? queuePlaces(db) : new Map<string, number>()
  ])
  const entries: JobEntry[] = [
    ...runs.map((r): JobEntry => ({
      id: r.id, kind: 'run', state: r.state, progress: r.state === 'done' ? 1 : fraction(r.membersDone, r.membersTotal), phase: r.phase ?? null,
      title: r.studyName, detail: `${r.membersTotal} members × ${r.binCount} bins`,
      studyId: r.studyId, setId: r.setId, setName: r.setName, setVersion: r.setVersion, version: r.version,
      link: `/studies/${r.studyId}?result=${r.id}`, requestedByName: r.who,
      queuedAt: r.createdAt, startedAt: r.startedAt, finishedAt: r.finishedAt, queuePosition: runPlaces.get(r.id) ?? null,
      cancelRequested: r.cancelRequested, error: r.error
    })),
    ...builds.map((b): JobEntry => ({
      id: b.id, kind: 'build', state: b.state, progress: b.state === 'done' ? 1 : fraction(b.done, b.total), phase: b.phase ?? null,
      title: b.name, detail: b.total ? `set build · ${b.total} members` : 'set build',
      studyId: null, setId: b.setId, setName: b.setId ? b.name : null, setVersion: b.setVersion ?? null, version: null,
      link: b.setId ? `/sets/${b.setId}` : '/sets', requestedByName: b.who,
      queuedAt: b.createdAt, startedAt: b.startedAt, finishedAt: b.finishedAt, queuePosition: buildPlaces.get(b.id) ?? null,
      cancelRequested: b.cancelRequested, error: b.error
    }))
  ]
  return entries.sort((a, b) => b.queuedAt.getTime() - a.queuedAt.getTime()).slice(0, limit)
}

/** How many runs and builds of the workspace are in each state (all of them, not only the listed). */
export async function countJobs(db: DB, workspaceId: string): Promise<JobCounts> {
  const [runs, builds] = await Promise.all([
    db.select({ state: t.results.state, n: count() }).from(t.results)
      .innerJoin(t.studies, eq(t.studies.id, t.results.studyId))
      .where(eq(t.studies.workspaceId, workspaceId)).groupBy(t.results.state),
    db.select({ state: t.setBuilds.state, n: count() }).from(t.setBuilds)
      .where(eq(t.setBuilds.workspaceId, workspaceId)).groupBy(t.setBuilds.state)
  ])
  const counts: JobCounts = { queued: 0, running: 0, done: 0, failed: 0, cancelled: 0 }
  for (const { state, n } of [...runs, ...builds]) counts[state] += n
  return counts
}
