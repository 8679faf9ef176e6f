import type { Config } from 'tailwindcss'

// Rootplate's own palette: warm paper for a bright shop, a deep spruce green
// for action, a plywood amber for highlights, brick for problems.
export default {
  content: [],
  theme: {
    extend: {
      colors: {
        paper: { DEFAULT: '#f8f6f1', 50: '#fdfcf9', 100: '#f8f6f1', 200: '#ece8de', 300: '#ddd6c6' },
        ink: { DEFAULT: '#23281f', 500: '#5b6355', 400: '#7c8475', 300: '#a4aa9c' },
        spruce: { 50: '#eef5f0', 100: '#d5e8dc', 500: '#2f7352', 600: '#265f44', 700: '#1e4b36', 800: '#173a2a' },
        ply: { 100: '#f8ecd5', 300: '#ebc27f', 500: '#c98a2e', 700: '#8d5e1a' },
        brick: { 50: '#fbefec', 500: '#b4452f', 700: '#8a3220' },
      },
      fontFamily: {
        sans: ['"IBM Plex Sans"', 'system-ui', 'sans-serif'],
        mono: ['"IBM Plex Mono"', 'ui-monospace', 'monospace'],
      },
    },
  },
} satisfies Config
