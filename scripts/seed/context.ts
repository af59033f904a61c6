import type { DB } from '../../server/database/client'

/** Passed to every seed step; `state` carries ids from earlier steps (e.g. the demo workspace). */
export interface SeedContext {
  db: DB
  log: (message: string) => void
  state: Record<string, unknown>
}

export interface SeedStep { run: (ctx: SeedContext) => Promise<void> }
