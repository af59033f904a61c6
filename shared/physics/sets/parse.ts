import type { ErrorSet, SetHeader } from '../types'
import { SetFormatError } from './errors'
import type { SetEncoding } from './format'
import { SET_FILE_MAGIC, SET_FILE_PREAMBLE_BYTES, SET_FORMAT_VERSIONS_READ, bytesPerValue } from './format'
import { formatPath } from '../json-path'
import { densityTargetProblem, fractionAxisOf, memorySetHeader, setFileHeaderSchema, setFileHeaderV1Schema } from './header'
import { checkFlavours, checkMemberCount, checkQ2Nodes, checkReplicaMean, checkValuesFinite, checkXNodes } from './validate'

/** A set file's header, decoded and checked, with where its body lies. */
export interface SetFileSummary {
  header: SetHeader
  x: Float64Array
  q2: Float64Array
  flavours: number[]
  encoding: SetEncoding
  /** Byte offset of the body. */
  bodyOffset: number
  /** Smallest and largest x and Q² (GeV²) of the grid. */
  range: { xMin: number, xMax: number, q2MinGeV2: number, q2MaxGeV2: number }
}

const isLittleEndian = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1

function decodeHeader(bytes: Uint8Array): { json: unknown, bodyOffset: number } {
  if (!(bytes instanceof Uint8Array)) throw new SetFormatError('a set file must be given as bytes (Uint8Array or Buffer)')
  const magic = new TextEncoder().encode(SET_FILE_MAGIC)
  if (bytes.length < SET_FILE_PREAMBLE_BYTES || magic.some((b, i) => bytes[i] !== b)) {
    const found = new TextDecoder('utf-8', { fatal: false }).decode(bytes.subarray(0, 16)).replace(/[^\x20-\x7e]/g, '?')
    throw new SetFormatError(`not a Sheaf error-set file: it must begin with the line "SHEAF-ERROR-SET" (found "${found}")`, { byteOffset: 0 })
  }
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength)
  const headerLength = view.getUint32(16, true)
  const bodyOffset = SET_FILE_PREAMBLE_BYTES + headerLength
  if (bodyOffset > bytes.length) {
    throw new SetFormatError(`the header length field says ${headerLength} bytes, but the file has only ${bytes.length - SET_FILE_PREAMBLE_BYTES} bytes after the length field: the file is truncated`, { byteOffset: 16 })
  }
  if (bodyOffset % 8 !== 0) {
    throw new SetFormatError(`the header length ${headerLength} does not end the header on an 8-byte boundary (20 + length must be a multiple of 8); pad the header with spaces`, { byteOffset: 16 })
  }
  let text: string
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes.subarray(SET_FILE_PREAMBLE_BYTES, bodyOffset))
  } catch {
    throw new SetFormatError('the header is not valid UTF-8 text', { byteOffset: SET_FILE_PREAMBLE_BYTES })
  }
  try {
    return { json: JSON.parse(text), bodyOffset }
  } catch (error) {
    const m = /position (\d+)/.exec((error as Error).message)
    const at = m ? SET_FILE_PREAMBLE_BYTES + new TextEncoder().encode(text.slice(0, Number(m[1]))).length : SET_FILE_PREAMBLE_BYTES
    throw new SetFormatError(`the header is not valid JSON: ${(error as Error).message}`, { byteOffset: at })
  }
}

/** A checked file header of either version, in memory form. */
interface CheckedHeader {
  header: SetHeader
  /** The momentum-fraction nodes (grid.x or grid.z) and where they are in the header. */
  fraction: number[]
  fractionPath: string
  q2GeV2: number[]
  flavours: number[]
  body: { encoding: SetEncoding, valueCount: number }
}

function checkHeader(json: unknown): CheckedHeader {
  const version = (json as { formatVersion?: unknown } | null)?.formatVersion
  if (typeof version === 'number' && !SET_FORMAT_VERSIONS_READ.includes(version)) {
    throw new SetFormatError(`formatVersion ${version} is not supported; this reader handles formatVersion ${SET_FORMAT_VERSIONS_READ.join(' and ')}`, { path: 'formatVersion', byteOffset: SET_FILE_PREAMBLE_BYTES })
  }
  const at = (path: string, message: string) => new SetFormatError(`header ${path}: ${message}`, { path, byteOffset: SET_FILE_PREAMBLE_BYTES })
  const parsed = version === 1 ? setFileHeaderV1Schema.safeParse(json) : setFileHeaderSchema.safeParse(json)
  if (!parsed.success) {
    const issue = parsed.error.issues[0]!
    const path = formatPath(issue.path)
    const what = issue.code === 'unrecognized_keys' ? `unknown key${issue.keys.length > 1 ? 's' : ''} ${issue.keys.join(', ')}` : issue.message
    throw new SetFormatError(`header ${path || '(top level)'}: ${what}`, { path: path || undefined, byteOffset: SET_FILE_PREAMBLE_BYTES })
  }
  const doc = parsed.data
  const { q2GeV2, flavours } = doc.grid
  if (doc.formatVersion === 1) {
    return { header: memorySetHeader(doc.set), fraction: doc.grid.x, fractionPath: 'grid.x', q2GeV2, flavours, body: doc.body }
  }
  const problem = densityTargetProblem(doc.set, 'set.')
  if (problem) throw at(problem.path, problem.message)
  const axis = fractionAxisOf(doc.set.density)
  const other = axis === 'x' ? 'z' : 'x'
  const what = axis === 'z' ? `a fragmentation set (into ${(doc.set.density as { hadron: string }).hadron}) names its momentum-fraction axis z` : 'a set of parton densities names its momentum-fraction axis x'
  if (doc.grid[other] !== undefined) throw at(`grid.${other}`, `${what}: write the nodes as grid.${axis}, not grid.${other}`)
  const fraction = doc.grid[axis]
  if (fraction === undefined) throw at(`grid.${axis}`, `${what}: grid.${axis} (the nodes) is missing`)
  return { header: memorySetHeader(doc.set), fraction, fractionPath: `grid.${axis}`, q2GeV2, flavours, body: doc.body }
}

/**
 * Reads and checks the header of a Sheaf set file (format.ts) without decoding the body:
 * magic line, header length, UTF-8 JSON, formatVersion (1 or 2), every header key (zod), the
 * density and target (version 2), the x (or z) and Q² nodes, the flavour list, the member count against the kind, and the body length.
 * Input: the file's bytes (a Node Buffer is a Uint8Array); nothing is read from disk.
 * Errors: SetFormatError with the byte offset and header path.
 * @example readSetHeader(bytes).header.kind // 'hessian-pairs'
 */
export function readSetHeader(bytes: Uint8Array): SetFileSummary {
  const { json, bodyOffset } = decodeHeader(bytes)
  const doc = checkHeader(json)
  const header = doc.header
  checkXNodes(doc.fraction, doc.fractionPath, fractionAxisOf(header.density))
  checkQ2Nodes(doc.q2GeV2, header.scheme)
  checkFlavours(doc.flavours)
  checkMemberCount(header)
  const nx = doc.fraction.length
  const nq = doc.q2GeV2.length
  const nf = doc.flavours.length
  const expected = header.memberCount * nq * nx * nf
  if (doc.body.valueCount !== expected) {
    throw new SetFormatError(`body.valueCount is ${doc.body.valueCount}; memberCount · nQ² · nx · nf = ${header.memberCount} · ${nq} · ${nx} · ${nf} = ${expected}`, { path: 'body.valueCount', byteOffset: SET_FILE_PREAMBLE_BYTES })
  }
  const size = bytesPerValue(doc.body.encoding)
  const bodyBytes = bytes.length - bodyOffset
  if (bodyBytes !== expected * size) {
    const perMember = nq * nx * nf * size
    const whole = Math.floor(bodyBytes / perMember)
    const detail = bodyBytes < expected * size
      ? `it is ${expected * size - bodyBytes} bytes short (room for ${whole} complete member${whole === 1 ? '' : 's'} of ${header.memberCount})`
      : `it has ${bodyBytes - expected * size} bytes too many`
    throw new SetFormatError(`the body must be ${expected * size} bytes (${expected} values × ${size} bytes) but is ${bodyBytes}: ${detail}`, { byteOffset: bodyOffset + Math.min(bodyBytes, expected * size), member: bodyBytes < expected * size ? whole : undefined })
  }
  const x = Float64Array.from(doc.fraction)
  const q2 = Float64Array.from(doc.q2GeV2)
  return {
    header,
    x,
    q2,
    flavours: [...doc.flavours],
    encoding: doc.body.encoding,
    bodyOffset,
    range: { xMin: x[0]!, xMax: x[nx - 1]!, q2MinGeV2: q2[0]!, q2MaxGeV2: q2[nq - 1]! }
  }
}

/**
 * Parses a Sheaf error-set file into an ErrorSet (members as new Float64Arrays, central first).
 * Checks everything {@link readSetHeader} checks, then that every value is finite (the error
 * names member, Q² node, x node, flavour and byte offset), and for replica sets whose member 0
 * is declared the mean, that it is. Float32 bodies are widened to Float64 exactly.
 * Errors: SetFormatError (a RangeError) with the location fields set.
 * @example const set = parseSetFile(new Uint8Array(await file.arrayBuffer()))
 */
export function parseSetFile(bytes: Uint8Array): ErrorSet {
  const summary = readSetHeader(bytes)
  const { header, x, q2, flavours, encoding, bodyOffset } = summary
  const perMember = x.length * q2.length * flavours.length
  const size = bytesPerValue(encoding)
  const count = header.memberCount * perMember
  const all = new Float64Array(count)
  if (encoding === 'float64-le' && isLittleEndian) {
    new Uint8Array(all.buffer).set(bytes.subarray(bodyOffset, bodyOffset + count * 8))
  } else {
    const view = new DataView(bytes.buffer, bytes.byteOffset + bodyOffset, count * size)
    for (let i = 0; i < count; i++) all[i] = size === 8 ? view.getFloat64(i * 8, true) : view.getFloat32(i * 4, true)
  }
  const members: Float64Array[] = []
  for (let k = 0; k < header.memberCount; k++) members.push(all.subarray(k * perMember, (k + 1) * perMember))
  checkValuesFinite(members, q2.length, x.length, flavours, i => bodyOffset + i * size)
  checkReplicaMean(header, members, q2.length, x.length, flavours, size === 8 ? 1e-6 : 1e-4)
  return { header, x, q2, flavours, members }
}
