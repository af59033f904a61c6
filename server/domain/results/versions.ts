// New result versions of a study: one row per set, numbered per (study, set), with the snapshot
// of what will run (the server's Run and the seed make results with this, then runStudy runs them).
import { and, eq, max } from 'drizzle-orm'
import type { DB } from '../../database/client'
import { tables as t } from '../../database/client'
import type { ErrorSetRow, Result, SpecSnapshot, Study } from '../../database/schema'
import type { StudySpec } from '../../../shared/physics/study/spec'
import { ENGINE_VERSION } from '../../../shared/physics/version'
import { runVariation } from '../studies/check'

type SetFields = Pick<ErrorSetRow, 'id' | 'name' | 'version' | 'family' | 'kind' | 'memberCount' | 'confidenceLevelPercent' | 'header'>

/**
 * Inserts, in one transaction, the next version (state queued) of `study` on each of `sets`,
 * with `second` as the partner set, and an audit event for each. `spec` is the validated spec.
 * The snapshot records how the two sets vary (runVariation) and the run's member rows.
 */
export async function insertResultVersions(db: DB, o: { study: Study, spec: StudySpec, sets: SetFields[], second: SetFields | null, userId: string }): Promise<Result[]> {
  const { study, spec, second } = o
  return db.transaction(async (tx) => {
    const rows: Result[] = []
    for (const set of o.sets) {
      const [{ last } = { last: null }] = await tx.select({ last: max(t.results.version) }).from(t.results)
        .where(and(eq(t.results.studyId, study.id), eq(t.results.setId, set.id)))
      const v = runVariation(spec, set, second)
      const snapshot: SpecSnapshot = {
        studyName: study.name, spec, prescription: study.prescription, clPercent: study.clPercent,
        set: { id: set.id, name: set.name, version: set.version, family: set.family, kind: set.kind, memberCount: set.memberCount, confidenceLevelPercent: set.confidenceLevelPercent },
        second: second
          ? {
              id: second.id, name: second.name, version: second.version, kind: second.kind, family: second.family,
              memberCount: second.memberCount, confidenceLevelPercent: second.confidenceLevelPercent, variation: v.variation
            }
          : null
      }
      const [row] = await tx.insert(t.results).values({
        studyId: study.id, setId: set.id, secondSetId: second?.id ?? null, version: (last ?? 0) + 1,
        studyRevision: study.revision, specSnapshot: snapshot, membersTotal: v.rows,
        binCount: spec.bins.length, requestedBy: o.userId, engineVersion: ENGINE_VERSION
      }).returning()
      rows.push(row!)
      await tx.insert(t.auditEvents).values({ workspaceId: study.workspaceId, actorId: o.userId, action: 'result.created', subjectType: 'result', subjectId: row!.id, detail: { studyId: study.id, setId: set.id, version: row!.version } })
    }
    return rows
  })
}
