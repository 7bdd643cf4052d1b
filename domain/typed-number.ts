/**
 * A whole number as people type it: "92,400", "92 400", "92.400" and "92'400" are 92400 (separators between
 * groups of three go). Anything else is returned as typed, for the schema to judge.
 */
export function withoutDigitGroups(v: unknown): unknown {
  return typeof v === 'string' && /^\s*\d{1,3}([,.\s'’\u202f]\d{3})+\s*$/.test(v) ? v.replace(/[^\d]/g, '') : v;
}

/**
 * A decimal as people type it: spaces at either end go and a comma may stand for the point ("9,6" is 9.6). An empty
 * field is undefined; anything else not a number is NaN, for the schema to name.
 */
export function typedDecimal(text: unknown): number | undefined {
  const t = String(text ?? '').trim();
  return t === '' ? undefined : Number(t.replace(',', '.'));
}
