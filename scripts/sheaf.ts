// Entry of `npm run -s sheaf -- <verb>`; everything lives in scripts/cli.
import { main, processIo } from './cli'

process.exitCode = await main(process.argv.slice(2), processIo)
