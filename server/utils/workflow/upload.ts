import type { H3Event } from 'h3'

/** Upload limits in bytes; SHEAF_SET_MAX_BYTES and SHEAF_CSV_MAX_BYTES override them. */
export function uploadLimits() {
  const read = (name: string, fallback: number) => {
    const v = Number(process.env[name])
    return Number.isFinite(v) && v > 0 ? v : fallback
  }
  return { setBytes: read('SHEAF_SET_MAX_BYTES', 64 * 1024 * 1024), csvBytes: read('SHEAF_CSV_MAX_BYTES', 4 * 1024 * 1024) }
}

const mib = (bytes: number) => `${(bytes / 1024 / 1024).toFixed(bytes < 1024 * 1024 ? 2 : 0)} MiB`

function tooLarge(maxBytes: number): never {
  throw createError({ statusCode: 413, statusMessage: `The upload is larger than the limit of ${mib(maxBytes)}`, data: { maxBytes } })
}

/**
 * The request body as bytes, read from the stream with a running byte count: 413 as soon as it
 * passes `maxBytes` (before the whole body has arrived), or at once from a Content-Length over it.
 */
export async function readBodyLimited(event: H3Event, maxBytes: number): Promise<Buffer> {
  const declared = Number(getRequestHeader(event, 'content-length'))
  if (Number.isFinite(declared) && declared > maxBytes) tooLarge(maxBytes)
  const chunks: Buffer[] = []
  let total = 0
  for await (const chunk of event.node.req as AsyncIterable<Buffer>) {
    total += chunk.length
    if (total > maxBytes) {
      event.node.req.resume() // drain the rest without keeping it
      tooLarge(maxBytes)
    }
    chunks.push(chunk)
  }
  return Buffer.concat(chunks, total)
}

/** A multipart/form-data body (size-limited as readBodyLimited), parsed by the platform's FormData. */
export async function readUploadForm(event: H3Event, maxBytes: number): Promise<FormData> {
  const type = getRequestHeader(event, 'content-type') ?? ''
  if (!type.toLowerCase().startsWith('multipart/form-data')) {
    throw createError({ statusCode: 400, statusMessage: 'Send the file as multipart/form-data', data: { issues: [{ message: 'The request is not multipart/form-data' }] } })
  }
  const body = await readBodyLimited(event, maxBytes)
  try {
    return await new Response(body as unknown as BodyInit, { headers: { 'content-type': type } }).formData()
  } catch {
    throw createError({ statusCode: 400, statusMessage: 'The multipart body could not be read', data: { issues: [{ message: 'The multipart body is malformed' }] } })
  }
}

/** The file field `name` of a form, or 400 saying it is missing. */
export function formFile(form: FormData, name: string): File {
  const value = form.get(name)
  if (value === null || typeof value === 'string') {
    throw createError({ statusCode: 400, statusMessage: `Attach the file in the form field "${name}"`, data: { issues: [{ message: `No file in the form field "${name}"` }] } })
  }
  return value
}

/** A text field of a form, trimmed; undefined when absent or empty. */
export function formText(form: FormData, name: string): string | undefined {
  const value = form.get(name)
  if (typeof value !== 'string') return undefined
  const text = value.trim()
  return text === '' ? undefined : text
}
