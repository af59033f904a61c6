import { drizzle } from 'drizzle-orm/node-postgres'
import pg from 'pg'
import * as schema from './schema/index'

/** One pool per process. No Nitro imports: the worker, the seed and the tests reuse this. */
export function createDB(url: string, max = 10) {
  const pool = new pg.Pool({ connectionString: url, max })
  const db = drizzle(pool, { schema, casing: 'snake_case' })
  return Object.assign(db, { pool })
}

export type DB = ReturnType<typeof createDB>
export { schema as tables }

/** A transaction handle, as passed to db.transaction's callback. */
export type Tx = Parameters<Parameters<DB['transaction']>[0]>[0]
