import { eq, sql } from 'drizzle-orm'
import { tables as t } from '../../../../database/client'

// Save edits to a study (analysts). Every save counts the revision up; results keep the spec
// they ran with, so earlier versions (approved ones included) are untouched.
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  const studyId = uuidParam(event, 'id', 'Study')
  const changes = await readValid(event, studyPatchSchema)
  const { study } = await requireStudy(workspaceId, studyId, user.id, 'analyst')
  if (changes.revision !== undefined && changes.revision !== study.revision) {
    throw createError({ statusCode: 409, statusMessage: `The study was saved by someone else meanwhile (revision ${study.revision}); reload it before saving`, data: { revision: study.revision } })
  }
  const merged = {
    spec: changes.spec ?? study.spec,
    setIds: changes.setIds ?? study.setIds,
    secondSetId: changes.secondSetId === undefined ? study.secondSetId : changes.secondSetId
  }
  const { spec } = await validateStudy(workspaceId, merged)
  const { revision: _revision, ...fields } = changes
  const [row] = await useDB().update(t.studies)
    .set({ ...fields, ...merged, spec, revision: sql`${t.studies.revision} + 1` })
    .where(eq(t.studies.id, study.id)).returning()
  await audit({ workspaceId, actorId: user.id, action: 'study.edited', subjectType: 'study', subjectId: study.id, detail: { revision: row!.revision, fields: Object.keys(fields) } })
  return publicStudy(row!)
})
