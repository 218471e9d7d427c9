import type { Config } from 'tailwindcss';

/** Beadline's palette: deep slate ink, a clear lagoon accent, amber for cautions, coral for failures. */
const config: Config = {
  content: ['./app/**/*.{ts,tsx}', './components/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        ink: {
          50: '#f4f6f8',
          100: '#e6eaef',
          200: '#cbd3dc',
          300: '#a3b0bf',
          400: '#74849a',
          500: '#55667d',
          600: '#425166',
          700: '#354154',
          800: '#263040',
          900: '#18202c',
          950: '#0e141c',
        },
        lagoon: {
          50: '#ecfbfa',
          100: '#cff4f2',
          200: '#a2e8e5',
          300: '#67d5d2',
          400: '#30b9b8',
          500: '#169c9d',
          600: '#0f7d80',
          700: '#116467',
          800: '#134f52',
          900: '#134345',
        },
        amber: { 50: '#fff8eb', 100: '#feecc7', 500: '#e08a0b', 700: '#9a5206', 900: '#6a3708' },
        coral: { 50: '#fff2f0', 100: '#ffe0db', 500: '#e5533d', 700: '#b32f1d', 900: '#7c2316' },
        leaf: { 50: '#effbf3', 100: '#d8f5e2', 500: '#2c9a57', 700: '#1f7342', 900: '#17502f' },
      },
      fontFamily: {
        sans: ['var(--font-plex-sans)', 'system-ui', 'sans-serif'],
        mono: ['var(--font-plex-mono)', 'ui-monospace', 'monospace'],
      },
      fontSize: {
        // A modest 1.2 scale: dense lab tables, clear headings.
        xs: ['0.75rem', { lineHeight: '1rem' }],
        sm: ['0.875rem', { lineHeight: '1.3rem' }],
        base: ['1rem', { lineHeight: '1.55rem' }],
        lg: ['1.2rem', { lineHeight: '1.75rem' }],
        xl: ['1.44rem', { lineHeight: '2rem' }],
        '2xl': ['1.728rem', { lineHeight: '2.25rem' }],
        '3xl': ['2.074rem', { lineHeight: '2.5rem' }],
      },
    },
  },
};

export default config;
