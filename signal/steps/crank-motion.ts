/**
 * The crank's motion in one form for every method: rows with a time, a crank angle, the left side of the
 * torque balance (∝ J·dω/dt) and a speed-like term, ready for the torque fit.
 */

export interface CrankMotion {
  /** Time of each row, s. */
  t: Float64Array;
  /** Crank angle, degrees, increasing; 0 is the method's own reference (sync pulse, wheel gap or first event). */
  thetaDeg: Float64Array;
  /** ∝ dω/dt: the crank's angular acceleration (crank speed) or −dI/dt (starter current). */
  y: Float64Array;
  /** ω in rad/s (crank speed) or the current in A (starter current). */
  s: Float64Array;
}

const TWO_PI = 2 * Math.PI;

/** Mean crank speed over the rows, rpm, from the angle covered. */
export function meanRpm(m: Pick<CrankMotion, 't' | 'thetaDeg'>): number {
  const last = m.t.length - 1;
  const dt = last > 0 ? m.t[last] - m.t[0] : 0;
  return dt > 0 ? (m.thetaDeg[last] - m.thetaDeg[0]) / 6 / dt : 0;
}

/**
 * Rows from tooth edges: speed over each tooth interval, and the acceleration from the work–energy theorem on the
 * teeth's equal angles, dω/dt = d(ω²/2)/dθ, by central difference over the angle. Where the crank nearly stops
 * at a TDC its speed changes by half within one tooth; a difference over time then smears the torque across the
 * slow tooth, while one over angle keeps it where the torque model puts it (it is a function of angle).
 */
export function motionFromTeeth(times: Float64Array, angleDeg: Float64Array, fromS: number, toS: number): CrankMotion {
  const m = times.length - 1;
  const tm = new Float64Array(m);
  const am = new Float64Array(m);
  const w = new Float64Array(m);
  for (let k = 0; k < m; k++) {
    const dt = times[k + 1] - times[k];
    tm[k] = (times[k] + times[k + 1]) / 2;
    am[k] = (angleDeg[k] + angleDeg[k + 1]) / 2;
    w[k] = dt > 0 ? ((angleDeg[k + 1] - angleDeg[k]) * TWO_PI) / 360 / dt : 0;
  }
  const rows: number[] = [];
  for (let k = 1; k + 1 < m; k++) if (tm[k] >= fromS && tm[k] <= toS) rows.push(k);
  const out = alloc(rows.length);
  for (let r = 0; r < rows.length; r++) {
    const k = rows[r];
    out.t[r] = tm[k];
    out.thetaDeg[r] = am[k];
    out.s[r] = w[k];
    out.y[r] = (w[k + 1] * w[k + 1] - w[k - 1] * w[k - 1]) / (((am[k + 1] - am[k - 1]) * TWO_PI) / 180);
  }
  return out;
}

/** Rows from a sampled engine-speed channel (rpm): angle by integration, acceleration by central difference. */
export function motionFromSpeed(t: Float64Array, rpm: Float64Array, from: number, to: number, step: number): CrankMotion {
  const idx: number[] = [];
  for (let i = Math.max(from, step); i + step < to; i += step) idx.push(i);
  const out = alloc(idx.length);
  let theta = 0;
  let last = from;
  for (let r = 0; r < idx.length; r++) {
    const i = idx[r];
    for (let j = last; j < i; j++) theta += ((rpm[j] + rpm[j + 1]) / 2) * 6 * (t[j + 1] - t[j]);
    last = i;
    const w = (rpm[i] * TWO_PI) / 60;
    out.t[r] = t[i];
    out.thetaDeg[r] = theta;
    out.s[r] = w;
    out.y[r] = (((rpm[i + step] - rpm[i - step]) * TWO_PI) / 60) / (t[i + step] - t[i - step]);
  }
  return out;
}

/**
 * Rows from starter current. A DC starter's speed is affine in its current, ω ∝ (I_stall − I), so the angle
 * is the integral of (I_stall − I), scaled so that consecutive marks are `markAngles` apart; the left side is
 * −dI/dt. `it` and `current` are the smoothed, down-sampled current and its times.
 */
export function motionFromCurrent(
  it: Float64Array,
  current: Float64Array,
  marksS: number[],
  markAnglesDeg: number[],
  stallA: number,
): CrankMotion {
  const first = marksS[0];
  const last = marksS[marksS.length - 1];
  const idx: number[] = [];
  for (let i = 2; i + 2 < it.length; i++) if (it[i] >= first && it[i] < last) idx.push(i);
  const out = alloc(idx.length);
  if (idx.length === 0) return out;
  // Integral of (I_stall − I) up to every sample, then piecewise scaling between marks.
  const cum = new Float64Array(it.length);
  for (let i = 1; i < it.length; i++) cum[i] = cum[i - 1] + (stallA - (current[i] + current[i - 1]) / 2) * (it[i] - it[i - 1]);
  const cumAt = (time: number) => {
    let lo = 0;
    let hi = it.length - 1;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (it[mid] <= time) lo = mid;
      else hi = mid;
    }
    const f = it[hi] > it[lo] ? (time - it[lo]) / (it[hi] - it[lo]) : 0;
    return cum[lo] + f * (cum[hi] - cum[lo]);
  };
  const markCum = marksS.map(cumAt);
  const markTheta: number[] = [0];
  for (let k = 1; k < marksS.length; k++) markTheta.push(markTheta[k - 1] + markAnglesDeg[k - 1]);
  let seg = 0;
  for (let r = 0; r < idx.length; r++) {
    const i = idx[r];
    while (seg + 2 < marksS.length && it[i] >= marksS[seg + 1]) seg++;
    const span = markCum[seg + 1] - markCum[seg];
    const f = span > 0 ? (cum[i] - markCum[seg]) / span : 0;
    out.t[r] = it[i];
    out.thetaDeg[r] = markTheta[seg] + f * (markTheta[seg + 1] - markTheta[seg]);
    out.s[r] = current[i];
    out.y[r] = -(current[i + 2] + current[i + 1] - current[i - 1] - current[i - 2]) / (3 * (it[i + 2] - it[i - 2]) / 2);
  }
  return out;
}

/** The rows whose time `keep` accepts. */
export function keepRows(m: CrankMotion, keep: (t: number) => boolean): CrankMotion {
  const rows: number[] = [];
  for (let r = 0; r < m.t.length; r++) if (keep(m.t[r])) rows.push(r);
  const out = alloc(rows.length);
  rows.forEach((r, k) => {
    out.t[k] = m.t[r];
    out.thetaDeg[k] = m.thetaDeg[r];
    out.y[k] = m.y[r];
    out.s[k] = m.s[r];
  });
  return out;
}

function alloc(n: number): CrankMotion {
  return { t: new Float64Array(n), thetaDeg: new Float64Array(n), y: new Float64Array(n), s: new Float64Array(n) };
}
