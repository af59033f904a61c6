import { createDB, tables, type DB } from '../database/client'

let db: DB | undefined

/** The process-wide Drizzle client (one pool). */
export const useDB = () => (db ??= createDB(useSettings().databaseUrl))
export { tables }
