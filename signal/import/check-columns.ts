/** Checks decoded columns: time going backwards, gaps, missing values and clipped (flat-topped) signals. */
import { type QualityWarning, warning } from '../warnings';

/** Warnings about the time column (backwards, missing, gaps) from one pass; `firstLine` maps row 0 to its line. */
export function checkTime(t: Float64Array, firstLine: number): QualityWarning[] {
  const out: QualityWarning[] = [];
  // The typical step, from a sparse sample, so gaps can be found in the same pass.
  const probe: number[] = [];
  const stride = Math.max(1, Math.floor(t.length / 2000));
  for (let i = stride; i < t.length; i += stride) probe.push((t[i] - t[i - stride]) / stride);
  probe.sort((a, b) => a - b);
  const gapStep = t.length > 10 ? 3 * probe[probe.length >> 1] : Infinity;
  let backwards = 0;
  let firstBack = -1;
  let nan = 0;
  let gaps = 0;
  let firstGap = -1;
  for (let i = 1; i < t.length; i++) {
    const d = t[i] - t[i - 1];
    if (d !== d) {
      if (t[i] !== t[i]) nan++;
    } else if (d <= 0) {
      backwards++;
      if (firstBack < 0) firstBack = i;
    } else if (d > gapStep) {
      gaps++;
      if (firstGap < 0) firstGap = i;
    }
  }
  if (backwards > 0) {
    out.push(warning('TIME_NOT_MONOTONIC', `Time goes backwards or repeats ${backwards} time(s), first at line ${firstBack + firstLine}; the file may join two recordings. Export one recording per file.`));
  }
  if (nan > 0) out.push(warning('MISSING_VALUES', `${nan} time value(s) are missing; those rows are ignored.`));
  if (gaps > 0) out.push(warning('TIME_GAPS', `The recording has ${gaps} gap(s) in time, first at line ${firstGap + firstLine}; the logger dropped samples. Record again at a rate it can keep up with.`));
  return out;
}

/** Share of samples sitting in flat runs (≥ 5 samples) at the column's extreme value, in one pass. */
export function clippedShare(v: Float64Array): number {
  let hi = -Infinity;
  let lo = Infinity;
  let flat = 0;
  let run = 0;
  for (let i = 0; i < v.length; i++) {
    const x = v[i];
    if (x > hi) {
      // A new maximum: runs at the old one no longer count.
      hi = x;
      flat = 0;
      run = 1;
    } else if (x === hi) {
      run++;
    } else {
      if (run >= 5) flat += run;
      run = 0;
    }
    if (x < lo) lo = x;
  }
  if (run >= 5) flat += run;
  return hi > lo ? flat / v.length : 0;
}

export function checkValues(name: string, v: Float64Array, clipMatters: boolean, nan: number): QualityWarning[] {
  const out: QualityWarning[] = [];
  if (nan === v.length) out.push(warning('MISSING_VALUES', `The ${name} channel holds no numbers at all; check the column mapping.`));
  else if (nan > 0) out.push(warning('MISSING_VALUES', `The ${name} channel has ${nan} missing value(s); they are filled from their neighbours.`));
  if (clipMatters && clippedShare(v) > 0.002) {
    out.push(warning('CLIPPED_SIGNAL', `The ${name} channel is flat-topped (clipped) at its highest value; set a larger range on the scope or probe and record again.`));
  }
  return out;
}

/** Replaces NaN with the previous value (leading NaN with the first number). Returns how many were missing. */
export function fillMissing(v: Float64Array): number {
  let missing = 0;
  let last = NaN;
  let leading = 0;
  for (let i = 0; i < v.length; i++) {
    const x = v[i];
    if (x !== x) {
      missing++;
      if (last === last) v[i] = last;
      else leading++;
    } else last = x;
  }
  if (leading > 0 && last === last) {
    let first = 0;
    while (first < v.length && v[first] !== v[first]) first++;
    if (first < v.length) v.fill(v[first], 0, first);
  }
  return missing;
}
