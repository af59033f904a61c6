/**
 * Reading and writing error-set files for the command line: the engine parses and serialises,
 * this module adds the file name to its located messages.
 */
import { makeAlphas } from '../../shared/physics/alphas'
import { MZ_GEV } from '../../shared/physics/constants'
import { parseSetFile, writeSetFile } from '../../shared/physics/sets'
import type { ErrorSet, SetHeader } from '../../shared/physics/types'
import { BadInputError } from './errors'
import { readBytes, writeWhole, type CliIo } from './io'

/**
 * An error-set file, parsed and checked by the engine.
 * @throws BadInputError "<file>: <the engine's message>" (member, node, flavour or byte offset).
 */
export function loadSet(io: CliIo, file: string): ErrorSet {
  const bytes = readBytes(io, file)
  try {
    return parseSetFile(bytes)
  } catch (e) {
    throw new BadInputError(`${file}: ${(e as Error).message}`)
  }
}

/**
 * Writes an error set to `file` (whole or not at all).
 * @throws BadInputError naming the file if the engine refuses the set or the file cannot be written.
 */
export function saveSet(io: CliIo, file: string, set: ErrorSet): number {
  let bytes: Uint8Array
  try {
    bytes = writeSetFile(set)
  } catch (e) {
    throw new BadInputError(`${file}: the set cannot be written: ${(e as Error).message}`)
  }
  writeWhole(io, file, bytes)
  return bytes.length
}

/**
 * One-loop α_s(μ²) (μ² in GeV²) of a set's central member: its α_s(M_Z) run through its
 * flavour scheme — what kernels proportional to α_s (gg → H) take from the set.
 */
export function setAlphas(header: SetHeader): (q2GeV2: number) => number {
  return makeAlphas({ value: header.alphasMzCentral, scaleGeV2: MZ_GEV * MZ_GEV }, header.scheme)
}
