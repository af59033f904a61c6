import { and, eq } from 'drizzle-orm'
import { tables as t } from '../../../../database/client'
import { audit } from '../../../../domain/audit'
import { fail } from '../../../../domain/errors'

// Delete a study and its results (owners); refused while one of its versions is approved.
export default defineEventHandler(async (event) => {
  const { user, workspace, study } = await requireStudy(event, 'owner')
  const workspaceId = workspace.id
  const approved = await useDB().select({ id: t.results.id, version: t.results.version }).from(t.results)
    .where(and(eq(t.results.studyId, study.id), eq(t.results.reviewState, 'approved')))
  if (approved.length) {
    fail(409, `${study.name} has approved results (version ${approved.map(a => a.version).join(', ')}); approved versions are frozen and cannot be deleted`)
  }
  await useDB().transaction(async (tx) => {
    await tx.delete(t.studies).where(eq(t.studies.id, study.id))
    await audit(tx, { workspaceId, actorId: user.id, action: 'study.deleted', subjectType: 'study', subjectId: study.id, detail: { name: study.name } })
  })
  return { deleted: study.id }
})
