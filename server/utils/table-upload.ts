// The set-table upload: multipart/form-data whose `file` part is streamed to a temporary file
// (never held in memory), with the limit enforced while it arrives, and small text parts (the
// `header` field, the `sidecar` JSON file, an optional `name`) kept in memory up to 64 KiB each.
import { createWriteStream } from 'node:fs'
import { mkdtemp, rm } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import busboy from 'busboy'
import type { H3Event } from 'h3'

/** Largest table file accepted, bytes (SHEAF_TABLE_MAX_BYTES, default 512 MiB: a 200 MB table with room). */
export function tableUploadLimit() {
  const v = Number(process.env.SHEAF_TABLE_MAX_BYTES)
  return Number.isFinite(v) && v > 0 ? v : 512 * 1024 * 1024
}

const SMALL = 64 * 1024

export interface TableUpload {
  /** Path of the temporary copy of the `file` part. */
  path: string
  fileName: string
  fields: Map<string, string>
  /** The `sidecar` file's text, if one was sent. */
  sidecar?: string
  /** Removes the temporary file; call it in a finally. */
  cleanup: () => Promise<void>
}

const bad = (message: string) => createError({ statusCode: 400, statusMessage: message, data: { issues: [{ message }] } })

/** Reads the table upload; 400 when not multipart or without `file`, 413 past `maxBytes` (the rest is not read). */
export async function readTableUpload(event: H3Event, maxBytes = tableUploadLimit()): Promise<TableUpload> {
  const type = getRequestHeader(event, 'content-type') ?? ''
  if (!type.toLowerCase().startsWith('multipart/form-data')) throw bad('Send the table as multipart/form-data with the file in the field "file"')
  const declared = Number(getRequestHeader(event, 'content-length'))
  const tooLarge = () => createError({ statusCode: 413, statusMessage: `The table is larger than the limit of ${Math.round(maxBytes / 1048576)} MiB`, data: { maxBytes } })
  if (Number.isFinite(declared) && declared > maxBytes + SMALL * 4) throw tooLarge()
  const dir = await mkdtemp(join(tmpdir(), 'sheaf-table-'))
  const path = join(dir, 'upload')
  const cleanup = () => rm(dir, { recursive: true, force: true })
  const req = event.node.req
  try {
    return await new Promise<TableUpload>((resolve, reject) => {
      let parser: busboy.Busboy
      try {
        parser = busboy({ headers: req.headers, limits: { fileSize: maxBytes, files: 2, fields: 10, fieldSize: SMALL } })
      } catch (err) {
        return reject(bad(`The multipart body could not be read: ${(err as Error).message}`))
      }
      const upload: TableUpload = { path, fileName: '', fields: new Map(), cleanup }
      let failed = false
      let gotFile = false
      let pending = 0
      let closed = false
      const stop = (err: Error) => {
        if (failed) return
        failed = true
        req.unpipe(parser)
        req.resume()
        reject(err)
      }
      const done = () => {
        if (failed || !closed || pending) return
        if (!gotFile) return stop(createError({ statusCode: 400, statusMessage: 'Attach the table in the form field "file"', data: { issues: [{ message: 'No file in the form field "file"' }] } }))
        resolve(upload)
      }
      parser.on('file', (field, stream, info) => {
        if (field === 'file' && !gotFile) {
          gotFile = true
          pending++
          upload.fileName = info.filename ?? ''
          const out = createWriteStream(path)
          stream.on('limit', () => { out.destroy(); stop(tooLarge()) })
          stream.pipe(out)
          out.on('error', err => stop(err))
          out.on('finish', () => { pending--; done() })
        } else if (field === 'sidecar') {
          const chunks: Buffer[] = []
          let size = 0
          pending++
          stream.on('data', (c: Buffer) => {
            size += c.length
            if (size > SMALL) return stop(createError({ statusCode: 413, statusMessage: 'The sidecar file is longer than 64 KiB' }))
            chunks.push(c)
          })
          stream.on('end', () => { upload.sidecar = Buffer.concat(chunks).toString('utf8'); pending--; done() })
        } else {
          stream.resume()
          stop(bad(`Unexpected file field "${field}": send the table as "file" and the header as "sidecar" or the field "header"`))
        }
      })
      parser.on('field', (name, value, info) => {
        if (info.valueTruncated) return stop(createError({ statusCode: 413, statusMessage: `The form field "${name}" is longer than 64 KiB` }))
        upload.fields.set(name, value)
      })
      parser.on('filesLimit', () => stop(bad('Send at most the table and its sidecar')))
      parser.on('fieldsLimit', () => stop(bad('Send at most 10 form fields')))
      parser.on('error', (err: Error) => stop(bad(`The multipart body could not be read: ${err.message}`)))
      parser.on('close', () => { closed = true; done() })
      req.pipe(parser)
    })
  } catch (err) {
    await cleanup()
    throw err
  }
}
