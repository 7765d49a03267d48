import type { Config } from 'tailwindcss'

// One palette and one type scale for the whole product. Colours are named by their job,
// not by hue, so a later change of palette touches only this file.
export default {
  content: [
    './components/**/*.{vue,ts}',
    './layouts/**/*.vue',
    './pages/**/*.vue',
    './overlays/**/*.vue',
    './error.vue',
    './app.vue',
    './composables/**/*.ts',
  ],
  theme: {
    extend: {
      colors: {
        // ink: text and dark surfaces; paper: light surfaces; brass: the accent; moss and
        // rust: success and danger. Pairs used for text pass WCAG 2.2 AA (4.5:1).
        ink: {
          50: '#f4f5f6', 100: '#e6e8eb', 200: '#c9ced5', 300: '#9ea6b2', 400: '#6b7585',
          500: '#4d5666', 600: '#3a424f', 700: '#2b313b', 800: '#1d2129', 900: '#12151a',
        },
        paper: { DEFAULT: '#faf8f4', dim: '#f1ede5' },
        brass: {
          50: '#fbf6ea', 100: '#f4e6c4', 200: '#e8cc88', 300: '#d9ad4f', 400: '#c3902c',
          500: '#a2731f', 600: '#825a19', 700: '#634415', 800: '#46300f', 900: '#2c1e09',
        },
        moss: { 100: '#e3efe2', 600: '#2f6b36', 700: '#245229' },
        rust: { 100: '#f8e3df', 600: '#a63a2a', 700: '#7f2b1f' },
      },
      fontFamily: {
        display: ['Oswald', 'Arial Narrow', 'sans-serif'],
        sans: ['"Source Sans 3"', 'system-ui', 'sans-serif'],
      },
      fontSize: {
        'xs': ['0.75rem', { lineHeight: '1rem' }],
        'sm': ['0.875rem', { lineHeight: '1.25rem' }],
        'base': ['1rem', { lineHeight: '1.5rem' }],
        'lg': ['1.125rem', { lineHeight: '1.75rem' }],
        'xl': ['1.375rem', { lineHeight: '1.875rem' }],
        '2xl': ['1.75rem', { lineHeight: '2.25rem' }],
        '3xl': ['2.25rem', { lineHeight: '2.5rem' }],
        '4xl': ['3rem', { lineHeight: '1.1' }],
      },
    },
  },
  plugins: [],
} satisfies Config
