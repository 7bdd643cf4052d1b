/** Figures as text, one rule for the screen, the PDF and the command line. */

/** A relative figure in percent, or a dash when the capture gave none (no compression to compare). */
export function percentText(v: number | null, digits = 1): string {
  return v === null ? '—' : v.toFixed(digits);
}
