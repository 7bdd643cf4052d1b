/**
 * A crank tooth wheel of any layout: positions per revolution, which of them carry a tooth (one or several
 * gaps of one to three missing teeth), and whether one extra tooth sits between two positions. Crankprint's
 * own notation writes it as runs of teeth and gaps from position 0: `36:15/2,14/1,3/1` is 36 positions with
 * 15 teeth, a gap of 2, 14 teeth, a gap of 1, 3 teeth and a gap of 1; `12:12+1` is 12 teeth and one extra
 * tooth; the trade's `60-2` is accepted as one run and one gap.
 */

export interface ToothWheel {
  /** Positions per revolution, including the missing ones; the pitch is 360° / positions. */
  positions: number;
  /** Missing teeth after each present tooth, in wheel order from position 0 (one entry per present tooth). */
  gapsAfter: number[];
  /** One extra tooth per revolution, just before position 0 (it is dropped when angles are given). */
  extraTooth: boolean;
}

/** Present teeth per revolution. */
/** Positions a wheel's teeth and gaps cover: each tooth one pitch, each gap its missing teeth. */
export function positionsOf(gapsAfter: readonly number[]): number {
  return gapsAfter.length + gapsAfter.reduce((a, b) => a + b, 0);
}

export function teethOf(w: ToothWheel): number {
  return w.gapsAfter.length;
}

/** A one-gap wheel as the trade writes it: 60-2 is 60 positions, 58 teeth, one gap of 2. */
export function simpleWheel(count: number, missing: number): ToothWheel {
  const gapsAfter = new Array<number>(count - missing).fill(0);
  if (missing > 0) gapsAfter[gapsAfter.length - 1] = missing;
  return { positions: count, gapsAfter, extraTooth: false };
}

/** Gap sizes in wheel order. */
export function gapSizes(w: ToothWheel): number[] {
  return w.gapsAfter.filter((g) => g > 0);
}

/** The wheel in our notation (`60-2` for a one-gap wheel, runs and gaps otherwise). */
export function wheelNotation(w: ToothWheel): string {
  const gaps = gapSizes(w);
  if (gaps.length === 1 && !w.extraTooth && w.gapsAfter[w.gapsAfter.length - 1] > 0) return `${w.positions}-${gaps[0]}`;
  const parts: string[] = [];
  let run = 0;
  for (const g of w.gapsAfter) {
    run++;
    if (g > 0) {
      parts.push(`${run}/${g}`);
      run = 0;
    }
  }
  if (run > 0) parts.push(`${run}`);
  return `${w.positions}:${parts.join(',')}${w.extraTooth ? '+1' : ''}`;
}

/** The wheel in plain words: "36 positions, 32 teeth, gaps of 2, 1 and 1". */
export function describeWheel(w: ToothWheel): string {
  const gaps = gapSizes(w);
  const teeth = teethOf(w);
  const list = gaps.length > 1 ? `gaps of ${gaps.slice(0, -1).join(', ')} and ${gaps[gaps.length - 1]}` : gaps.length === 1 ? `a gap of ${gaps[0]}` : 'no gap';
  const extra = w.extraTooth ? ' and one extra tooth' : '';
  return `${w.positions} positions, ${teeth} teeth, ${list}${extra}`;
}

/**
 * Parses a wheel: `60-2`, `36:15/2,14/1,3/1` or `12:12+1`. Null when the text is not a wheel or does not add
 * up (runs and gaps must cover the positions exactly; gaps of 1 to 3).
 */
export function parseWheel(text: string): ToothWheel | null {
  const t = text.trim();
  const simple = /^(\d{1,3})\s*-\s*(\d)$/.exec(t);
  if (simple) {
    const count = Number(simple[1]);
    const missing = Number(simple[2]);
    if (count < 3 || missing < 1 || missing > 3 || missing >= count / 2) return null;
    return simpleWheel(count, missing);
  }
  const m = /^(\d{1,3}):([\d/,\s]+?)(\+1)?$/.exec(t);
  if (!m) return null;
  const positions = Number(m[1]);
  const gapsAfter: number[] = [];
  for (const part of m[2].split(',')) {
    const pm = /^\s*(\d{1,3})(?:\/(\d))?\s*$/.exec(part);
    if (!pm) return null;
    const run = Number(pm[1]);
    const gap = pm[2] === undefined ? 0 : Number(pm[2]);
    if (run < 1 || gap > 3 || (pm[2] !== undefined && gap < 1)) return null;
    for (let i = 0; i < run; i++) gapsAfter.push(0);
    gapsAfter[gapsAfter.length - 1] = gap;
  }
  if (positions < 3 || positionsOf(gapsAfter) !== positions) return null;
  return { positions, gapsAfter, extraTooth: !!m[3] };
}

/** Tooth period at a steady speed: 60 / (rpm × tooth pitches per revolution), s. */
export function toothPeriodS(rpm: number, pitches: number): number {
  return 60 / (rpm * pitches);
}
