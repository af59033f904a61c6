// Apply the committed drizzle-kit migrations to DATABASE_URL.
import { fileURLToPath } from 'node:url'
import { migrate } from 'drizzle-orm/node-postgres/migrator'
import { createDB } from '../server/database/client'

const url = process.env.DATABASE_URL
if (!url) throw new Error('DATABASE_URL is not set')
const db = createDB(url, 1)
const migrationsFolder = fileURLToPath(new URL('../server/database/migrations', import.meta.url))
await migrate(db, { migrationsFolder })
await db.pool.end()
console.log('[migrate] database is up to date')
