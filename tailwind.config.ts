import type { Config } from 'tailwindcss';

// Sigmaline's design tokens. Paper and ink carry everything; the warm accent is reserved
// for warnings (density inversions, failed files) so that it always means "look here".
export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        paper: {
          DEFAULT: '#f7f4ec',
          raised: '#fcfaf5',
          sunk: '#efeadf',
          rule: '#d9d2c2',
        },
        ink: {
          DEFAULT: '#123f44',
          strong: '#0b2e32',
          soft: '#3f6468',
          muted: '#6d8587',
          faint: '#a9b8b6',
          wash: '#e3ebe8',
        },
        warn: {
          DEFAULT: '#c2461b',
          strong: '#9c3510',
          wash: '#f8e6d9',
        },
        land: '#e6dfcf',
        sea: '#f1f1ea',
      },
      fontFamily: {
        sans: ['"Source Sans 3"', 'system-ui', 'sans-serif'],
        mono: ['"JetBrains Mono"', 'ui-monospace', 'monospace'],
      },
      fontSize: {
        '2xs': ['0.6875rem', { lineHeight: '1rem' }],
      },
      borderRadius: {
        sm: '2px',
        DEFAULT: '3px',
      },
    },
  },
} satisfies Config;
