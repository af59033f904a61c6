/**
 * Sheaf's command line and benchmark, on the same engine as the worker and the server. The only
 * part of shared/ that reads and writes files.
 */
export { main } from './main'
export { type CliIo, processIo } from './io'
export { EXIT, UsageError, BadInputError } from './errors'
