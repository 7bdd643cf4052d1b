/**
 * Crankprint's palette as semantic tokens. Colours live in CSS variables (app/globals.css) so light and dark
 * themes swap them; every status colour is always paired with a word and a pattern.
 */
import type { Config } from 'tailwindcss';

const token = (name: string) => `rgb(var(--${name}) / <alpha-value>)`;

export default {
  theme: {
    extend: {
      colors: {
        paper: token('paper'),
        surface: token('surface'),
        raised: token('raised'),
        ink: token('ink'),
        muted: token('muted'),
        line: token('line'),
        brand: token('brand'),
        'brand-ink': token('brand-ink'),
        ok: token('ok'),
        low: token('low'),
        uncertain: token('uncertain'),
        high: token('high'),
        limit: token('limit'),
        event: token('event'),
        sync: token('sync'),
        danger: token('danger'),
      },
      fontFamily: {
        sans: ['var(--font-text)', 'system-ui', 'sans-serif'],
        mono: ['var(--font-figures)', 'ui-monospace', 'monospace'],
      },
      minHeight: { touch: '44px' },
      minWidth: { touch: '44px' },
    },
  },
} satisfies Config;
