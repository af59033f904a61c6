import type { Pdg } from '../types'

/** Where in a set file (or in-memory set) a problem was found. */
export interface SetFormatLocation {
  /** Member index (0 = central). */
  member?: number
  /** x node index. */
  xIndex?: number
  /** Q² node index. */
  q2Index?: number
  /** PDG code of the flavour. */
  flavour?: Pdg
  /** Byte offset in the file. */
  byteOffset?: number
  /** Path in the JSON header, e.g. "set.kind" or "grid.x[3]". */
  path?: string
}

/**
 * A set file (or an in-memory set) that breaks the format: the message says what is wrong and
 * where, and the location fields say it again for programs (routes return them as `data`).
 * A RangeError, following the engine's policy for bad input.
 * @example new SetFormatError('x node 3 is 1.2; x nodes must lie in (0, 1)', { xIndex: 3, path: 'grid.x[3]' })
 */
export class SetFormatError extends RangeError implements SetFormatLocation {
  readonly member?: number
  readonly xIndex?: number
  readonly q2Index?: number
  readonly flavour?: Pdg
  readonly byteOffset?: number
  readonly path?: string

  constructor(message: string, location: SetFormatLocation = {}) {
    super(message)
    this.name = 'SetFormatError'
    this.member = location.member
    this.xIndex = location.xIndex
    this.q2Index = location.q2Index
    this.flavour = location.flavour
    this.byteOffset = location.byteOffset
    this.path = location.path
  }

  /** Plain object for a 4xx response body: the message and the location fields that are set. */
  toJSON(): SetFormatLocation & { message: string } {
    const out: SetFormatLocation & { message: string } = { message: this.message }
    for (const key of ['member', 'xIndex', 'q2Index', 'flavour', 'byteOffset', 'path'] as const) {
      if (this[key] !== undefined) (out as unknown as Record<string, unknown>)[key] = this[key]
    }
    return out
  }
}
