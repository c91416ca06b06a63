import type { Config } from 'tailwindcss'

// Semantic tokens only: components say what a colour means (surface, ink, accent, hot, cool),
// never which hue it is, so the look can change in this one place.
export default {
  content: [
    './components/**/*.{vue,ts}',
    './layouts/**/*.vue',
    './pages/**/*.vue',
    './composables/**/*.ts',
    './shared/**/*.ts',
    './app.vue',
    './error.vue',
  ],
  theme: {
    extend: {
      colors: {
        surface: { DEFAULT: '#f6f4ef', raised: '#ffffff', sunken: '#ebe7de' },
        ink: { DEFAULT: '#1d2430', soft: '#3b4657' },
        muted: { DEFAULT: '#6b7484', line: '#d9d4c8' },
        accent: { DEFAULT: '#1f5f8b', strong: '#17486a', soft: '#dceaf4' },
        hot: { DEFAULT: '#c2410c', soft: '#fde8dc' },
        cool: { DEFAULT: '#0e7490', soft: '#d8f1f5' },
        good: { DEFAULT: '#2f7d4f', soft: '#def2e5' },
        warn: { DEFAULT: '#a16207', soft: '#fbf0d2' },
        danger: { DEFAULT: '#b42318', soft: '#fde4e1' },
      },
      fontFamily: {
        sans: ['"Roboto Flex"', 'system-ui', 'sans-serif'],
      },
      borderRadius: {
        card: '0.75rem',
        control: '0.5rem',
      },
      boxShadow: {
        card: '0 1px 2px rgb(29 36 48 / 0.06), 0 1px 1px rgb(29 36 48 / 0.04)',
      },
    },
  },
  plugins: [],
} satisfies Config
