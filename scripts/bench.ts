// Entry of `npm run bench`; the benchmark lives in scripts/cli/bench.ts.
import { benchMain } from './cli/bench'
import { processIo } from './cli'

process.exitCode = await benchMain(process.argv.slice(2), processIo)
