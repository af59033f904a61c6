// Seeds demo data into DATABASE_URL by running every scripts/seed/NN-*.ts step in name order.
// Each step exports `run(ctx)` and must be idempotent (npm start runs the seed on every start).
import { readdirSync } from 'node:fs'
import { fileURLToPath, pathToFileURL } from 'node:url'
import { createDB } from '../server/database/client'
import type { SeedContext, SeedStep } from './seed/context'

const url = process.env.DATABASE_URL
if (!url) throw new Error('DATABASE_URL is not set')
const db = createDB(url, 2)
const dir = fileURLToPath(new URL('./seed/', import.meta.url))
const files = readdirSync(dir).filter(f => /^\d{2}-.+\.ts$/.test(f)).sort()
const ctx: SeedContext = { db, log: (msg: string) => console.log(`[seed] ${msg}`), state: {} }

try {
  for (const file of files) {
    const step = await import(pathToFileURL(dir + file).href) as SeedStep
    await step.run(ctx)
  }
} finally {
  await db.pool.end()
}
