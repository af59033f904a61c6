/**
 * The command line's side effects: where text goes (injected, so tests run verbs in-process) and
 * the file system (the only place in shared/ that touches files).
 */
import { randomBytes } from 'node:crypto'
import { readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs'
import { basename, dirname, join, resolve } from 'node:path'
import { BadInputError } from './errors'
import { parseJsonText } from './json-text'

/** Where a verb writes: stdout for results, stderr for messages. Each call gets whole lines. */
export interface CliIo {
  stdout: (text: string) => void
  stderr: (text: string) => void
  /** Directory relative file names are resolved against (default: process.cwd()). */
  cwd?: string
}

/** The process's own streams. */
export const processIo: CliIo = {
  stdout: text => { process.stdout.write(text) },
  stderr: text => { process.stderr.write(text) }
}

/** Absolute path of a file argument. */
export function resolvePath(io: CliIo, file: string): string {
  return resolve(io.cwd ?? process.cwd(), file)
}

function fileProblem(file: string, error: unknown, writing = false): BadInputError {
  const code = (error as NodeJS.ErrnoException).code
  const why = code === 'ENOENT' ? (writing ? `cannot write: the folder ${dirname(file)} does not exist` : 'no such file')
    : code === 'EISDIR' ? 'is a directory, not a file'
      : code === 'EACCES' ? 'permission denied'
        : (error as Error).message
  return new BadInputError(`${file}: ${why}`)
}

/**
 * The bytes of a file the user named.
 * @throws BadInputError "<file>: no such file" and the like.
 */
export function readBytes(io: CliIo, file: string): Uint8Array {
  try {
    return readFileSync(resolvePath(io, file))
  } catch (e) {
    throw fileProblem(file, e)
  }
}

/** A UTF-8 text file (a leading byte-order mark is dropped). */
export function readText(io: CliIo, file: string): string {
  const text = new TextDecoder('utf-8').decode(readBytes(io, file))
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text
}

/**
 * A JSON file, parsed.
 * @throws BadInputError naming the file, and the line and column of a syntax error.
 */
export function readJson(io: CliIo, file: string): unknown {
  const text = readText(io, file)
  try {
    return parseJsonText(text, file)
  } catch (e) {
    throw new BadInputError((e as Error).message)
  }
}

/**
 * Writes a file whole or not at all: into a temporary sibling first, then renamed over the
 * target, so a failure never leaves a half-written file behind.
 * @throws BadInputError naming the file when its folder is missing or not writable.
 */
export function writeWhole(io: CliIo, file: string, data: Uint8Array | string): void {
  const target = resolvePath(io, file)
  const temporary = join(dirname(target), `.${basename(target)}.${randomBytes(6).toString('hex')}.partial`)
  try {
    writeFileSync(temporary, data)
    renameSync(temporary, target)
  } catch (e) {
    rmSync(temporary, { force: true })
    throw fileProblem(file, e, true)
  }
}
