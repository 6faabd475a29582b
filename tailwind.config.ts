import type { Config } from 'tailwindcss';

/**
 * Ridgeload's own theme. Colours take their cue from the materials on a roof: slate-grey ink,
 * fired-clay terracotta for actions, lime-mortar paper for backgrounds, moss, ochre and brick
 * for success, caution and danger. Every text pairing used in the app keeps WCAG AA (4.5:1).
 * The type scale is a minor third (×1.2) from a 16 px body, so driver pages can step up a size
 * or two and stay in proportion.
 */
export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        ink: {
          50: '#f4f6f8',
          100: '#e6eaef',
          200: '#cdd4dd',
          300: '#a9b4c2',
          400: '#7d8a9c',
          500: '#5b687a',
          600: '#465263',
          700: '#343e4d',
          800: '#232b37',
          900: '#161c25',
          950: '#0d1118',
        },
        clay: {
          50: '#fbf3ef',
          100: '#f6e2d8',
          200: '#ecc2ae',
          300: '#df9b7d',
          400: '#d07552',
          500: '#bd5a36',
          600: '#a2472a',
          700: '#833923',
          800: '#652d1d',
          900: '#4a2116',
        },
        mortar: {
          50: '#fbfaf7',
          100: '#f7f4ef',
          200: '#ece6dc',
          300: '#dcd3c5',
          400: '#c2b6a3',
        },
        moss: {
          50: '#eef5ec',
          100: '#d8e9d4',
          600: '#3f6b3a',
          700: '#2f5230',
          800: '#223b23',
        },
        ochre: {
          50: '#fdf6e3',
          100: '#f9e8b8',
          300: '#f0c95a',
          500: '#c99a1e',
          700: '#7a5a0c',
          800: '#5c430a',
        },
        brick: {
          50: '#fcefee',
          100: '#f7d6d3',
          600: '#b3261e',
          700: '#8f1e18',
          800: '#6e1712',
        },
      },
      fontFamily: {
        sans: ['"Work Sans"', 'ui-sans-serif', 'system-ui', 'sans-serif'],
      },
      // Minor-third scale (×1.2) from a 16 px body; line heights keep long labels readable.
      fontSize: {
        xs: ['0.8125rem', { lineHeight: '1.25rem' }],
        sm: ['0.875rem', { lineHeight: '1.375rem' }],
        base: ['1rem', { lineHeight: '1.5rem' }],
        lg: ['1.2rem', { lineHeight: '1.75rem' }],
        xl: ['1.44rem', { lineHeight: '1.95rem' }],
        '2xl': ['1.728rem', { lineHeight: '2.2rem', letterSpacing: '-0.01em' }],
        '3xl': ['2.074rem', { lineHeight: '2.5rem', letterSpacing: '-0.015em' }],
        '4xl': ['2.488rem', { lineHeight: '2.9rem', letterSpacing: '-0.02em' }],
      },
      spacing: {
        // The smallest comfortable target for a gloved thumb.
        tap: '2.75rem',
        'tap-lg': '3.5rem',
      },
      maxWidth: {
        page: '72rem',
      },
      boxShadow: {
        card: '0 1px 2px rgb(22 28 37 / 0.06), 0 1px 3px rgb(22 28 37 / 0.08)',
        raised: '0 4px 12px rgb(22 28 37 / 0.12)',
      },
    },
  },
} satisfies Config;
