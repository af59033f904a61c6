import type { ErrorSet } from '../types'
import { SetFormatError } from './errors'
import type { SetEncoding } from './format'
import { SET_BODY_ORDER, SET_FILE_MAGIC, SET_FILE_PREAMBLE_BYTES, SET_FORMAT_VERSION, bytesPerValue } from './format'
import type { SetFileHeader } from './header'
import { formatPath } from '../json-path'
import { NO_TARGET, cleanHeader, fileSetHeader, fractionAxisOf, setHeaderSchema } from './header'
import { checkFlavours, checkMemberCount, checkQ2Nodes, checkReplicaMean, checkValuesFinite, checkXNodes } from './validate'

/** Options of {@link writeSetFile}. */
export interface WriteSetOptions {
  /** Body encoding (default 'float64-le', bit-exact). 'float32-le' halves the size and rounds each value to single precision. */
  encoding?: SetEncoding
}

const isLittleEndian = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1

/**
 * Checks an in-memory error set against every rule of the file format (the rules the parser
 * applies), throwing a SetFormatError naming member, node, flavour and header path.
 * @example validateErrorSet(set) // throws if, say, member 3 holds a NaN
 */
export function validateErrorSet(set: ErrorSet, relTolerance = 1e-6): void {
  const parsed = setHeaderSchema.safeParse(cleanHeader(set.header))
  if (!parsed.success) {
    const issue = parsed.error.issues[0]!
    const path = `set.${formatPath(issue.path)}`
    throw new SetFormatError(`header ${path}: ${issue.code === 'unrecognized_keys' ? `unknown keys ${issue.keys.join(', ')}` : issue.message}`, { path })
  }
  const axis = fractionAxisOf(set.header.density)
  if (axis === 'z' && (set.header.target.type !== NO_TARGET.type || Object.keys(set.header.target).length !== 1)) {
    throw new SetFormatError('header set.target: a fragmentation set has no target; in memory it carries the neutral { type: "proton" } (NO_TARGET), never a nucleus', { path: 'set.target' })
  }
  checkXNodes(set.x, `grid.${axis}`, axis)
  checkQ2Nodes(set.q2, set.header.scheme)
  checkFlavours(set.flavours)
  checkMemberCount(set.header)
  if (set.members.length !== set.header.memberCount) {
    throw new SetFormatError(`the header says memberCount ${set.header.memberCount} but the set holds ${set.members.length} members`, { path: 'set.memberCount' })
  }
  const perMember = set.x.length * set.q2.length * set.flavours.length
  set.members.forEach((m, k) => {
    if (m.length !== perMember) throw new SetFormatError(`member ${k} has ${m.length} values; the grid needs nx · nQ² · nf = ${perMember}`, { member: k })
  })
  checkValuesFinite(set.members, set.q2.length, set.x.length, set.flavours)
  checkReplicaMean(set.header, set.members, set.q2.length, set.x.length, set.flavours, relTolerance)
}

/**
 * Serialises an error set in Sheaf's set-file format, version 2 (format.ts), after
 * {@link validateErrorSet}: `set.density` always written, a fragmentation set's nodes as grid.z
 * and without a target.
 * With the default Float64 encoding, parseSetFile(writeSetFile(set)) reproduces every number
 * bit for bit (JSON numbers round-trip IEEE doubles exactly; the body is copied as bytes).
 * Returns a new Uint8Array; nothing is written to disk.
 * @example const bytes = writeSetFile(set) // then fs.writeFile('toy.sheafset', bytes) in the CLI
 */
export function writeSetFile(set: ErrorSet, options: WriteSetOptions = {}): Uint8Array {
  const encoding = options.encoding ?? 'float64-le'
  validateErrorSet(set, encoding === 'float64-le' ? 1e-6 : 1e-4)
  const perMember = set.x.length * set.q2.length * set.flavours.length
  const count = perMember * set.members.length
  const fraction = Array.from(set.x)
  const doc: SetFileHeader = {
    formatVersion: SET_FORMAT_VERSION,
    set: fileSetHeader(set.header),
    grid: fractionAxisOf(set.header.density) === 'z'
      ? { z: fraction, q2GeV2: Array.from(set.q2), flavours: [...set.flavours] }
      : { x: fraction, q2GeV2: Array.from(set.q2), flavours: [...set.flavours] },
    body: { encoding, order: SET_BODY_ORDER, valueCount: count }
  }
  const size = bytesPerValue(encoding)
  const body = new Uint8Array(count * size)
  if (encoding === 'float64-le' && isLittleEndian) {
    set.members.forEach((m, k) => body.set(new Uint8Array(m.buffer, m.byteOffset, m.byteLength), k * perMember * 8))
  } else {
    const view = new DataView(body.buffer)
    let i = 0
    for (const m of set.members) {
      for (let t = 0; t < m.length; t++, i++) {
        if (size === 8) view.setFloat64(i * 8, m[t]!, true)
        else view.setFloat32(i * 4, m[t]!, true)
      }
    }
  }
  return assembleSetFile(doc, body)
}

/**
 * Assembles the bytes of a set file from a header object and an already-encoded body, WITHOUT
 * any check: magic line, header length, the header as JSON padded with spaces to an 8-byte
 * boundary, then the body. {@link writeSetFile} uses it after validating; tests and the sample
 * script use it to produce deliberately malformed files.
 * @example assembleSetFile({ formatVersion: 1 }, new Uint8Array(0)) // a file the parser refuses
 */
export function assembleSetFile(header: unknown, body: Uint8Array): Uint8Array {
  const json = new TextEncoder().encode(JSON.stringify(header))
  const padded = Math.ceil((SET_FILE_PREAMBLE_BYTES + json.length) / 8) * 8 - SET_FILE_PREAMBLE_BYTES
  const bodyOffset = SET_FILE_PREAMBLE_BYTES + padded
  const out = new Uint8Array(bodyOffset + body.length)
  out.set(new TextEncoder().encode(SET_FILE_MAGIC), 0)
  new DataView(out.buffer).setUint32(16, padded, true)
  out.set(json, SET_FILE_PREAMBLE_BYTES)
  out.fill(0x20, SET_FILE_PREAMBLE_BYTES + json.length, bodyOffset)
  out.set(body, bodyOffset)
  return out
}
