/**
 * Argument parsing for the verbs, on node:util parseArgs, turning its errors into usage errors
 * that point at the verb's help.
 */
import { parseArgs, type ParseArgsConfig } from 'node:util'
import { UsageError } from './errors'

/** The options a verb accepts, in parseArgs' own shape. */
export type OptionSpec = NonNullable<ParseArgsConfig['options']>

/** What a verb declares about its command line. */
export interface VerbSpec {
  name: string
  /** One line for the top-level help. */
  summary: string
  /** The full `--help` text (without a trailing newline). */
  help: string
  options: OptionSpec
  /** Smallest and largest number of positional arguments (file names). */
  positionals: { min: number, max: number, what: string }
}

/** Parsed command line of a verb. */
export interface ParsedArgs {
  values: Record<string, string | boolean | string[] | boolean[] | undefined>
  positionals: string[]
  help: boolean
}

/**
 * Parses `argv` (the words after the verb) against the verb's options. `--help`/`-h` is always
 * accepted; when present nothing else is checked.
 * @throws UsageError for an unknown option, a missing value, or a wrong number of file names.
 */
export function parseVerbArgs(spec: VerbSpec, argv: readonly string[]): ParsedArgs {
  let parsed
  try {
    parsed = parseArgs({
      args: [...argv],
      options: { ...spec.options, help: { type: 'boolean', short: 'h' } },
      allowPositionals: true,
      strict: true
    })
  } catch (e) {
    throw new UsageError(`${spec.name}: ${cleanParseArgsMessage((e as Error).message)}; see 'sheaf ${spec.name} --help'.`)
  }
  const values = parsed.values as ParsedArgs['values']
  const help = values.help === true
  const { min, max, what } = spec.positionals
  const n = parsed.positionals.length
  if (!help && (n < min || n > max)) {
    const wanted = min === max ? `${min}` : max === Infinity ? `at least ${min}` : `${min} to ${max}`
    throw new UsageError(`${spec.name} takes ${wanted} ${what}, got ${n}${n > 0 ? ` (${parsed.positionals.join(' ')})` : ''}; see 'sheaf ${spec.name} --help'.`)
  }
  return { values, positionals: parsed.positionals, help }
}

/** parseArgs messages run over several sentences and lines; keep the first, with our own hint. */
function cleanParseArgsMessage(message: string): string {
  const first = message.split('\n')[0]!.split('. ')[0]!.replace(/\.$/, '')
  const option = /'(--[\w-]+)'/.exec(first)?.[1]
  if (/ambiguous/.test(first) && option) return `${first} (a value starting with a dash is written ${option}=<value>)`
  return first
}

/** The value of a string option, or undefined. */
export function stringOption(args: ParsedArgs, name: string): string | undefined {
  const v = args.values[name]
  return typeof v === 'string' ? v : undefined
}

/**
 * A comma-separated list of finite numbers, e.g. `--x 1e-4,0.01,0.5`.
 * @throws UsageError naming the option and the item that is not a number.
 */
export function numberList(verb: string, option: string, text: string): number[] {
  const items = text.split(',').map(s => s.trim())
  return items.map((item, i) => {
    const v = item === '' ? Number.NaN : Number(item)
    if (!Number.isFinite(v)) throw new UsageError(`${verb}: --${option} item ${i + 1} ('${item}') is not a number; give a comma-separated list such as 1e-3,0.01,0.1.`)
    return v
  })
}

/**
 * A number option, checked against a predicate.
 * @throws UsageError "<verb>: --<option> must be <rule>, got '<text>'".
 */
export function numberOption(verb: string, option: string, text: string, rule: string, ok: (v: number) => boolean): number {
  const v = text.trim() === '' ? Number.NaN : Number(text)
  if (!Number.isFinite(v) || !ok(v)) throw new UsageError(`${verb}: --${option} must be ${rule}, got '${text}'.`)
  return v
}

/** Output formats: JSON always, CSV where the result is a table. */
export type OutputFormat = 'json' | 'csv'

/**
 * The --format option.
 * @throws UsageError for anything but json or csv.
 */
export function outputFormat(verb: string, args: ParsedArgs): OutputFormat {
  const f = stringOption(args, 'format') ?? 'json'
  if (f !== 'json' && f !== 'csv') throw new UsageError(`${verb}: --format must be json or csv, got '${f}'.`)
  return f
}
