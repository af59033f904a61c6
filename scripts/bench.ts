// Entry of `npm run bench`; the benchmark lives in shared/cli/bench.ts.
import { benchMain } from '../shared/cli/bench'
import { processIo } from '../shared/cli'

process.exitCode = await benchMain(process.argv.slice(2), processIo)
