/**
 * Statuses from the evidence: a cylinder is `low` only when its whole 90 % interval lies below the low limit,
 * `high` when wholly above the upper limit, `ok` when within both, and otherwise `uncertain` with a sentence
 * that names it, its interval and the next step. Thin evidence makes every cylinder `uncertain`.
 */
import type { EngineSetup } from '../engine/firing';
import type { CylinderResult, CylinderStatus, Method, QualityGrade, WheelInfo } from '../types';
import { dropWarnings, type QualityWarning, THIN_EVIDENCE, warning } from '../warnings';

export interface Limits {
  lowLimitPercent: number;
  highLimitPercent: number;
  /** Fewer complete events than this for a cylinder make it `uncertain`. */
  minEvents: number;
}

export function statusOf(c: CylinderResult, l: Limits): CylinderStatus {
  if (c.relativePercent === null || !c.interval || c.events < l.minEvents) return 'uncertain';
  const [lo, hi] = c.interval;
  if (hi < l.lowLimitPercent) return 'low';
  if (lo > l.highLimitPercent) return 'high';
  if (lo >= l.lowLimitPercent && hi <= l.highLimitPercent) return 'ok';
  return 'uncertain';
}

/** Whether the warnings (or a wheel too coarse for crank speed) leave nothing to rank. */
export function isThin(method: Method, warnings: QualityWarning[], wheel?: WheelInfo): boolean {
  return (method === 'crank-speed' && !!wheel?.tooCoarse) || warnings.some((w) => THIN_EVIDENCE.has(w.code));
}

/** Sets every cylinder's status and says, for each close call, what to do. Replaces earlier close-call words. */
export function settleStatuses(cylinders: CylinderResult[], thin: boolean, l: Limits, warnings: QualityWarning[]): void {
  dropWarnings(warnings, (w) => w.code === 'CLOSE_CALL');
  for (const c of cylinders) {
    c.status = thin ? 'uncertain' : statusOf(c, l);
    if (thin || c.status !== 'uncertain' || !c.interval || c.relativePercent === null || c.events < l.minEvents) continue;
    const [lo, hi] = c.interval;
    const limit = hi > l.highLimitPercent && lo <= l.highLimitPercent ? `the ${l.highLimitPercent} % upper limit` : `the ${l.lowLimitPercent} % low limit`;
    warnings.push(
      warning('CLOSE_CALL', `Cylinder ${c.cylinder} reads ${fmt(lo)}–${fmt(hi)} %, across ${limit}: record again with 5–10 s of cranking, or gauge it.`),
    );
  }
}

/**
 * A cylinder right after a low one in firing order can read low without being low. On the electrical methods
 * the crank dips hard into the next compression and the starter's one-way clutch overruns, which the starter
 * model does not follow. On crank speed the crank runs past the starter's free speed after the weak cylinder,
 * where the starter gives nothing and its clutch lets go, while the fit's drive torque is a straight line in
 * speed. A bend in that line is not used: at a fixed share of the speeds it pulled a real recording's healthy
 * cylinders to 73–88 % (captures-real/), and placed per capture by its residual it helped the simulator's
 * ensemble but made the family kept out of calibration worse (crank-speed mean error 1.11–1.17 → 1.32–1.40 points
 * on 10 draws per layout), reading an odd-firing V6's even 99/101 as 102/98.
 *
 * Such a cylinder is `uncertain` with a sentence, unless it reads far below the limit, and its interval reaches
 * past 100 %: the bootstrap cannot see this, so the interval must say it, not only the status.
 */
export function holdAfterLow(cylinders: CylinderResult[], setup: EngineSetup, lowLimit: number, warnings: QualityWarning[], method: Method): void {
  dropWarnings(warnings, (w) => w.code === 'AFTER_LOW');
  const order = setup.firingOrder;
  const n = order.length;
  const byNumber = new Map(cylinders.map((c) => [c.cylinder, c]));
  const margin = method === 'crank-speed' ? AFTER_LOW_MARGIN_CRANK : AFTER_LOW_MARGIN;
  const held: number[] = [];
  // Walk the firing order from a cylinder that follows one not low, so each run of low cylinders is read whole.
  // The run's anchor is the last cylinder that stays low; one after it that reads higher is held, and passes the
  // anchor on (a dead cylinder can pull down the next two).
  const start = Math.max(0, order.findIndex((_, p) => byNumber.get(order[(p - 1 + n) % n])!.status !== 'low'));
  let anchor: CylinderResult | null = null;
  for (let k = 0; k < n && n > 1; k++) {
    const c = byNumber.get(order[(start + k) % n])!;
    if (c.status !== 'low') {
      anchor = null;
      continue;
    }
    const reads = c.relativePercent ?? 0;
    if (anchor && reads >= lowLimit - margin && reads > (anchor.relativePercent ?? 0)) {
      holdPerhapsHealthy(c);
      held.push(c.cylinder);
    } else {
      anchor = c;
    }
  }
  if (held.length) {
    const onTeeth = method === 'crank-speed' || method === 'event-duration';
    const cause = onTeeth ? 'the low cylinder before it can pull its figure down' : "the starter's clutch overruns there and the current method can read low without cause";
    const confirm = onTeeth ? 'Confirm with a gauge test.' : 'Confirm with crank speed (a crank sensor channel) or a gauge test.';
    warnings.push(warning('AFTER_LOW', `Cylinder${held.length > 1 ? 's' : ''} ${held.join(', ')} fire${held.length > 1 ? '' : 's'} right after a low cylinder and read${held.length > 1 ? '' : 's'} a little low; ${cause}. ${confirm}`));
  }
}

/**
 * Event duration cannot tell a strong cylinder from one entered slowly: after a weak cylinder the crank comes into
 * the next event slower and lingers there (measured on the simulator: a whole event 9 % longer after a leaking
 * cylinder). A cylinder it reads above the upper limit is `uncertain`, with a sentence.
 */
export function holdHigh(cylinders: CylinderResult[], warnings: QualityWarning[]): void {
  dropWarnings(warnings, (w) => w.code === 'HIGH_HELD');
  const held = cylinders.filter((c) => c.status === 'high');
  for (const c of held) c.status = 'uncertain';
  // For the same reason a slow event's figure above 100 % may be a healthy cylinder's: its interval reaches down to
  // 100 % (measured on the ensemble: healthy cylinders beside a leaking pair read 111–134 % with intervals above 100).
  for (const c of cylinders) if (c.interval && c.interval[0] > 100) c.interval = [100, c.interval[1]];
  if (held.length) {
    const list = held.map((c) => c.cylinder).join(', ');
    warnings.push(warning('HIGH_HELD', `Cylinder${held.length > 1 ? 's' : ''} ${list} took longer than the others; timing events alone cannot tell high compression from a slow entry after a weak cylinder. Confirm with a gauge test.`));
  }
}

/**
 * Event duration reads each cylinder against the quickest events. When half or more read low against the rest, it
 * cannot tell a worn engine from a few events hurried by a dead neighbour's missing compression (measured on the
 * ensemble: healthy cylinders of an inline six with one dead read 63 % against a lone 100 %), and beside a cylinder
 * with almost no compression it cannot judge the others (an odd-fire V6 read a healthy one 69 %). Such low
 * cylinders that still hold some compression are `uncertain`, their intervals reaching past 100 %, with a sentence.
 */
export function holdMostLow(cylinders: CylinderResult[], warnings: QualityWarning[]): void {
  dropWarnings(warnings, (w) => w.code === 'MOST_LOW_HELD');
  const low = cylinders.filter((c) => c.status === 'low');
  const dead = cylinders.some((c) => c.relativePercent !== null && c.relativePercent < MOST_LOW_KEEPS_BELOW);
  const most = low.length * 2 >= cylinders.length;
  if (!most && !dead) return;
  const held = low.filter((c) => (c.relativePercent ?? 0) >= MOST_LOW_KEEPS_BELOW);
  for (const c of held) holdPerhapsHealthy(c);
  if (held.length) {
    const list = `cylinder${held.length > 1 ? 's' : ''} ${held.map((c) => c.cylinder).join(', ')} ${held.length > 1 ? 'are' : 'is'} not judged`;
    const why = most
      ? 'Half or more of the cylinders read low against the others; timing events alone cannot tell a worn engine from a few cylinders hurried by a weak neighbour'
      : "A cylinder with almost no compression upsets the crank's pace through the whole cycle; timing events alone cannot judge the others that read low beside it";
    warnings.push(warning('MOST_LOW_HELD', `${why}, so ${list}. Gauge ${held.length > 1 ? 'them' : 'it'} to settle it.`));
  }
}

/** A cylinder below this (percent) is low whatever the others read. */
const MOST_LOW_KEEPS_BELOW = 40;

/**
 * How far below the low limit a cylinder right after a low one may read and still be the starter's doing: on the
 * ensemble's starters (battery up to 25 mΩ, light armatures) a healthy cylinder read as low as 53 % there.
 */
const AFTER_LOW_MARGIN = 40;
/** A held cylinder's interval reaches at least this high (percent): a healthy cylinder reads 100 % give or take a few. */
const AFTER_LOW_REACH = 104;

/** A low reading that may be a healthy cylinder misread: `uncertain`, its interval reaching past 100 %. */
function holdPerhapsHealthy(c: CylinderResult): void {
  c.status = 'uncertain';
  if (c.interval) c.interval = [c.interval[0], Math.max(c.interval[1], AFTER_LOW_REACH)];
}
/** The same on crank speed, where the spill from a neighbour is smaller (up to 18 points on the ensemble). */
const AFTER_LOW_MARGIN_CRANK = 20;

/**
 * Capture quality in one word, from the component that limits it most: thin evidence or no compression (poor),
 * complete events per cylinder (≥ 6 good, 3–5 fair), the median interval half-width (≤ 4 points good, ≤ 8 fair),
 * and cylinder identity (assumed is fair).
 */
export function gradeCapture(cylinders: CylinderResult[], warnings: QualityWarning[], thin: boolean, identityAssumed: boolean): QualityGrade {
  const codes = new Set(warnings.map((w) => w.code));
  if (codes.has('NO_COMPRESSION')) return { grade: 'poor', limitedBy: 'compression', note: 'No compression signature was found.' };
  if (codes.has('SAMPLE_RATE_TOO_LOW')) return { grade: 'poor', limitedBy: 'sample rate', note: 'The capture was sampled too slowly for its compression events.' };
  if (codes.has('WHEEL_TOO_COARSE') && thin) return { grade: 'poor', limitedBy: 'wheel resolution', note: 'The crank wheel has too few teeth per compression event.' };
  const events = Math.min(...cylinders.map((c) => c.events));
  if (thin || events < 3) return { grade: 'poor', limitedBy: 'cycles', note: `Only ${events} complete event(s) per cylinder could be used.` };
  const halves = cylinders.filter((c) => c.interval).map((c) => (c.interval![1] - c.interval![0]) / 2).sort((a, b) => a - b);
  const half = halves.length ? halves[halves.length >> 1] : Infinity;
  const parts: QualityGrade[] = [
    { grade: events >= 6 ? 'good' : 'fair', limitedBy: 'cycles', note: `${events} complete events per cylinder; 6 or more give the tightest figures.` },
    { grade: half <= 4 ? 'good' : half <= 8 ? 'fair' : 'poor', limitedBy: 'noise', note: `The figures are good to about ±${fmt(half)} points.` },
    { grade: identityAssumed ? 'fair' : 'good', limitedBy: 'identity', note: identityAssumed ? 'Cylinder numbers are assumed (no sync, cam or injector channel).' : 'Cylinder numbers come from the capture.' },
  ];
  const rank = { poor: 0, fair: 1, good: 2 } as const;
  const worst = parts.reduce((a, b) => (rank[b.grade] < rank[a.grade] ? b : a));
  return worst.grade === 'good' ? { grade: 'good', limitedBy: 'none', note: `The figures are good to about ±${fmt(half)} points.` } : worst;
}

function fmt(v: number): string {
  return (Math.round(v * 10) / 10).toString();
}
