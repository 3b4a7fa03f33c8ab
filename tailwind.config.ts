import type { Config } from 'tailwindcss'
import plugin from 'tailwindcss/plugin'

// Semantic colours read CSS variables (set in assets/css/main.css) so sunlight mode can swap the
// whole palette with one class on <html>, with no second set of utility classes in the markup.
const token = (name: string) => `rgb(var(--c-${name}) / <alpha-value>)`

export default {
  content: [],
  // The utilities' default custom properties (rings, shadows, transforms) go only on the
  // elements that use them, not on every element: thirty fewer properties for the browser to
  // work out per element when it styles a page.
  experimental: { optimizeUniversalDefaults: true },
  theme: {
    extend: {
      colors: {
        // Fixed brand scales: the wordmark and the favicon must look the same in every mode.
        ink: {
          50: '#eef2f8',
          100: '#d5deec',
          200: '#a9bbd6',
          300: '#7895bd',
          400: '#4c6f9f',
          500: '#2f5283',
          600: '#223f69',
          700: '#1a3154',
          800: '#142745',
          900: '#0e1f3b',
          950: '#081329',
        },
        paper: {
          DEFAULT: '#fbfaf6',
          100: '#f5f3ec',
          200: '#e9e5d9',
          300: '#d6d1c2',
        },
        skyteal: {
          100: '#d9f2f4',
          200: '#aee3e8',
          300: '#72cdd6',
          400: '#36b3c0',
          500: '#1a9aa8',
          600: '#0f7e8c',
          700: '#0b6672',
          800: '#0a525c',
        },
        // Semantic tokens: use these in components.
        page: token('page'),
        panel: token('panel'),
        fg: token('fg'),
        muted: token('muted'),
        line: token('line'),
        'line-strong': token('line-strong'),
        accent: { DEFAULT: token('accent'), strong: token('accent-strong'), soft: token('accent-soft'), fg: token('accent-fg') },
        chrome: { DEFAULT: token('chrome'), fg: token('chrome-fg'), muted: token('chrome-muted') },
        focus: token('focus'),
        danger: { DEFAULT: token('held'), soft: token('held-soft') },
        // Readiness: never shown by colour alone (see components/readiness/ReadinessBadge.vue).
        ready: { DEFAULT: token('ready'), soft: token('ready-soft') },
        caution: { DEFAULT: token('caution'), soft: token('caution-soft') },
        held: { DEFAULT: token('held'), soft: token('held-soft') },
        unchecked: { DEFAULT: token('unchecked'), soft: token('unchecked-soft') },
        // Board tiles: four clearly different brightnesses, so the states part even in grey.
        tile: { caution: token('tile-caution'), unchecked: token('tile-unchecked') },
      },
      fontFamily: {
        // Barlow, and Arial or the platform's own sans-serif until it has loaded. Not Tailwind's
        // longer stack: every family named is looked up by the browser as a page is first laid out,
        // and its emoji and system-ui fonts made that first layout two to three times as long
        // (docs/bench.md). Characters Barlow lacks still fall back to a font that has them.
        // Until Barlow has loaded, the stand-ins of assets/css/main.css: the platform's font sized
        // to Barlow, so nothing moves when it arrives.
        sans: ['Barlow', '"Barlow-sized Arial"', '"Barlow-sized Roboto"', '"Barlow-sized DejaVu Sans"', 'Arial', 'sans-serif'],
      },
      minHeight: {
        // Touch target for every control; rem-based, so sunlight mode's larger root size lifts it past 48 px.
        control: '2.75rem',
      },
      minWidth: {
        control: '2.75rem',
      },
      screens: {
        xs: '400px',
        wall: '1600px',
      },
    },
  },
  plugins: [
    plugin(({ addVariant, addUtilities }) => {
      addVariant('sunlight', ':is(.sunlight &)')
      addUtilities({
        // Competition IDs: heavy, tight, tabular so "11" and "88" take the same width on a board.
        '.numerals-cid': {
          fontWeight: '800',
          fontVariantNumeric: 'tabular-nums lining-nums',
          fontFeatureSettings: '"tnum" 1, "lnum" 1',
          letterSpacing: '-0.045em',
          lineHeight: '0.9',
          textTransform: 'uppercase',
          fontStretch: 'condensed',
        },
      })
    }),
  ],
} satisfies Config
