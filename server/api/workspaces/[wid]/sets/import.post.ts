import { eq } from 'drizzle-orm'
import { tables as t } from '../../../../database/client'
import { publicSet, setColumns } from '../../../../domain/sets/library'
import { parseTableHeader, readSetTable, storeImportedSet } from '../../../../domain/sets/table-import'

// Import an error set from a neutral table (analysts): multipart with the table in `file` (CSV,
// TSV, gzipped or not, or Parquet; long or wide layout) and the set header as the JSON field
// `header` or the JSON file `sidecar`. The table is streamed to a temporary file and read twice
// (check, then fill); a bad table answers 400 with data.issues located by line and column (or
// row group and row) and stores nothing.
export default defineEventHandler(async (event) => {
  const { user, workspace } = await requireWorkspace(event, 'analyst')
  const upload = await readTableUpload(event)
  try {
    const header = parseTableHeader(upload.sidecar ?? upload.fields.get('header'), upload.sidecar !== undefined ? 'The sidecar' : 'The header field')
    const fileName = upload.fileName || 'table.csv'
    const { bytes, set, stats } = await readSetTable(upload.path, fileName, header, uploadLimits().setBytes)
    const storedName = `${fileName.replace(/\.(csv|tsv|parquet)(\.gz)?$/i, '')}.sheafset`.slice(0, 255)
    const id = await storeImportedSet(useDB(), { workspaceId: workspace.id, userId: user.id, fileName: storedName, bytes, header: set.header, stats })
    const [row] = await useDB().select(setColumns).from(t.errorSets).where(eq(t.errorSets.id, id))
    setResponseStatus(event, 201)
    return { ...publicSet(row!, { id: user.id, name: user.name }), import: stats }
  } finally {
    await upload.cleanup()
  }
})
