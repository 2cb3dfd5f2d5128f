import type { Config } from 'tailwindcss';

// Stanceline palette: glacier blues for structure, a spruce green for "within band",
// a signal amber for flags. Chosen for contrast on snow-white footage.
export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        glacier: {
          50: '#f2f7fb',
          100: '#e1edf6',
          200: '#c3dbec',
          300: '#94bfdc',
          400: '#5e9cc7',
          500: '#3b7fb0',
          600: '#2b6493',
          700: '#245178',
          800: '#214564',
          900: '#1c3a54',
          950: '#11243a',
        },
        spruce: { 400: '#3fae8a', 500: '#22906d', 600: '#177457', 700: '#135d47' },
        signal: { 400: '#f5b443', 500: '#e8961c', 600: '#c47610', 700: '#9c5a10' },
        alarm: { 500: '#d8452f', 600: '#b83422' },
        granite: {
          50: '#f6f7f8',
          100: '#eceef1',
          200: '#d5d9df',
          400: '#8b94a3',
          600: '#4f5968',
          800: '#2a313c',
          900: '#1a1f27',
        },
      },
      fontFamily: {
        sans: ['"IBM Plex Sans"', 'system-ui', 'sans-serif'],
        mono: ['"IBM Plex Mono"', 'ui-monospace', 'monospace'],
      },
    },
  },
} satisfies Config;
