// The environment scripts/test.sh exports for the integration and browser projects.
export interface TestEnv { appUrl: string, databaseUrl: string, redisUrl: string, smtpUrl: string }

export function testEnv(): TestEnv {
  const { TEST_APP_URL, DATABASE_URL, REDIS_URL, SMTP_URL } = process.env
  if (!TEST_APP_URL || !DATABASE_URL || !REDIS_URL || !SMTP_URL) {
    throw new Error('Integration and browser tests need the services: run them with `npm test` (bash scripts/test.sh [vitest args])')
  }
  return { appUrl: TEST_APP_URL, databaseUrl: DATABASE_URL, redisUrl: REDIS_URL, smtpUrl: SMTP_URL }
}
