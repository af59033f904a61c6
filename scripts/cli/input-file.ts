/**
 * Reading a parametrised input (or a nuclear modification with its baseline) for the command
 * line, with the engine's located messages prefixed by the file name.
 */
import { dirname, join } from 'node:path'
import { compileInput, parseInputDocument, type InputDocument, type InputModel } from '../../shared/physics/input'
import { BadInputError } from './errors'
import { readJson, type CliIo } from './io'

function readDocument(io: CliIo, file: string): InputDocument {
  const json = readJson(io, file)
  try {
    return parseInputDocument(json, file)
  } catch (e) {
    throw new BadInputError((e as Error).message)
  }
}

/**
 * The compiled model of an input file. A nuclear modification takes its baseline from
 * `baselineFile`, else from the file its `baseline.file` names (relative to the input's folder).
 * @throws BadInputError "<file>: <JSON path>: <problem>" (the engine's InputError), or naming the
 * missing baseline.
 */
export function loadModel(io: CliIo, file: string, baselineFile?: string, nucleus?: { z: number, a: number }): InputModel {
  const document = readDocument(io, file)
  let baseline: InputDocument | undefined
  if (document.kind === 'nuclear') {
    const named = baselineFile ?? (document.doc.baseline.file === undefined ? undefined : join(dirname(file), document.doc.baseline.file))
    if (named === undefined) {
      throw new BadInputError(`${file}: baseline: this nuclear modification of "${document.doc.baseline.name}" names no baseline file; give it with --baseline <input.json>`)
    }
    baseline = readDocument(io, named)
  }
  try {
    return compileInput(document, baseline, file, nucleus ? { nucleus } : {})
  } catch (e) {
    throw new BadInputError((e as Error).message)
  }
}
