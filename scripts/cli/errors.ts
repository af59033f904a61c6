/**
 * The two ways a command can fail on the user's side. Anything the entry catches is printed as
 * one line `sheaf: <message>`; the class decides the exit code.
 */

/** Exit codes of the command line. */
export const EXIT = { ok: 0, badInput: 1, usage: 2 } as const

/**
 * Wrong use of the command line itself: unknown verb or option, a missing or malformed argument.
 * Exit code 2.
 * @example throw new UsageError("evolve needs an input file; see 'sheaf evolve --help'.")
 */
export class UsageError extends Error {
  override name = 'UsageError'
}

/**
 * A file the user named cannot be used: missing, unreadable, not JSON, or refused by the engine.
 * The message names the file and, where known, the line and column. Exit code 1.
 * @example throw new BadInputError('fit.json: not valid JSON at line 3, column 9 (Expected \',\' or \'}\')')
 */
export class BadInputError extends Error {
  override name = 'BadInputError'
}

/**
 * The exit code and the one-line message for anything thrown by a verb. Usage errors → 2; every
 * other error (ours, the engine's RangeErrors, the file system's) → 1, reduced to its first line
 * so that no stack trace or multi-line dump reaches the terminal.
 * @example describeFailure(new RangeError('Bin 3 does not exist')) // { code: 1, message: 'Bin 3 does not exist' }
 */
export function describeFailure(error: unknown): { code: number, message: string } {
  const code = error instanceof UsageError ? EXIT.usage : EXIT.badInput
  const raw = error instanceof Error ? error.message : String(error)
  const firstLine = raw.split('\n').map(s => s.trim()).find(s => s !== '') ?? 'unknown error'
  return { code, message: firstLine }
}
