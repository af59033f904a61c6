import { eq, sql } from 'drizzle-orm'
import { tables as t } from '../../../../database/client'
import { publicStudy, validateStudy } from '../../../../domain/studies/studies'
import { audit } from '../../../../domain/audit'
import { fail } from '../../../../domain/errors'

// Save edits to a study (analysts). Every save counts the revision up; results keep the spec
// they ran with, so earlier versions (approved ones included) are untouched.
export default defineEventHandler(async (event) => {
  const { user, workspace, study } = await requireStudy(event, 'analyst')
  const workspaceId = workspace.id
  const changes = await readValid(event, studyPatchSchema, { maxBytes: JSON_BODY_LIMITS.study })
  if (changes.revision !== undefined && changes.revision !== study.revision) {
    fail(409, `The study was saved by someone else meanwhile (revision ${study.revision}); reload it before saving`, { revision: study.revision })
  }
  const merged = {
    spec: changes.spec ?? study.spec,
    setIds: changes.setIds ?? study.setIds,
    secondSetId: changes.secondSetId === undefined ? study.secondSetId : changes.secondSetId
  }
  const { spec } = await validateStudy(useDB(), workspaceId, merged)
  const { revision: _revision, ...fields } = changes
  const row = await useDB().transaction(async (tx) => {
    const [saved] = await tx.update(t.studies)
      .set({ ...fields, ...merged, spec, revision: sql`${t.studies.revision} + 1` })
      .where(eq(t.studies.id, study.id)).returning()
    if (!saved) fail(404, 'Study not found')
    await audit(tx, { workspaceId, actorId: user.id, action: 'study.edited', subjectType: 'study', subjectId: study.id, detail: { revision: saved.revision, fields: Object.keys(fields) } })
    return saved
  })
  return publicStudy(row)
})
