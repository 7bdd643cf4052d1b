/**
 * A whole number as people type it: "92,400", "92 400", "92.400" and "92'400" are 92400 (separators between
 * groups of three go). Anything else is returned as typed, for the schema to judge.
 */
export function withoutDigitGroups(v: unknown): unknown {
  return typeof v === 'string' && /^\s*\d{1,3}([,.\s'’\u202f]\d{3})+\s*$/.test(v) ? v.replace(/[^\d]/g, '') : v;
}
