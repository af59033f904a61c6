import { createDB, type DB } from '../../server/database/client'
import { testEnv } from './env'

let db: DB | undefined
/** The test database (one small pool per test file). */
export const testDB = () => (db ??= createDB(testEnv().databaseUrl, 3))
export { tables } from '../../server/database/client'
