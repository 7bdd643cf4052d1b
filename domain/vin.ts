/**
 * VIN checks: 17 characters of ISO 3779 (no I, O or Q) and, for North American VINs (first character 1–5), the
 * check digit in position 9 (49 CFR 565: transliteration, position weights, sum modulo 11, 10 written as X).
 */

const VALUES: Record<string, number> = {
  A: 1, B: 2, C: 3, D: 4, E: 5, F: 6, G: 7, H: 8, J: 1, K: 2, L: 3, M: 4, N: 5, P: 7, R: 9, S: 2, T: 3, U: 4, V: 5, W: 6, X: 7, Y: 8, Z: 9,
};
const WEIGHTS = [8, 7, 6, 5, 4, 3, 2, 10, 0, 9, 8, 7, 6, 5, 4, 3, 2];

/** The check digit a VIN should carry in position 9 ('0'–'9' or 'X'). */
export function vinCheckDigit(vin: string): string {
  let sum = 0;
  for (let i = 0; i < 17; i++) {
    const c = vin[i];
    const v = c >= '0' && c <= '9' ? Number(c) : VALUES[c];
    sum += (v ?? 0) * WEIGHTS[i];
  }
  const r = sum % 11;
  return r === 10 ? 'X' : String(r);
}

/** null when the VIN is acceptable, else a sentence saying what is wrong. */
export function vinProblem(raw: string): string | null {
  const vin = raw.trim().toUpperCase();
  if (vin.length !== 17) return `A VIN has 17 characters; this one has ${vin.length}.`;
  const bad = /[^A-HJ-NPR-Z0-9]/.exec(vin);
  if (bad) {
    return /[IOQ]/.test(bad[0])
      ? `A VIN never contains the letters I, O or Q (found "${bad[0]}" at position ${bad.index + 1}); it is probably 1 or 0.`
      : `"${bad[0]}" at position ${bad.index + 1} cannot appear in a VIN.`;
  }
  if (/^[1-5]/.test(vin)) {
    const want = vinCheckDigit(vin);
    if (vin[8] !== want) return `The check digit (9th character) should be ${want}, not ${vin[8]}: look for a mistyped character.`;
  }
  return null;
}
