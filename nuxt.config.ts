// Sheaf: the repository root is Nuxt's source folder (pages/, components/, stores/ at the root).
export default defineNuxtConfig({
  compatibilityDate: '2025-07-15',
  srcDir: '.',
  devtools: { enabled: false },
  telemetry: false,
  modules: ['@nuxtjs/tailwindcss', '@pinia/nuxt', '@nuxt/eslint'],
  css: ['@fontsource/public-sans/400.css', '@fontsource/public-sans/600.css', '@fontsource/public-sans/700.css'],
  pinia: { storesDirs: ['./stores/**'] },
  // Our ESLint config lives in scripts/; never write one at the top level.
  eslint: { config: { autoInit: false } },
  tailwindcss: { configPath: 'tailwind.config.ts', viewer: false },
  imports: { dirs: ['stores'] },
  // The repository keeps no top-level plugins/ folder: app plugins live in stores/plugins/.
  plugins: ['./stores/plugins/zod-jitless.client.ts', './stores/plugins/flat-rows-payload.ts'],
  runtimeConfig: {
    databaseUrl: process.env.DATABASE_URL ?? 'postgres://sheaf@127.0.0.1:54329/sheaf',
    redisUrl: process.env.REDIS_URL ?? 'redis://127.0.0.1:63790',
    smtpUrl: process.env.SMTP_URL ?? 'smtp://127.0.0.1:2525',
    mailFake: process.env.SHEAF_MAIL_FAKE ?? '0',
    appOrigin: process.env.APP_ORIGIN ?? 'http://127.0.0.1:3000'
  },
  nitro: { preset: 'node-server' },
  // Styles come as cached stylesheets, not inlined into each server-rendered page (the bins
  // grid's spreadsheet styles alone were ≈ 170 kB of every study page).
  features: { inlineStyles: false },
  typescript: { strict: true, typeCheck: false },
  app: { head: { title: 'Sheaf', htmlAttrs: { lang: 'en' } } }
})
