import { eq } from 'drizzle-orm'
import { tables as t } from '../../../../database/client'
import { parseSetFile } from '../../../../../shared/physics/sets/parse'
import { assertSetNameFree, assertStorableHeader, publicSet, setColumns, whileSetNameFree } from '../../../../domain/sets/library'
import { insertErrorSet } from '../../../../domain/sets/store'
import { audit } from '../../../../domain/audit'
import { fail, setFileRejection } from '../../../../domain/errors'

// Upload a set file (analysts): multipart field `file`, optional `name`. The engine parses and
// checks every member; a bad file answers 400 with data.issues and stores nothing.
// Membership is checked before the body is read, so no one outside the workspace can make the
// server read an upload; the body is streamed with the size limit enforced while reading.
// Two uploads racing for one name: one is stored, the other answers 409.
export default defineEventHandler(async (event) => {
  const { user, workspace } = await requireWorkspace(event, 'analyst')
  const workspaceId = workspace.id
  const form = await readUploadForm(event, uploadLimits().setBytes)
  const file = formFile(form, 'file')
  const fields = setUploadFieldsSchema.safeParse({ name: formText(form, 'name'), fileName: file.name })
  if (!fields.success) fail(400, 'Check the highlighted fields', { fields: fieldErrors(fields.error) })
  const bytes = new Uint8Array(file.bytes.buffer, file.bytes.byteOffset, file.bytes.byteLength)
  let header
  try {
    header = parseSetFile(bytes).header
  } catch (err) {
    throw setFileRejection(err, fields.data.fileName)
  }
  assertStorableHeader(header, fields.data.fileName)
  const name = fields.data.name ?? header.name
  await assertSetNameFree(useDB(), workspaceId, name, header.version)
  const id = await whileSetNameFree(name, header.version, () => useDB().transaction(async (tx) => {
    const setId = await insertErrorSet(tx, { workspaceId, name, fileName: fields.data.fileName || `${name}.sheafset`, bytes, origin: 'upload', addedBy: user.id })
    await audit(tx, { workspaceId, actorId: user.id, action: 'set.uploaded', subjectType: 'error_set', subjectId: setId, detail: { name, version: header.version, bytes: bytes.byteLength } })
    return setId
  }))
  const [row] = await useDB().select(setColumns).from(t.errorSets).where(eq(t.errorSets.id, id))
  setResponseStatus(event, 201)
  return publicSet(row!, { id: user.id, name: user.name })
})
