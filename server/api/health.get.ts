import { sql } from 'drizzle-orm'

const withTimeout = <T>(p: Promise<T>, ms: number) =>
  Promise.race([p, new Promise<never>((_, reject) => setTimeout(() => reject(new Error('timeout')), ms))])

// For monitoring: no auth, 200 when PostgreSQL and Redis answer, 503 otherwise.
export default defineEventHandler(async (event) => {
  const [database, queue] = await Promise.all([
    withTimeout(useDB().execute(sql`select 1`), 2000).then(() => 'ok' as const, () => 'down' as const),
    withTimeout(useRedis().ping(), 2000).then(() => 'ok' as const, () => 'down' as const)
  ])
  const ok = database === 'ok' && queue === 'ok'
  if (!ok) setResponseStatus(event, 503)
  return { ok, database, queue }
})
