/**
 * The trace excerpt a report shows: a min/max-decimated stretch (300 columns, about 1.5 s from the start of the
 * cranking window) of the capture's main channel, with the events the analysis used. It is drawn once, when an
 * analysis is saved, from the columns the analysis read, and stored with it, so a report never parses the file.
 */
import { type AnalysisResult, type CaptureColumns, decimateMinMax, indexAtTime, toothPeriods } from '@/signal';

export interface TraceExcerpt {
  t: number[];
  v: number[];
  unit: string;
  label: string;
  events: { timeS: number; cylinder: number }[];
}

export function traceExcerpt(c: CaptureColumns, r: AnalysisResult): TraceExcerpt | undefined {
  let t: Float64Array | undefined;
  let y: Float64Array | undefined;
  let unit = '';
  let label = '';
  if (c.current && c.time) [t, y, unit, label] = [c.time, c.current, 'A', 'Starter current'];
  else if (c.rpm && c.time) [t, y, unit, label] = [c.time, c.rpm, 'rpm', 'Engine speed'];
  else if (c.crank && c.time) [t, y, unit, label] = [c.time, c.crank, 'V', 'Crank sensor'];
  else if (c.toothTimes) {
    // The same tooth period the screen draws: a gap reads as speed, not as a spike.
    const p = toothPeriods(c.toothTimes);
    if (p) [t, y, unit, label] = [p.t, p.v, 'ms', 'Tooth period'];
  }
  if (!t || !y) return undefined;
  const from = r.window.endS > 0 ? r.window.startS : t[0];
  const to = Math.min(r.window.endS > 0 ? r.window.endS : t[t.length - 1], from + 1.5);
  const view = decimateMinMax(t, y, indexAtTime(t, from), indexAtTime(t, to), 300);
  const ts: number[] = [];
  const vs: number[] = [];
  for (let i = 0; i < view.x.length; i++) {
    ts.push(view.x[i], view.x[i]);
    vs.push(view.min[i], view.max[i]);
  }
  return { t: ts, v: vs, unit, label: `${label} (${unit}), ${from.toFixed(2)}–${to.toFixed(2)} s`, events: r.events.filter((e) => e.used).map((e) => ({ timeS: e.timeS, cylinder: e.cylinder })) };
}
