/** Tailwind classes per status, written out in full so the build sees them. */
export const STATUS_TEXT = { ok: 'text-ok', low: 'text-low', high: 'text-high', uncertain: 'text-uncertain' } as const;
/** Each status's sign, beside its word or the verdict, so it never rests on colour alone. */
export const STATUS_SIGN = { ok: '✓', low: '▼', high: '▲', uncertain: '?' } as const;
/** The status as a word with its sign. */
export const STATUS_WORD = { ok: `${STATUS_SIGN.ok} ok`, low: `${STATUS_SIGN.low} low`, high: `${STATUS_SIGN.high} high`, uncertain: `${STATUS_SIGN.uncertain} uncertain` } as const;
