// Entry of `npm run bench`: the engine's benchmark (scripts/cli/bench.ts), then the worker's
// (scripts/bench/worker.ts: single core against every core, the after-phase, cancel), then runs
// on two sets (scripts/bench/two-sets.ts: held, paired and apart against the single-set run).
import { benchMain } from './cli/bench'
import { processIo } from './cli'
import { runWorkerBench } from './bench/worker'
import { runTwoSetBench } from './bench/two-sets'

const argv = process.argv.slice(2)
process.exitCode = await benchMain(argv, processIo)
if (process.exitCode === 0 && !argv.includes('--help') && !argv.includes('-h')) {
  const value = (name: string) => {
    const i = argv.indexOf(`--${name}`)
    return i >= 0 ? argv[i + 1] : undefined
  }
  await runWorkerBench(processIo, {
    fit: value('fit') ?? 'samples/fits/brindle-mc-1.json',
    replicas: Number(value('replicas') ?? 1000),
    seed: Number(value('seed') ?? 1)
  })
  await runTwoSetBench(processIo)
}
