import { readFile } from 'node:fs/promises'
import { join } from 'node:path'
import { SAMPLE_FILES } from '../../../domain/examples/examples'

// One of the sample files of samples/ (signed-in users): only the names listed in SAMPLE_FILES,
// so no path from the request reaches the file system. 404 for anything else.
export default defineEventHandler(async (event) => {
  requireUser(event)
  const folder = getRouterParam(event, 'folder') ?? ''
  const file = getRouterParam(event, 'file') ?? ''
  if (!Object.hasOwn(SAMPLE_FILES, folder) || !SAMPLE_FILES[folder]!.includes(file)) {
    throw createError({ statusCode: 404, statusMessage: `No sample file ${folder}/${file}`, data: { samples: Object.entries(SAMPLE_FILES).flatMap(([d, fs]) => fs.map(f => `${d}/${f}`)) } })
  }
  let bytes: Buffer
  try {
    bytes = await readFile(join(process.cwd(), 'samples', folder, file))
  } catch {
    throw createError({ statusCode: 404, statusMessage: `The sample file ${folder}/${file} is not installed with this server` })
  }
  const type = file.endsWith('.csv') ? 'text/csv; charset=utf-8' : file.endsWith('.json') ? 'application/json; charset=utf-8' : 'application/octet-stream'
  setResponseHeaders(event, { 'content-type': type, 'content-disposition': `attachment; filename="${file}"` })
  return bytes
})
