/**
 * Float64 arrays to and from PostgreSQL bytea (a Node Buffer), little-endian, 8 bytes a value.
 * No Nitro imports: the worker writes with these and the server reads.
 */
import { endianness } from 'node:os'

if (endianness() !== 'LE') throw new Error('Sheaf stores member values little-endian and needs a little-endian host')

/** The bytes of `values` (copied, so later changes to the array do not leak into the row). */
export function float64ToBytes(values: Float64Array): Buffer {
  return Buffer.from(values.buffer.slice(values.byteOffset, values.byteOffset + values.byteLength))
}

/** The Float64Array stored in `bytes`; RangeError when the length is not a multiple of 8. */
export function bytesToFloat64(bytes: Uint8Array): Float64Array {
  if (bytes.byteLength % 8 !== 0) throw new RangeError(`Stored member values have ${bytes.byteLength} bytes, not a multiple of 8`)
  // pg's Buffers share a pool, so the offset may not be 8-aligned: copy into a fresh buffer.
  const copy = new Uint8Array(bytes.byteLength)
  copy.set(bytes)
  return new Float64Array(copy.buffer)
}
