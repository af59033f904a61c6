/**
 * The command line's entry: picks the verb, runs it, and turns every failure into one line on
 * stderr and an exit code (0 done, 1 bad input, 2 usage). Never lets a stack trace through.
 */
import type { VerbSpec } from './args'
import { describeFailure, EXIT, UsageError } from './errors'
import type { CliIo } from './io'
import { bandsVerb, runBands } from './verbs/bands'
import { computeVerb, runCompute } from './verbs/compute'
import { evolveVerb, runEvolve } from './verbs/evolve'
import { kfactorVerb, runKfactor } from './verbs/kfactor'
import { membersVerb, runMembers } from './verbs/members'
import { remoteImportVerb, remoteRunVerb, runRemoteImport, runRemoteRun } from './verbs/remote'
import { profileVerb, runProfile } from './verbs/profile'
import { reweightVerb, runReweight } from './verbs/reweight'
import { runSensitivity, sensitivityVerb } from './verbs/sensitivity'

/** A verb: its declaration and the function that runs it. */
interface Verb {
  spec: VerbSpec
  run: (argv: readonly string[], io: CliIo) => number | Promise<number>
}

const VERBS: Verb[] = [
  { spec: evolveVerb, run: runEvolve },
  { spec: membersVerb, run: runMembers },
  { spec: computeVerb, run: runCompute },
  { spec: bandsVerb, run: runBands },
  { spec: remoteImportVerb, run: (argv, io) => runRemoteImport(argv, io) },
  { spec: remoteRunVerb, run: (argv, io) => runRemoteRun(argv, io) },
  { spec: kfactorVerb, run: runKfactor },
  { spec: reweightVerb, run: runReweight },
  { spec: profileVerb, run: runProfile },
  { spec: sensitivityVerb, run: runSensitivity }
]

function topLevelHelp(): string {
  const width = Math.max(...VERBS.map(v => v.spec.name.length))
  return `Usage: npm run -s sheaf -- <verb> [arguments] [options]

Sheaf's engine for batch use: LO evolution, error members, study values and their bands.
Results go to stdout as JSON (or CSV with --format csv where the result is a table);
problems go to stderr as one line 'sheaf: <message>', exit code 1 for bad input, 2 for usage.

Verbs:
${VERBS.map(v => `  ${v.spec.name.padEnd(width)}  ${v.spec.summary}`).join('\n')}

'sheaf <verb> --help' describes a verb.`
}

/**
 * Runs the command line on `argv` (the words after `sheaf`), writing results to `io.stdout` and
 * one-line messages to `io.stderr`.
 * @returns the exit code: 0 done, 1 bad input (a file missing, unreadable, or refused by the
 * engine), 2 wrong usage (unknown verb or option, missing argument).
 * @example await main(['bands', 'values.json', '--prescription', 'replica-sd'], processIo)
 */
export async function main(argv: readonly string[], io: CliIo): Promise<number> {
  try {
    const [word, ...rest] = argv
    if (word === undefined || word === '--help' || word === '-h' || word === 'help') {
      io.stdout(`${topLevelHelp()}\n`)
      return word === undefined ? EXIT.usage : EXIT.ok
    }
    const verb = VERBS.find(v => v.spec.name === word)
    if (verb === undefined) {
      throw new UsageError(`unknown verb '${word}'; the verbs are ${VERBS.map(v => v.spec.name).join(', ')} (see 'sheaf --help').`)
    }
    return await verb.run(rest, io)
  } catch (error) {
    const { code, message } = describeFailure(error)
    io.stderr(`sheaf: ${message}\n`)
    return code
  }
}
