import { tables as t } from '../../../../database/client'

// Create a study (analysts): the spec is checked by the engine and against every chosen set.
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  const body = await readValid(event, studyCreateSchema)
  await requireMembership(workspaceId, user.id, 'analyst')
  const { spec } = await validateStudy(workspaceId, body)
  const [study] = await useDB().transaction(async (tx) => {
    const rows = await tx.insert(t.studies).values({
      workspaceId, name: body.name, description: body.description, spec, setIds: body.setIds,
      secondSetId: body.secondSetId, prescription: body.prescription, clPercent: body.clPercent, createdBy: user.id
    }).returning()
    await audit({ workspaceId, actorId: user.id, action: 'study.created', subjectType: 'study', subjectId: rows[0]!.id, detail: { name: body.name } }, tx)
    return rows
  })
  setResponseStatus(event, 201)
  return publicStudy(study!)
})
