import type { Config } from 'tailwindcss'
import plugin from 'tailwindcss/plugin'

type Palette = { [name: string]: string | Palette }
/** { ink: { DEFAULT, faint } } → { ink, 'ink-faint' }: the names colour utilities take. */
const colorNames = (palette: Palette, prefix = ''): Record<string, string> => Object.fromEntries(Object.entries(palette).flatMap(([name, value]) => {
  const key = name === 'DEFAULT' ? prefix.replace(/-$/, '') : `${prefix}${name}`
  return typeof value === 'string' ? [[key, value]] : Object.entries(colorNames(value, `${key}-`))
}))

/**
 * `space-y-*` and `divide-y` without sibling combinators. Tailwind's own versions select
 * `:not([hidden]) ~ :not([hidden])`: a rule with a universal subject and a sibling step, which
 * the browser tries on every element it restyles and which makes inserting any element restyle
 * the whole subtree of every later sibling. The bins grid inserts and removes a measuring element
 * beside its own on each draw, and that restyled all of its drawn cells twice per edit. These
 * versions put the gap below every child but the last (so a hidden last child leaves no gap,
 * the one difference).
 */
const gapsWithoutSiblingRules = plugin(({ matchUtilities, theme }) => {
  const notLast = '& > :not(:last-child)'
  matchUtilities({ 'space-y': value => ({ [notLast]: { 'margin-bottom': value } }) }, { values: theme('space') })
  matchUtilities({ 'space-x': value => ({ [notLast]: { 'margin-right': value } }) }, { values: theme('space') })
  matchUtilities({ 'divide-y': value => ({ [notLast]: { 'border-bottom-width': value } }) }, { values: theme('divideWidth') })
  matchUtilities({ divide: value => ({ [notLast]: { 'border-color': value } }) }, { values: colorNames(theme('divideColor') as Palette), type: 'color' })
})

// Sheaf's own palette: slate-ink text on paper, a moss accent for actions, ember for warnings.
export default {
  content: [
    './components/**/*.{vue,ts}',
    './pages/**/*.vue',
    './layouts/**/*.vue',
    './app.vue'
  ],
  // the --tw-* defaults only on elements whose utilities use them, not on every element
  experimental: { optimizeUniversalDefaults: true },
  corePlugins: { space: false, divideWidth: false, divideColor: false, divideStyle: false, divideOpacity: false },
  theme: {
    extend: {
      fontFamily: { sans: ['"Public Sans"', 'system-ui', 'sans-serif'] },
      colors: {
        paper: '#f7f5f0',
        ink: { DEFAULT: '#1f2a30', soft: '#46545c', faint: '#8a969c' },
        moss: { 50: '#eef5ef', 100: '#d6e8d9', 500: '#3f7d57', 600: '#336a49', 700: '#28543a' },
        ember: { 50: '#fdf1ea', 500: '#c8612b', 700: '#93451d' },
        tide: { 50: '#ebf3f8', 500: '#2f6f94', 700: '#21516d' }
      }
    }
  },
  plugins: [gapsWithoutSiblingRules]
} satisfies Config
