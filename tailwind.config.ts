/**
 * Crankprint's theme, in one place: the palette of semantic tokens for the light and dark themes, the fonts and
 * the touch-target size. The stylesheet loads it (`@config` in app/globals.css); the report PDF takes the light
 * palette from here too (server/pdf/report-parts.tsx).
 *
 * Colours live in CSS variables (`--paper` … as "r g b" triplets) set on the page for each theme, so a theme
 * switch needs no rebuild; every status colour is always paired with a word and a pattern.
 */
import type { Config } from 'tailwindcss';
import plugin from 'tailwindcss/plugin';

type Rgb = readonly [number, number, number];

/** Light: warm paper, slate ink, copper brand. Contrast of ink/muted/brand on paper and surface is ≥ 4.5:1. */
export const LIGHT = {
  paper: [247, 245, 240],
  surface: [255, 255, 255],
  raised: [238, 234, 226],
  ink: [27, 36, 48],
  muted: [84, 92, 104],
  line: [205, 199, 188],
  brand: [166, 72, 34],
  'brand-ink': [255, 255, 255],
  ok: [22, 110, 96],
  low: [176, 38, 30],
  uncertain: [96, 104, 118],
  high: [150, 92, 0],
  limit: [104, 66, 168],
  event: [38, 86, 160],
  sync: [128, 98, 0],
  danger: [176, 38, 30],
} as const satisfies Record<string, Rgb>;

export type Token = keyof typeof LIGHT;

/** Dark: deep slate, not black; warm text; brighter copper. */
export const DARK: Record<Token, Rgb> = {
  paper: [17, 23, 31],
  surface: [26, 34, 45],
  raised: [36, 46, 60],
  ink: [236, 231, 222],
  muted: [170, 176, 186],
  line: [62, 74, 90],
  brand: [232, 142, 98],
  'brand-ink': [24, 18, 14],
  ok: [94, 196, 176],
  low: [255, 138, 128],
  uncertain: [168, 176, 190],
  high: [236, 180, 80],
  limit: [186, 160, 240],
  event: [130, 170, 240],
  sync: [230, 196, 90],
  danger: [255, 138, 128],
};

const TOKENS = Object.keys(LIGHT) as Token[];
const variables = (palette: Record<Token, Rgb>) => Object.fromEntries(TOKENS.map((t) => [`--${t}`, palette[t].join(' ')]));

/** The light palette as #RRGGBB (for the PDF, which has no CSS variables). */
export const LIGHT_HEX = Object.fromEntries(TOKENS.map((t) => [t, `#${LIGHT[t].map((v) => v.toString(16).padStart(2, '0').toUpperCase()).join('')}`])) as Record<Token, string>;

export default {
  content: [],
  theme: {
    extend: {
      colors: Object.fromEntries(TOKENS.map((t) => [t, `rgb(var(--${t}))`])),
      fontFamily: {
        sans: ['var(--font-text)', 'system-ui', 'sans-serif'],
        mono: ['var(--font-figures)', 'ui-monospace', 'monospace'],
      },
      /** Touch targets: min-h-touch, min-w-touch. */
      spacing: { touch: '44px' },
    },
  },
  plugins: [
    plugin(({ addBase }) => {
      addBase({
        ':root': { ...variables(LIGHT), 'color-scheme': 'light' },
        "[data-theme='dark']": { ...variables(DARK), 'color-scheme': 'dark' },
      });
    }),
  ],
} satisfies Config;
