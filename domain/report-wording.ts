/** Interpretation wording drawn from a result's verdict and pattern: a starting point the technician edits. */
import { type AnalysisResult, identityWords, intervalText, METHOD_NAMES, NUMBERING_ASSUMED, percentText } from '@/signal';

export function interpretationFor(r: AnalysisResult): string {
  const method = METHOD_NAMES[r.method];
  const low = r.cylinders.filter((c) => c.status === 'low');
  const identity = r.identity === 'assumed' ? 'Cylinder numbers were assumed from the firing order (no sync signal); confirm them before acting on a cylinder number.' : `Cylinder numbers come ${identityWords(r.identity)}.`;
  if (r.verdict === 'uncertain') {
    return `A relative compression test by the ${method} method could not rank the cylinders: ${r.warnings.map((w) => w.message).join(' ')} The test should be repeated before conclusions are drawn.`;
  }
  const doubts = r.warnings.filter((w) => w.code === 'CLOSE_CALL' || w.code === 'AFTER_LOW').map((w) => w.message);
  const doubt = doubts.length ? ` ${doubts.join(' ')}` : '';
  if (low.length === 0) {
    return `A relative compression test by the ${method} method at ${r.crankingRpm.toFixed(0)} rpm found every cylinder within the ${r.settings.lowLimitPercent} % low limit (spread ${r.spreadPercent} points). ${r.pattern.hint}${doubt} ${identity}`;
  }
  const tag = r.identity === 'assumed' ? ` ${NUMBERING_ASSUMED}` : '';
  const list = low.map((c) => `cylinder ${c.cylinder}${tag} at ${percentText(c.relativePercent, 0)} % (90 % interval ${intervalText(c.interval)} %)`).join(', ');
  return `A relative compression test by the ${method} method at ${r.crankingRpm.toFixed(0)} rpm found ${list} of the healthy cylinders, below the ${r.settings.lowLimitPercent} % low limit. ${r.pattern.hint}${doubt} ${identity} A relative test does not give pressure in psi or kPa; confirm with a gauge compression test before any teardown.`;
}

/**
 * The cylinders a gauge compression test should confirm: those read low, and those the test could not tell
 * (uncertain); null when every cylinder was read clearly within the limits.
 */
export function gaugeToConfirm(r: Pick<AnalysisResult, 'cylinders' | 'identity'>): string | null {
  const low = r.cylinders.filter((c) => c.status === 'low').map((c) => c.cylinder);
  const unclear = r.cylinders.filter((c) => c.status === 'uncertain').map((c) => c.cylinder);
  if (!low.length && !unclear.length) return null;
  const parts = [...(low.length ? [`${low.join(', ')} (read low)`] : []), ...(unclear.length ? [`${unclear.join(', ')} (not clear on this test)`] : [])];
  const tag = r.identity === 'assumed' ? ` ${NUMBERING_ASSUMED}` : '';
  return `To confirm with a gauge compression test: cylinder${low.length + unclear.length > 1 ? 's' : ''} ${parts.join('; ')}${tag}.`;
}

export function nextStepsFor(r: AnalysisResult): string[] {
  return r.pattern.nextTests.length ? [...r.pattern.nextTests] : [];
}

/** The limits of a relative test, printed in every report. */
export const TEST_LIMITS =
  'This is a relative test: it ranks each cylinder against the healthy ones and cannot see wear that is equal on every cylinder. Figures are estimates from a physical model of the cranking engine; they are not gauge pressures.';
