import type { Config } from 'tailwindcss'
import defaultTheme from 'tailwindcss/defaultTheme'

// Cuspline's own design tokens: warm neutrals, one accent, site colours come from the data.
export default {
  content: [
    './components/**/*.{vue,ts}',
    './layouts/**/*.vue',
    './pages/**/*.vue',
    './composables/**/*.ts',
    './app.vue',
    './error.vue',
  ],
  theme: {
    extend: {
      fontFamily: {
        sans: ['Inter', ...defaultTheme.fontFamily.sans],
      },
      colors: {
        ink: {
          50: '#f7f7f5', 100: '#efeeea', 200: '#dedcd5', 300: '#c4c1b7', 400: '#9a968a',
          500: '#6b675e', 600: '#5b5850', 700: '#44423c', 800: '#2d2c28', 900: '#1c1b19',
        },
        accent: {
          50: '#eef6f8', 100: '#d5e9ee', 200: '#abd3dd', 500: '#2a7f94', 600: '#1f6678', 700: '#184f5d',
        },
        danger: { 50: '#fdf0ee', 600: '#b4321f', 700: '#8f2718' },
      },
      fontSize: {
        // Readable from a step back at the front desk.
        base: ['1.0625rem', '1.6rem'],
      },
    },
  },
  plugins: [],
} satisfies Config
