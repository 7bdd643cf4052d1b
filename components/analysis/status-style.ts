/** Tailwind classes per status, written out in full so the build sees them. */
export const STATUS_TEXT = { ok: 'text-ok', low: 'text-low', high: 'text-high', uncertain: 'text-uncertain' } as const;
/** The status as a word with its sign, so it never rests on colour alone. */
export const STATUS_WORD = { ok: '✓ ok', low: '▼ low', high: '▲ high', uncertain: '? uncertain' } as const;
