import type { Config } from 'tailwindcss'

// Sheaf's own palette: slate-ink text on paper, a moss accent for actions, ember for warnings.
export default {
  content: [
    './components/**/*.{vue,ts}',
    './pages/**/*.vue',
    './layouts/**/*.vue',
    './app.vue'
  ],
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
  plugins: []
} satisfies Config
