import { tables as t } from '../../../../database/client'
import { publicStudy, validateStudy } from '../../../../domain/studies/studies'
import { audit } from '../../../../domain/audit'

// Create a study (analysts): the spec is checked by the engine and against every chosen set.
export default defineEventHandler(async (event) => {
  const { user, workspace } = await requireWorkspace(event, 'analyst')
  const workspaceId = workspace.id
  const body = await readValid(event, studyCreateSchema, { maxBytes: JSON_BODY_LIMITS.study })
  const { spec } = await validateStudy(useDB(), workspaceId, body)
  const [study] = await useDB().transaction(async (tx) => {
    const rows = await tx.insert(t.studies).values({
      workspaceId, name: body.name, description: body.description, spec, setIds: body.setIds,
      secondSetId: body.secondSetId, prescription: body.prescription, clPercent: body.clPercent, createdBy: user.id
    }).returning()
    await audit(tx, { workspaceId, actorId: user.id, action: 'study.created', subjectType: 'study', subjectId: rows[0]!.id, detail: { name: body.name } })
    return rows
  })
  setResponseStatus(event, 201)
  return publicStudy(study!)
})
