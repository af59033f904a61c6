import { readSettings, type Settings } from '../domain/settings'

let cached: Settings | undefined

/**
 * The deployment settings (server/domain/settings.ts): the environment wins at run time, the
 * runtimeConfig values baked in at build time are the fallback. Read once per process.
 */
export function useSettings(): Settings {
  if (!cached) {
    const rc = useRuntimeConfig()
    cached = readSettings(process.env, {
      databaseUrl: rc.databaseUrl, redisUrl: rc.redisUrl, smtpUrl: rc.smtpUrl, mailFake: rc.mailFake, appOrigin: rc.appOrigin
    })
  }
  return cached
}
