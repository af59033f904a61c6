import { eq } from 'drizzle-orm'
import { tables as t } from '../../../../../database/client'

// Download the set file, byte for byte as stored.
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  const setId = uuidParam(event, 'sid', 'Error set')
  const { set } = await requireSet(workspaceId, setId, user.id, 'viewer')
  const [row] = await useDB().select({ content: t.errorSets.content }).from(t.errorSets).where(eq(t.errorSets.id, set.id))
  setResponseHeaders(event, {
    'content-type': 'application/octet-stream',
    'content-disposition': `attachment; filename="${set.fileName.replace(/[^\w.-]+/g, '_')}"`,
    'x-content-sha256': set.sha256
  })
  return row!.content
})
