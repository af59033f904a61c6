// The engine version recorded with every result and export: Sheaf's package version (the
// engine ships with the app). No Nitro imports.
import pkg from '../../../package.json'

export const ENGINE_VERSION = `sheaf-engine ${pkg.version}`
