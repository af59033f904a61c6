// Reading uploads: multipart/form-data streamed through busboy with the limits enforced while
// reading (413 as soon as a file passes its limit, before the rest arrives), and the measurement
// upload, which comes as JSON or as multipart.
import busboy from 'busboy'
import type { H3Event } from 'h3'
import type { MeasurementUpload } from '../domain/measurements/measurements'
import { measurementJsonSchema } from '../../shared/utils/workflow-schemas'

/** Upload limits in bytes; SHEAF_SET_MAX_BYTES and SHEAF_CSV_MAX_BYTES override them. */
export function uploadLimits() {
  const read = (name: string, fallback: number) => {
    const v = Number(process.env[name])
    return Number.isFinite(v) && v > 0 ? v : fallback
  }
  return { setBytes: read('SHEAF_SET_MAX_BYTES', 64 * 1024 * 1024), csvBytes: read('SHEAF_CSV_MAX_BYTES', 4 * 1024 * 1024) }
}

const mib = (bytes: number) => `${(bytes / 1024 / 1024).toFixed(bytes < 1024 * 1024 ? 2 : 0)} MiB`

const tooLarge = (maxBytes: number) =>
  createError({ statusCode: 413, statusMessage: `The upload is larger than the limit of ${mib(maxBytes)}`, data: { maxBytes } })

const malformed = (message: string) =>
  createError({ statusCode: 400, statusMessage: 'The multipart body could not be read', data: { issues: [{ message }] } })

export interface UploadedFile { name: string, bytes: Buffer, text: () => string }
export interface UploadForm { files: Map<string, UploadedFile>, fields: Map<string, string> }

/**
 * A multipart/form-data body: files and text fields, at most `maxBytes` in all (the
 * Content-Length is checked first, then every chunk as it arrives), at most 4 files and 20
 * fields of 64 KiB. 400 for a body that is not multipart or is malformed.
 */
export async function readUploadForm(event: H3Event, maxBytes: number): Promise<UploadForm> {
  const type = getRequestHeader(event, 'content-type') ?? ''
  if (!type.toLowerCase().startsWith('multipart/form-data')) {
    throw createError({ statusCode: 400, statusMessage: 'Send the file as multipart/form-data', data: { issues: [{ message: 'The request is not multipart/form-data' }] } })
  }
  const declared = Number(getRequestHeader(event, 'content-length'))
  if (Number.isFinite(declared) && declared > maxBytes + 64 * 1024) throw tooLarge(maxBytes)
  const req = event.node.req
  let parser: busboy.Busboy
  try {
    parser = busboy({ headers: req.headers, limits: { fileSize: maxBytes, files: 4, fields: 20, fieldSize: 64 * 1024 } })
  } catch (err) {
    throw malformed((err as Error).message)
  }
  return new Promise<UploadForm>((resolve, reject) => {
    const form: UploadForm = { files: new Map(), fields: new Map() }
    let total = 0
    let failed = false
    const stop = (err: Error) => {
      if (failed) return
      failed = true
      req.unpipe(parser)
      req.resume() // drain the rest without keeping it
      reject(err)
    }
    parser.on('file', (field, stream, info) => {
      const chunks: Buffer[] = []
      stream.on('data', (chunk: Buffer) => {
        total += chunk.length
        if (total > maxBytes) return stop(tooLarge(maxBytes))
        chunks.push(chunk)
      })
      stream.on('limit', () => stop(tooLarge(maxBytes)))
      stream.on('end', () => {
        const bytes = Buffer.concat(chunks)
        form.files.set(field, { name: info.filename ?? '', bytes, text: () => bytes.toString('utf8') })
      })
    })
    parser.on('field', (name, value, info) => {
      if (info.valueTruncated) return stop(createError({ statusCode: 413, statusMessage: `The form field "${name}" is longer than 64 KiB` }))
      form.fields.set(name, value)
    })
    parser.on('filesLimit', () => stop(malformed('Send at most 4 files in one request')))
    parser.on('fieldsLimit', () => stop(malformed('Send at most 20 form fields in one request')))
    parser.on('error', (err: Error) => stop(malformed(err.message)))
    parser.on('close', () => {
      if (!failed) resolve(form)
    })
    req.pipe(parser)
  })
}

/** The file field `name` of a form, or 400 saying it is missing. */
export function formFile(form: UploadForm, name: string): UploadedFile {
  const file = form.files.get(name)
  if (!file) {
    throw createError({ statusCode: 400, statusMessage: `Attach the file in the form field "${name}"`, data: { issues: [{ message: `No file in the form field "${name}"` }] } })
  }
  return file
}

/** A text field of a form, trimmed; undefined when absent or empty. */
export function formText(form: UploadForm, name: string): string | undefined {
  const text = form.fields.get(name)?.trim()
  return text ? text : undefined
}

/**
 * The measurement upload as JSON (measurementJsonSchema) or multipart (files `points`,
 * `correlation`); either way at most the CSV limit (SHEAF_CSV_MAX_BYTES, default 4 MiB).
 */
export async function readMeasurementUpload(event: H3Event): Promise<MeasurementUpload> {
  const type = getRequestHeader(event, 'content-type') ?? ''
  if (!type.toLowerCase().startsWith('multipart/form-data')) return readValid(event, measurementJsonSchema, { maxBytes: uploadLimits().csvBytes })
  const form = await readUploadForm(event, uploadLimits().csvBytes)
  const points = formFile(form, 'points')
  const correlationFile = form.files.get('correlation')
  const correlationText = formText(form, 'correlation')
  const value = {
    name: formText(form, 'name') ?? points.name.replace(/\.[^.]*$/, ''),
    csv: points.text(),
    ...(correlationFile ? { correlation: correlationFile.text() } : correlationText ? { correlation: correlationText } : {}),
    ...(formText(form, 'correlationOf') ? { correlationOf: formText(form, 'correlationOf') } : {}),
    ...(formText(form, 'systCombination') ? { systCombination: formText(form, 'systCombination') } : {})
  }
  const parsed = measurementJsonSchema.safeParse(value)
  if (!parsed.success) {
    throw createError({ statusCode: 400, statusMessage: 'Check the highlighted fields', data: { fields: Object.fromEntries(parsed.error.issues.map(i => [i.path.join('.'), i.message])) } })
  }
  return parsed.data
}
