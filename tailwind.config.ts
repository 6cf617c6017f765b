import type { Config } from 'tailwindcss'

// Gillwatt's own palette: peaty neutrals, gill (river teal) for action, lichen for focus and
// highlights, ember for safety flags, ochre (the iron stain of a tired stream) for river cautions.
// Names describe the river, not another program.
export default {
  content: [
    './components/**/*.{vue,ts}',
    './layouts/**/*.vue',
    './pages/**/*.vue',
    './app.vue',
    './error.vue',
    './composables/**/*.ts',
  ],
  theme: {
    extend: {
      fontFamily: {
        sans: ['Nunito', 'ui-sans-serif', 'system-ui', 'sans-serif'],
      },
      colors: {
        peat: {
          50: '#f7f6f3', 100: '#ecebe4', 200: '#d8d5c8', 300: '#bdb8a5', 400: '#9c9681',
          500: '#7d7764', 600: '#625d4e', 700: '#4b473c', 800: '#34312a', 900: '#211f1b',
        },
        gill: {
          50: '#eef8f8', 100: '#d3eeee', 200: '#a9dcdd', 300: '#74c3c6', 400: '#45a4a9',
          500: '#2c878d', 600: '#236b71', 700: '#1f565b', 800: '#1c464a', 900: '#173a3e',
        },
        lichen: {
          100: '#f3f6d6', 200: '#e6eeaa', 300: '#d3e070', 400: '#bccd45', 500: '#9aae28', 600: '#77871c',
        },
        ember: {
          50: '#fdf3ef', 100: '#fbe2d8', 300: '#f0a283', 500: '#d9613a', 600: '#bb4a26', 700: '#953a1f',
        },
        ochre: {
          50: '#fdf8ec', 100: '#faeecd', 300: '#ebc463', 500: '#c78d1f', 700: '#805713', 800: '#5f4112',
        },
      },
      spacing: { 'gutter': '1.25rem', 'panel': '1.75rem' },
      borderRadius: { 'card': '0.875rem' },
      boxShadow: { 'card': '0 1px 2px rgb(33 31 27 / 0.06), 0 4px 14px rgb(33 31 27 / 0.06)' },
    },
  },
  plugins: [],
} satisfies Config
