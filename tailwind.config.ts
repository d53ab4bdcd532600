import type { Config } from 'tailwindcss';

// Graphite base, copper accent. Red, orange, yellow and blue are kept for the ANSI Z535 signal
// words (cautions) and are not used for anything else; see components/ui/caution.tsx.
const config: Config = {
  content: ['./app/**/*.{ts,tsx}', './components/**/*.{ts,tsx}'],
  darkMode: 'class',
  theme: {
    extend: {
      colors: {
        surface: 'rgb(var(--surface) / <alpha-value>)',
        raised: 'rgb(var(--raised) / <alpha-value>)',
        sunken: 'rgb(var(--sunken) / <alpha-value>)',
        ink: 'rgb(var(--ink) / <alpha-value>)',
        muted: 'rgb(var(--muted) / <alpha-value>)',
        line: 'rgb(var(--line) / <alpha-value>)',
        copper: {
          DEFAULT: 'rgb(var(--copper) / <alpha-value>)',
          strong: 'rgb(var(--copper-strong) / <alpha-value>)',
          soft: 'rgb(var(--copper-soft) / <alpha-value>)',
          ink: 'rgb(var(--copper-ink) / <alpha-value>)',
        },
        graphite: {
          50: '#f4f5f6',
          100: '#e6e8ea',
          200: '#cdd1d5',
          300: '#a9afb6',
          400: '#7d858e',
          500: '#5d646c',
          600: '#474d54',
          700: '#363b41',
          800: '#25292d',
          900: '#181b1e',
          950: '#0f1113',
        },
        // ANSI Z535.4 safety colours, for cautions only.
        z535: {
          danger: '#c8102e',
          warning: '#ff7900',
          caution: '#ffd100',
          notice: '#0057b8',
        },
      },
      fontFamily: {
        sans: ['var(--font-sans)', 'system-ui', 'sans-serif'],
        mono: ['var(--font-mono)', 'ui-monospace', 'monospace'],
      },
      minHeight: { touch: '48px' },
      minWidth: { touch: '48px' },
    },
  },
  plugins: [],
};

export default config;
