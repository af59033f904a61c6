import { eq } from 'drizzle-orm'
import { tables as t } from '../../../../database/client'
import { parseSetFile } from '../../../../../shared/physics/sets/parse'

// Upload a set file (analysts): multipart field `file`, optional `name`. The engine parses and
// checks every member; a bad file answers 400 with data.issues and stores nothing.
// Membership is checked before the body is read, so no one outside the workspace can make the
// server buffer an upload.
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  await requireMembership(workspaceId, user.id, 'analyst')
  const form = await readUploadForm(event, uploadLimits().setBytes)
  const file = formFile(form, 'file')
  const bytes = new Uint8Array(await file.arrayBuffer())
  let header
  try {
    header = parseSetFile(bytes).header
  } catch (err) {
    throw setFileRejection(err, file.name)
  }
  const name = formText(form, 'name') ?? header.name
  await assertSetNameFree(workspaceId, name, header.version)
  const id = await useDB().transaction(async (tx) => {
    const setId = await insertErrorSet(tx, { workspaceId, name, fileName: file.name || `${name}.sheafset`, bytes, origin: 'upload', addedBy: user.id })
    await audit({ workspaceId, actorId: user.id, action: 'set.uploaded', subjectType: 'error_set', subjectId: setId, detail: { name, version: header.version, bytes: bytes.byteLength } }, tx)
    return setId
  })
  const [row] = await useDB().select(setColumns).from(t.errorSets).where(eq(t.errorSets.id, id))
  setResponseStatus(event, 201)
  return publicSet(row!, { id: user.id, name: user.name })
})
