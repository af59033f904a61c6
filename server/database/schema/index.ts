// The database schema: one module per area, no import circle (columns ← accounts ← workflow).
export * from './accounts'
export * from './workflow'
export type * from './json'
// Set updates by a measurement (reweighting, profiling): schema/impact.ts.
export * from './impact'
