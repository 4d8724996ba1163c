import type { Config } from 'tailwindcss';

/**
 * Couplet's design tokens. Loaded by src/app/globals.css through `@config`, so every custom class
 * below (bg-ink-900, text-copper-600, font-sans ...) comes from here.
 * Palette: cool "ink" neutrals for structure, a warm "copper" accent for primary actions (the wire),
 * and "flux" teal for data and links (the field between the coils).
 */
const config: Config = {
  content: ['./src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        ink: {
          50: '#f5f7fa',
          100: '#e9edf3',
          200: '#d3dbe6',
          300: '#aebbcd',
          400: '#8294ad',
          500: '#60738f',
          600: '#4a5b75',
          700: '#3b4960',
          800: '#2a3547',
          900: '#1b2331',
          950: '#10151e',
        },
        copper: {
          50: '#fdf5ef',
          100: '#f9e6d6',
          200: '#f2c9a9',
          300: '#e9a573',
          400: '#df8046',
          500: '#c9662b',
          600: '#a95021',
          700: '#873f1e',
          800: '#6c341e',
          900: '#582c1b',
        },
        flux: {
          50: '#effbfa',
          100: '#d5f3f1',
          200: '#ade6e3',
          300: '#77d1ce',
          400: '#44b5b3',
          500: '#2a9897',
          600: '#217a7b',
          700: '#1f6264',
          800: '#1e4f51',
          900: '#1c4244',
        },
        caution: {
          50: '#fffaeb',
          100: '#fef0c7',
          500: '#d98e04',
          700: '#935a06',
          900: '#5f3a0a',
        },
        danger: {
          50: '#fef3f2',
          100: '#fee4e2',
          500: '#e0442c',
          600: '#c2331d',
          700: '#9c2a1a',
        },
      },
      fontFamily: {
        sans: ['var(--font-inter)', 'ui-sans-serif', 'system-ui', 'sans-serif'],
        mono: ['ui-monospace', 'SFMono-Regular', 'Menlo', 'monospace'],
      },
      boxShadow: {
        panel: '0 1px 2px rgb(16 21 30 / 0.06), 0 1px 3px rgb(16 21 30 / 0.08)',
      },
    },
  },
  plugins: [],
};

export default config;
