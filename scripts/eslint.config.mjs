// @ts-check
// ESLint on Nuxt's generated flat config (run from the repository root with --config) (`npx nuxt prepare` writes .nuxt/eslint.config.mjs).
// The rules are about correctness only: no stylistic rules, so linting never reformats a file.
import withNuxt from '../.nuxt/eslint.config.mjs'

export default withNuxt(
  {
    name: 'sheaf/ignores',
    ignores: [
      '.output/**',
      '.data/**',
      '.nuxt/**',
      'node_modules/**',
      'samples/**',
      'server/database/migrations/**',
      'tests/artifacts/**'
    ]
  },
  {
    name: 'sheaf/rules',
    rules: {
      // A leading underscore marks a parameter or binding kept on purpose.
      '@typescript-eslint/no-unused-vars': ['error', {
        args: 'after-used',
        argsIgnorePattern: '^_',
        varsIgnorePattern: '^_',
        caughtErrors: 'none',
        ignoreRestSiblings: true
      }],
      '@typescript-eslint/no-explicit-any': 'warn',
      // Single-word names are fine for our components (Number.vue, Panel.vue inside a feature folder).
      'vue/multi-word-component-names': 'off',
      // Optional props typed with defineProps<{ x?: T }>() are undefined by default; no need to say so.
      'vue/require-default-prop': 'off',
      // `delete record[key]` on a Record<string, T> is how drafts and caches drop an entry.
      '@typescript-eslint/no-dynamic-delete': 'off'
    }
  }
)
