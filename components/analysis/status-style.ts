/** Tailwind classes per status, written out in full so the build sees them. */
export const STATUS_TEXT = { ok: 'text-ok', low: 'text-low', uncertain: 'text-uncertain' } as const;
