import { eq } from 'drizzle-orm'
import { tables as t } from '../../../../../database/client'

// Download the set file, byte for byte as stored.
export default defineEventHandler(async (event) => {
  const { set } = await requireSet(event, 'viewer')
  const [row] = await useDB().select({ content: t.errorSets.content }).from(t.errorSets).where(eq(t.errorSets.id, set.id))
  setResponseHeaders(event, {
    'content-type': 'application/octet-stream',
    'content-disposition': `attachment; filename="${set.fileName.replace(/[^\w.-]+/g, '_')}"`,
    'x-content-sha256': set.sha256
  })
  return row!.content
})
