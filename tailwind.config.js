/**
 * Orientry's design tokens. The palette is read for hours by people who compare numbers, so it stays calm: cool `ink`
 * neutrals on a warm `paper`, one indigo `accent` for anything you can click, and semantic families for severities and
 * verdicts. Each semantic family has `text`, `bg`, `border` and `icon` shades; `text` and `icon` meet WCAG AA on both
 * `bg` and white (see docs/design.md for the measured ratios). Colour is never the only signal: every severity and
 * verdict also has its own icon shape and a text label.
 */

/** @type {import('tailwindcss').Config} */
export default {
  content: ['./src/**/*.{html,js,svelte,ts}'],
  theme: {
    extend: {
      colors: {
        ink: {
          50: '#F5F6F8',
          100: '#EBEEF1',
          200: '#D6DBE1',
          300: '#B6BEC8',
          400: '#8B95A1',
          500: '#5F6A78',
          600: '#4D5866',
          700: '#3A4451',
          800: '#29313C',
          900: '#1B222C',
          950: '#11161D'
        },
        paper: {
          DEFAULT: '#FAFAF7',
          raised: '#FFFFFF',
          sunken: '#F2F2EE'
        },
        accent: {
          50: '#EFF0FB',
          100: '#E0E3F8',
          200: '#C3C8F1',
          300: '#9AA2E6',
          400: '#7079DA',
          500: '#4F5BD0',
          600: '#4450C2',
          700: '#3A45B0',
          800: '#2F3994',
          900: '#262D74'
        },
        'sev-error': { text: '#B42318', bg: '#FDECEA', border: '#F3B8B1', icon: '#C8321F' },
        'sev-warning': { text: '#8A4B00', bg: '#FFF4DB', border: '#EDCB86', icon: '#B86A00' },
        'sev-info': { text: '#0B5F73', bg: '#E6F3F6', border: '#A9D5DF', icon: '#1A7F96' },
        'verdict-pass': { text: '#1C6B3A', bg: '#E7F4EC', border: '#A8D6B9', icon: '#23844A' },
        'verdict-fail': { text: '#A3162B', bg: '#FCE9EC', border: '#EFB3BD', icon: '#C22A3F' }
      },
      fontFamily: {
        sans: [
          'Inter',
          'ui-sans-serif',
          'system-ui',
          '-apple-system',
          'Segoe UI',
          'Roboto',
          'Helvetica Neue',
          'Arial',
          'sans-serif'
        ],
        mono: ['JetBrains Mono', 'ui-monospace', 'SFMono-Regular', 'Menlo', 'Consolas', 'monospace']
      },
      fontSize: {
        '2xs': ['0.6875rem', { lineHeight: '1rem' }]
      },
      boxShadow: {
        card: '0 1px 2px rgb(17 22 29 / 0.06), 0 0 0 1px rgb(17 22 29 / 0.04)',
        menu: '0 8px 24px rgb(17 22 29 / 0.14), 0 0 0 1px rgb(17 22 29 / 0.06)'
      },
      maxWidth: {
        page: '88rem'
      }
    }
  },
  plugins: []
};
