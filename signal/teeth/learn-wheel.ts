/**
 * Learns a tooth wheel from crank edge times and gives every edge its crank angle. Each tooth period is
 * measured in local pitches (the period over the median of its seven neighbours), so a gap of k missing teeth
 * reads about k + 1 and an extra tooth splits one pitch into a short pair. The pattern's repeat is one
 * revolution; each position's size is the median over all revolutions. Glitch edges (far too soon after the
 * last) are dropped first; a revolution with one edge too few or too many is repaired and counted.
 */
import { positionsOf, type ToothWheel, teethOf } from './wheel';

export interface WheelAngles {
  wheel: ToothWheel;
  /** Edge times, s, of the revolutions that matched the wheel. */
  times: Float64Array;
  /** Crank angle of each edge, degrees, unwrapped; 0 at position 0 of the first matched revolution. */
  angleDeg: Float64Array;
  revolutions: number;
  /** Edges dropped as glitches (too soon, or one too many in a revolution). */
  dropped: number;
  /** Edges inserted where one was missing. */
  inserted: number;
  /** Revolutions whose edges could not be matched to the wheel (left out). */
  unmatched: number;
  /** Where each repair was made. */
  repairs: TeethRepair[];
}

/** A repair of the crank signal: edges dropped or inserted, or revolutions left out, within [fromS, toS]. */
export interface TeethRepair {
  kind: 'dropped' | 'inserted' | 'unmatched';
  count: number;
  fromS: number;
  toS: number;
}

/** Edges closer than this share of the local tooth period to the previous one are glitches. */
const GLITCH_SHARE = 0.2;

/** Drops edges that come far too soon after the previous one (contact bounce, ignition noise). */
export function dropGlitches(times: Float64Array): { times: Float64Array; dropped: number; droppedAtS: number[] } {
  const n = times.length;
  if (n < 4) return { times, dropped: 0, droppedAtS: [] };
  const out: number[] = [times[0]];
  const droppedAtS: number[] = [];
  const d = new Float64Array(n - 1);
  for (let k = 0; k + 1 < n; k++) d[k] = times[k + 1] - times[k];
  for (let k = 1; k < n; k++) {
    const local = localMedian(d, k - 1, 4);
    if (times[k] - out[out.length - 1] < GLITCH_SHARE * local || !(times[k] > out[out.length - 1])) {
      droppedAtS.push(times[k]);
      continue;
    }
    out.push(times[k]);
  }
  return { times: Float64Array.from(out), dropped: droppedAtS.length, droppedAtS };
}

/**
 * Each period in local pitches. On a fine wheel the local pitch is the geometric mean of the two periods next
 * to it (a compression dip spans many teeth, so neighbours are alike); on a coarse wheel, whose neighbours swing
 * with compression from one tooth to the next, it is the median of the six periods around it.
 */
export function pitchUnits(times: Float64Array, coarse = false): Float64Array {
  const n = times.length - 1;
  const d = new Float64Array(Math.max(0, n));
  for (let k = 0; k < n; k++) d[k] = times[k + 1] - times[k];
  const u = new Float64Array(Math.max(0, n));
  for (let k = 0; k < n; k++) {
    u[k] = coarse || k === 0 || k + 1 >= n ? d[k] / localMedian(d, k, 3, true) : d[k] / Math.sqrt(d[k - 1] * d[k + 1]);
  }
  return u;
}

/** Fewer teeth than this per revolution make a coarse wheel. */
const COARSE_TEETH = 16;

function localMedian(d: Float64Array, k: number, half: number, excludeSelf = false): number {
  const vals: number[] = [];
  for (let j = Math.max(0, k - half); j <= Math.min(d.length - 1, k + half); j++) if (!(excludeSelf && j === k)) vals.push(d[j]);
  vals.sort((a, b) => a - b);
  return vals.length ? vals[vals.length >> 1] : d[k];
}

/** Period class: 0 a plain pitch, k ≥ 1 a gap of k missing teeth, −1 the short first half of an extra tooth. */
function classify(u: Float64Array, k: number): number {
  const x = u[k];
  if (x >= 1.5) return Math.min(3, Math.round(x) - 1);
  if (x < 0.7 && k + 1 < u.length && u[k] + u[k + 1] > 0.8 && u[k] + u[k + 1] < 1.25) return -1;
  return 0;
}

/**
 * Learns the wheel: the repeat of the period classes is one revolution; each position's size is the median over
 * revolutions. Null when no gap or extra tooth repeats (a wheel with no reference mark cannot give an angle).
 */
export function learnWheel(times: Float64Array): ToothWheel | null {
  const fine = learnWith(pitchUnits(times, false), times);
  if (fine && teethOf(fine) >= COARSE_TEETH) return fine;
  const coarse = learnWith(pitchUnits(times, true));
  // Both readings find the same one-gap pattern of 8 or more teeth (the same gap every 120°, say): its
  // neighbours are alike, so the fine reading, which votes the gap's own size, is the better one.
  const sameGapped = (w: ToothWheel | null) => !!w && !w.extraTooth && teethOf(w) >= 8 && w.gapsAfter.filter((g) => g > 0).length === 1;
  if (fine && coarse && sameGapped(fine) && sameGapped(coarse) && teethOf(fine) === teethOf(coarse)) return fine;
  return coarse ?? fine;
}

function learnWith(u: Float64Array, times?: Float64Array): ToothWheel | null {
  const n = u.length;
  if (n < 12) return null;
  // For the revolution's repeat, a gap is a gap whatever its size: compression can stretch one gap more on
  // one revolution than the next (an engine with an odd number of events a revolution).
  const cls = new Int8Array(n);
  let marks = 0;
  for (let k = 0; k < n; k++) {
    cls[k] = Math.sign(classify(u, k));
    if (cls[k] !== 0) marks++;
  }
  if (marks < 2) return null;
  // The revolution: the smallest lag at which the marks repeat in at least 80 % of places.
  // The revolution: the lag at which the marks repeat best (the smallest within 90 % of the best agreement, so a
  // multiple of the revolution does not win). The first and last periods are often the starter engaging or
  // letting go: left out of the search.
  const scores: number[] = [];
  for (let L = 2; L <= Math.min(200, Math.floor(n / 2)); L++) {
    let same = 0;
    let seen = 0;
    for (let k = 2; k + L < n - 2; k++) {
      if (cls[k] === 0 && cls[k + L] === 0) continue;
      seen++;
      if (cls[k] === cls[k + L]) same++;
    }
    // Long lags see fewer pairs: weigh the agreement by the share of the capture the pairs cover.
    scores[L] = seen >= 2 ? ((same / seen) * (n - L)) / n : 0;
  }
  const best = Math.max(0, ...scores.filter(Number.isFinite));
  let lag = 0;
  if (best >= 0.45) for (let L = 2; L < scores.length && !lag; L++) if (scores[L] >= 0.9 * best) lag = L;
  if (!lag) return null;
  // Each position's size over all revolutions, each revolution anchored on its own first mark (found within one
  // period of where it is expected), so a lost or extra edge does not shift the revolutions after it. The
  // geometric mean over revolutions (the two extremes dropped) makes a gap read long on one revolution and
  // short on the next come out at its size.
  const first = 2 + cls.subarray(2).findIndex((c) => c !== 0);
  const perSlot: number[][] = Array.from({ length: lag }, () => []);
  const slotIndex: number[][] = Array.from({ length: lag }, () => []);
  for (let anchor = first; anchor + lag <= n; ) {
    for (let j = 0; j < lag; j++) {
      perSlot[j].push(Math.log(u[anchor + j]));
      slotIndex[j].push(anchor + j);
    }
    const expected = anchor + lag;
    anchor = cls[expected] !== 0 ? expected : cls[expected - 1] !== 0 ? expected - 1 : cls[expected + 1] !== 0 ? expected + 1 : expected;
  }
  const size = new Float64Array(lag);
  for (let j = 0; j < lag; j++) {
    const vals = perSlot[j].sort((a, b) => a - b);
    const kept = vals.length > 4 ? vals.slice(1, -1) : vals;
    size[j] = kept.length ? Math.exp(kept.reduce((a, b) => a + b, 0) / kept.length) : 1;
  }
  const medianCls = (j: number) => classify(size, j);
  let extraAt = -1;
  // An extra tooth is the reference only on a wheel without gaps (a short pair on a gapped wheel is compression).
  const gapped = Array.from(size).some((_, j) => medianCls(j) > 0);
  for (let j = 0; j < lag; j++) if (!gapped && medianCls(j) === -1 && extraAt < 0) extraAt = j;
  // With an extra tooth the revolution holds lag periods but one pitch fewer positions.
  const gapsAfter: number[] = [];
  // Each gap's votes over its sizes (none without edge times), kept for the whole-degrees check below.
  const votes: number[][] = [];
  const start = extraAt >= 0 ? (extraAt + 2) % lag : startAfterLargestGap(size);
  for (let i = 0; i < lag; i++) {
    const j = (start + i) % lag;
    if (extraAt >= 0 && j === extraAt) continue;
    const c = medianCls(j);
    const voted = c > 0 && times ? votedGap(times, slotIndex[j]) : null;
    votes.push(voted?.votes ?? [0, 0, 0, 0]);
    gapsAfter.push(c > 0 ? voted?.winner || c : 0);
  }
  if (extraAt < 0 && !gapsAfter.some((g) => g > 0)) return null;
  roundToWholeDegrees(gapsAfter, votes);
  return { positions: positionsOf(gapsAfter), gapsAfter, extraTooth: extraAt >= 0 };
}

/** Position 0 is the tooth after the largest gap (the first of equal ones followed by the longest run). */
function startAfterLargestGap(size: Float64Array): number {
  const L = size.length;
  const cls = Array.from({ length: L }, (_, j) => classify(size, j));
  const biggest = Math.max(...cls);
  let best = 0;
  let bestRun = -1;
  for (let j = 0; j < L; j++) {
    if (cls[j] !== biggest) continue;
    let run = 1;
    while (run < L && cls[(j + run) % L] <= 0) run++;
    if (run > bestRun) {
      bestRun = run;
      best = j;
    }
  }
  return (best + 1) % L;
}

/**
 * Gives each edge its crank angle on a known wheel. Revolutions are found from the wheel's reference (its
 * largest gap, told apart from equal gaps by the run of teeth after it, or its extra tooth); between two
 * references there must be one revolution's teeth. One edge too few is inserted in the longest period, one too
 * many is dropped where two periods add up to one pitch; anything else leaves that revolution out.
 */
export function wheelAngles(rawTimes: Float64Array, wheel: ToothWheel): WheelAngles | null {
  let times = rawTimes;
  let dropped = 0;
  const teeth = teethOf(wheel);
  // A one-gap pattern of 8 or more teeth has alike neighbours around its gap (learnWheel reads it so too).
  const coarse = teeth < COARSE_TEETH && !(teeth >= 8 && !wheel.extraTooth && wheel.gapsAfter.filter((g) => g > 0).length === 1);
  const pitch = 360 / wheel.positions;
  const refs: number[] = [];
  if (wheel.extraTooth) {
    // Remove the extra edges; the edge after each one is position 0.
    // The short period lies between the extra edge and a regular one: drop the edge whose removal leaves a
    // period closest to its neighbours'.
    const u = pitchUnits(times, true);
    const kept: number[] = [];
    const zero = new Set<number>();
    const drop = new Set<number>();
    for (let k = 1; k + 2 < times.length; k++) {
      if (classify(u, k) !== -1) continue;
      const ref = (times[k] - times[k - 1] + times[k + 2] - times[k + 1]) / 2;
      const dropEnd = Math.abs(times[k + 2] - times[k] - ref);
      const dropStart = Math.abs(times[k + 1] - times[k - 1] - ref);
      drop.add(dropEnd <= dropStart ? k + 1 : k);
    }
    for (let k = 0; k < times.length; k++) {
      if (drop.has(k)) {
        zero.add(kept.length);
        continue;
      }
      kept.push(times[k]);
    }
    times = Float64Array.from(kept);
    refs.push(...[...zero].sort((a, b) => a - b));
  } else {
    const u = pitchUnits(times, coarse);
    const biggest = Math.max(...wheel.gapsAfter);
    const runAfter = runAfterReference(wheel);
    const big: number[] = [];
    for (let k = 0; k < u.length; k++) if (classify(u, k) > 0) big.push(k);
    // A gap far longer than the reference can be (the crank nearly stopping in it, behind a dead cylinder's
    // neighbour) still is the reference when gaps lie one revolution's teeth before and after it, up to three
    // times its own length (the V6 behind a dead cylinder stretched a 60-2 gap to 7 pitches).
    const bigSet = new Set(big);
    const near = (k: number) => [-1, 0, 1].some((e) => bigSet.has(k + e));
    const revolutionAway = (k: number) => near(k + teeth) && near(k - teeth);
    for (let b = 0; b < big.length; b++) {
      const k = big[b];
      // The reference reads at least half a pitch longer than the next-largest gap could (compression can
      // stretch a gap by most of a pitch on a wheel with one gap size).
      if (u[k] < biggest + 0.5 || (u[k] > biggest + 2.5 && !(u[k] <= 3 * (biggest + 1) && revolutionAway(k)))) continue;
      const next = big[b + 1];
      const sameSizeGaps = wheel.gapsAfter.filter((g) => g === biggest).length;
      if (sameSizeGaps > 1 && next !== undefined && next - k !== runAfter) continue;
      refs.push(k + 1);
    }
  }
  if (refs.length < 2) return null;
  const outT: number[] = [];
  const outA: number[] = [];
  let inserted = 0;
  let unmatched = 0;
  const repairs: TeethRepair[] = [];
  // Cumulative pitches to each present tooth from position 0.
  const toothPos = new Float64Array(teeth + 1);
  for (let j = 0; j < teeth; j++) toothPos[j + 1] = toothPos[j] + 1 + wheel.gapsAfter[j];
  const firstRef = refs[0];
  const emit = (span: number[], rev: number) => {
    for (let j = 0; j < span.length; j++) {
      outT.push(span[j]);
      outA.push(rev * 360 + toothPos[j] * pitch);
    }
  };
  for (let r = 0; r + 1 < refs.length; r++) {
    const a = refs[r];
    const b = refs[r + 1];
    const span = Array.from(times.subarray(a, b));
    const revsHere = Math.max(1, Math.round(span.length / teeth));
    const rev = Math.round((a - firstRef) / teeth);
    const leaveOut = (revolutions: number) => {
      unmatched += revolutions;
      repairs.push({ kind: 'unmatched', count: revolutions, fromS: times[a], toS: times[Math.min(b, times.length - 1)] });
    };
    if (revsHere !== 1) {
      leaveOut(revsHere);
      continue;
    }
    if (span.length === teeth - 1) {
      const at = insertMissing(span, wheel);
      inserted++;
      repairs.push({ kind: 'inserted', count: 1, fromS: at, toS: at });
    } else if (span.length === teeth + 1) {
      const at = dropExtra(span, wheel);
      dropped++;
      repairs.push({ kind: 'dropped', count: 1, fromS: at, toS: at });
    }
    if (span.length !== teeth) {
      leaveOut(1);
      continue;
    }
    emit(span, rev);
  }
  // The partial revolution after the last reference.
  const tail = Array.from(times.subarray(refs[refs.length - 1], Math.min(times.length, refs[refs.length - 1] + teeth)));
  emit(tail, Math.round((refs[refs.length - 1] - firstRef) / teeth));
  const revolutions = Math.max(0, refs.length - 1 - unmatched);
  return { wheel, times: Float64Array.from(outT), angleDeg: Float64Array.from(outA), revolutions, dropped, inserted, unmatched, repairs };
}

/** Teeth from the reference gap to the next gap of any size. */
function runAfterReference(wheel: ToothWheel): number {
  const g = wheel.gapsAfter;
  const biggest = Math.max(...g);
  // Position 0 follows the reference gap: the last entry of gapsAfter is the reference.
  if (g[g.length - 1] !== biggest) return -1;
  let run = 0;
  for (let j = 0; j < g.length; j++) {
    run++;
    if (g[j] > 0) break;
  }
  return run;
}

/**
 * One edge missing: put it in the period that is longest against the wheel's expectation, and give its time (NaN
 * when none was inserted).
 */
function insertMissing(span: number[], wheel: ToothWheel): number {
  let worst = -1;
  let worstRatio = 0;
  const dur = span[span.length - 1] - span[0];
  const pitchS = dur / (wheel.positions - 1 - wheel.gapsAfter[wheel.gapsAfter.length - 1]);
  for (let k = 0; k + 1 < span.length; k++) {
    const expected = (1 + wheel.gapsAfter[k]) * pitchS;
    const ratio = (span[k + 1] - span[k]) / expected;
    if (ratio > worstRatio) {
      worstRatio = ratio;
      worst = k;
    }
  }
  if (worst < 0) return NaN;
  const at = (span[worst] + span[worst + 1]) / 2;
  span.splice(worst + 1, 0, at);
  return at;
}

/** One edge too many: drop the one whose two periods are the shortest pair, and give its time (NaN when none was). */
function dropExtra(span: number[], wheel: ToothWheel): number {
  void wheel;
  let best = -1;
  let bestSum = Infinity;
  for (let k = 1; k + 1 < span.length; k++) {
    const sum = span[k + 1] - span[k - 1];
    if (sum < bestSum) {
      bestSum = sum;
      best = k;
    }
  }
  return best > 0 ? span.splice(best, 1)[0] : NaN;
}

/**
 * Crank wheels divide the revolution into whole degrees (60, 36, 24, 12 positions …). A one-gap wheel whose
 * voted gap makes a count that does not (58 teeth and a gap of 3: 61 positions) misread its gap against a
 * compression dip that stretched it; the gap one tooth smaller or larger that does, with the most votes, is taken.
 */
function roundToWholeDegrees(gapsAfter: number[], votes: number[][]): void {
  const gaps = gapsAfter.map((g, j) => (g > 0 ? j : -1)).filter((j) => j >= 0);
  const positions = positionsOf(gapsAfter);
  if (gaps.length !== 1 || 360 % positions === 0) return;
  const j = gaps[0];
  const g = gapsAfter[j];
  const fits = [g - 1, g + 1].filter((c) => c >= 1 && c <= 3 && 360 % (positions - g + c) === 0);
  if (fits.length) gapsAfter[j] = fits.sort((a, b) => votes[j][b] - votes[j][a])[0];
}

/**
 * A gap's size on a fine wheel, by vote over its occurrences: for each candidate of 1–3 missing teeth, the
 * periods of the three teeth on either side, placed at their angles, give a smooth (quadratic in log) speed
 * curve across the gap; the candidate whose curve best predicts the gap's duration wins. This follows a crank
 * that slows or speeds up across the gap, where a ratio to the neighbours alone reads a gap a tooth long.
 */
function votedGap(times: Float64Array, occurrences: number[]): { winner: number; votes: number[] } {
  const votes = [0, 0, 0, 0];
  for (const k of occurrences) {
    if (k < 3 || k + 4 >= times.length) continue;
    const d = (i: number) => times[i + 1] - times[i];
    let best = 0;
    let bestErr = Infinity;
    for (let m = 1; m <= 3; m++) {
      const xs = [-2.5, -1.5, -0.5, m + 1.5, m + 2.5, m + 3.5];
      const ys = [d(k - 3), d(k - 2), d(k - 1), d(k + 1), d(k + 2), d(k + 3)].map(Math.log);
      const c = quadraticFit(xs, ys);
      if (!c) continue;
      let predicted = 0;
      for (let j = 0; j <= m; j++) predicted += Math.exp(c[0] + c[1] * (j + 0.5) + c[2] * (j + 0.5) ** 2);
      const err = Math.abs(Math.log(d(k) / predicted));
      if (err < bestErr) {
        bestErr = err;
        best = m;
      }
    }
    votes[best]++;
  }
  let winner = 0;
  for (let m = 1; m <= 3; m++) if (votes[m] > votes[winner]) winner = m;
  return { winner, votes };
}

/** Least-squares y = a + b·x + c·x² through the points; null when singular. */
function quadraticFit(xs: number[], ys: number[]): [number, number, number] | null {
  const s = new Float64Array(5);
  const t = new Float64Array(3);
  for (let i = 0; i < xs.length; i++) {
    let p = 1;
    for (let e = 0; e < 5; e++) {
      s[e] += p;
      if (e < 3) t[e] += p * ys[i];
      p *= xs[i];
    }
  }
  const m = [
    [s[0], s[1], s[2], t[0]],
    [s[1], s[2], s[3], t[1]],
    [s[2], s[3], s[4], t[2]],
  ];
  for (let c = 0; c < 3; c++) {
    let piv = c;
    for (let r = c + 1; r < 3; r++) if (Math.abs(m[r][c]) > Math.abs(m[piv][c])) piv = r;
    if (Math.abs(m[piv][c]) < 1e-12) return null;
    [m[c], m[piv]] = [m[piv], m[c]];
    for (let r = 0; r < 3; r++) {
      if (r === c) continue;
      const f = m[r][c] / m[c][c];
      for (let k = c; k < 4; k++) m[r][k] -= f * m[c][k];
    }
  }
  return [m[0][3] / m[0][0], m[1][3] / m[1][1], m[2][3] / m[2][2]];
}
