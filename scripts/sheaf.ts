// Entry of `npm run -s sheaf -- <verb>`; everything lives in shared/cli.
import { main, processIo } from '../shared/cli'

process.exitCode = await main(process.argv.slice(2), processIo)
