import { sql } from 'drizzle-orm'
import type { DB } from '../../database/client'

/**
 * What a study page's server render reads, condensed to one string that changes whenever any of
 * it changes: the study row, its result versions (count and newest change: a run, progress, a
 * review step, a deletion), its measurements, and the workspace's sets (names and kinds beside
 * the results). One query. Null when the study is not in workspace `workspaceId` (the page then
 * renders its 404 notice as usual).
 */
export async function studyPageVersion(db: DB, workspaceId: string, studyId: string): Promise<string | null> {
  const { rows } = await db.execute<{ version: string }>(sql`
    select concat_ws('|', s.updated_at, s.revision,
      (select count(*) || ':' || coalesce(max(r.updated_at)::text, '') from results r where r.study_id = s.id),
      (select count(*) || ':' || coalesce(max(m.created_at)::text, '') from measurements m where m.study_id = s.id),
      (select count(*) || ':' || coalesce(max(e.updated_at)::text, '') from error_sets e where e.workspace_id = s.workspace_id)
    ) as version
    from studies s where s.id = ${studyId} and s.workspace_id = ${workspaceId}`)
  return rows[0]?.version ?? null
}
