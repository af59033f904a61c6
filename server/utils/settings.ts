/**
 * Deployment settings. The documented environment variables win at run time (DATABASE_URL,
 * REDIS_URL, SMTP_URL, SHEAF_MAIL_FAKE, APP_ORIGIN, SHEAF_TRUST_PROXY); the runtimeConfig
 * values baked in at build time are the fallback.
 */
export function useSettings() {
  const rc = useRuntimeConfig()
  const env = process.env
  const appOrigin = new URL(env.APP_ORIGIN ?? rc.appOrigin).origin
  return {
    databaseUrl: env.DATABASE_URL ?? rc.databaseUrl,
    redisUrl: env.REDIS_URL ?? rc.redisUrl,
    smtpUrl: env.SMTP_URL ?? rc.smtpUrl,
    mailFake: (env.SHEAF_MAIL_FAKE ?? rc.mailFake) === '1',
    mailFrom: env.SHEAF_MAIL_FROM ?? 'Sheaf <no-reply@sheaf.invalid>',
    appOrigin,
    secureCookies: appOrigin.startsWith('https:'),
    // Only behind a reverse proxy that sets X-Forwarded-For (and in the tests, to fake addresses).
    trustProxy: env.SHEAF_TRUST_PROXY === '1'
  }
}
