import { fileURLToPath } from 'node:url'
import vue from '@vitejs/plugin-vue'
import { defineConfig } from 'vitest/config'

const root = fileURLToPath(new URL('..', import.meta.url))
const alias = { '~': root, '@': root, '#shared': `${root}shared` }

// Three projects: pure unit tests (engine, utils), integration tests against the real local
// PostgreSQL/Redis/mail fake started by scripts/test.sh, and browser tests in Debian's chromium.
export default defineConfig({
  root,
  resolve: { alias },
  test: {
    projects: [
      {
        plugins: [vue()],
        resolve: { alias },
        test: { name: 'unit', root, include: ['tests/unit/**/*.test.ts'], environment: 'node' }
      },
      {
        resolve: { alias },
        test: {
          name: 'integration', root, include: ['tests/integration/**/*.test.ts'], environment: 'node',
          globalSetup: ['tests/support/global-setup.ts'],
          testTimeout: 60_000, hookTimeout: 240_000, fileParallelism: false
        }
      },
      {
        resolve: { alias },
        test: {
          name: 'browser', root, include: ['tests/browser/**/*.test.ts'], environment: 'node',
          globalSetup: ['tests/support/global-setup.ts'],
          testTimeout: 120_000, hookTimeout: 300_000, fileParallelism: false,
          // A page waits on server round trips: on a busy two-core machine one second (the default
          // wait of expect.poll) is too short for a click's answer to show. A bound, not a timing.
          expect: { poll: { timeout: 15_000 } }
        }
      }
    ]
  }
})
