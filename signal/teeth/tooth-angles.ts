/**
 * Finds the missing-tooth gaps in crank-tooth edge times (a period about missing + 1 times both
 * neighbours, ±25 %), works out the tooth pattern, and gives each edge its crank angle.
 */

export interface ToothPattern {
  /** Tooth positions on the wheel, including the missing ones (60 for 60-2). */
  count: number;
  missing: number;
}

export interface ToothAngles {
  pattern: ToothPattern;
  /** Edge times, s, from the first gap on. */
  times: Float64Array;
  /** Crank angle of each edge, degrees, unwrapped, 0 at the first tooth after the first gap. */
  angleDeg: Float64Array;
  /** Revolutions seen between gaps. */
  revolutions: number;
}

/** Parses "60-2" into a pattern. */
export function parseToothPattern(text: string): ToothPattern | null {
  const m = /^\s*(\d{1,3})\s*-\s*(\d)\s*$/.exec(text);
  if (!m) return null;
  const count = Number(m[1]);
  const missing = Number(m[2]);
  if (count < 3 || missing < 1 || missing >= count / 2) return null;
  return { count, missing };
}

/** Indices k where the period times[k+1] − times[k] is a gap of `missing` teeth. */
export function findGaps(times: Float64Array, missing: number): number[] {
  const gaps: number[] = [];
  const nominal = missing + 1;
  for (let k = 1; k + 2 < times.length; k++) {
    const d = times[k + 1] - times[k];
    const before = times[k] - times[k - 1];
    const after = times[k + 2] - times[k + 1];
    const rb = d / before;
    const ra = d / after;
    if (rb > nominal * 0.75 && rb < nominal * 1.25 && ra > nominal * 0.75 && ra < nominal * 1.25) gaps.push(k);
  }
  return gaps;
}

/** Detects the tooth pattern from the edge times: the gap ratio and the teeth between gaps. */
export function detectPattern(times: Float64Array): ToothPattern | null {
  for (const missing of [2, 1, 3]) {
    const gaps = findGaps(times, missing);
    if (gaps.length < 2) continue;
    const counts: number[] = [];
    for (let g = 1; g < gaps.length; g++) counts.push(gaps[g] - gaps[g - 1]);
    counts.sort((a, b) => a - b);
    const present = counts[counts.length >> 1];
    const agree = counts.filter((c) => c === present).length / counts.length;
    if (agree >= 0.6 && present >= 2) return { count: present + missing, missing };
  }
  return null;
}

/**
 * Gives every edge from the first gap on its crank angle, counting pitches (a gap spans missing + 1).
 * Tooth positions are counted from each gap, so one gap lost in noise does not shift the angles; a gap found
 * where none is expected re-synchronises the count. Returns null when no gap of the pattern is found.
 */
export function toothAngles(times: Float64Array, pattern: ToothPattern): ToothAngles | null {
  const gaps = findGaps(times, pattern.missing);
  if (gaps.length === 0) return null;
  const pitch = 360 / pattern.count;
  const present = pattern.count - pattern.missing;
  const first = gaps[0] + 1;
  const gapSet = new Set(gaps);
  const m = times.length - first;
  const outT = new Float64Array(m);
  const outA = new Float64Array(m);
  let pos = 0;
  let revolutions = 0;
  for (let k = first; k < times.length; k++) {
    outT[k - first] = times[k];
    outA[k - first] = revolutions * 360 + pos * pitch;
    if (pos === present - 1 || gapSet.has(k)) {
      revolutions++;
      pos = 0;
    } else {
      pos++;
    }
  }
  return { pattern, times: outT, angleDeg: outA, revolutions };
}

/** Tooth period at a steady speed: 60 / (rpm × tooth pitches per revolution), s. */
export function toothPeriodS(rpm: number, pitches: number): number {
  return 60 / (rpm * pitches);
}
