/** Pure formatting for the report PDF: condition rows ("not recorded", never invented) and the trace excerpt. */
import type { Conditions } from '@/db/validators/report';
import type { TemperatureUnit } from '@/domain/shop-settings';
import { temperatureText } from '@/domain/units';
import { type AnalysisResult, decimateMinMax, identityWords, importCapture, indexAtTime } from '@/signal';
import type { PdfTrace } from './report-document';

export const NR = 'not recorded';

/** The test conditions as report rows; the coolant temperature in the shop's unit (stored in °C). */
export function conditionRows(c: Conditions, r?: AnalysisResult, unit: TemperatureUnit = 'C'): [string, string][] {
  const v = (x: number | undefined, unit: string) => (x === undefined ? NR : `${x} ${unit}`);
  return [
    ['Coolant temperature', c.coolantTempC === undefined ? NR : temperatureText(c.coolantTempC, unit)],
    ['Battery rest voltage', v(c.batteryRestV, 'V')],
    ['Lowest cranking voltage', v(c.lowestCrankingV, 'V')],
    ['Mean cranking speed', r ? `${r.crankingRpm} rpm (measured)` : NR],
    ['Throttle position', c.throttle === 'wide-open' ? 'wide open' : c.throttle === 'closed' ? 'closed' : NR],
    ['Fuel disabled by', c.fuelDisabledBy ?? NR],
    ['Sync source', c.syncSource ?? (r ? (r.identity === 'assumed' ? 'none (numbers assumed)' : `capture: ${identityWords(r.identity)}`) : NR)],
    ['Firing order and numbering', r ? `${r.settings.firingOrder.join('-')}${c.numbering ? `, ${c.numbering}` : ''}` : (c.numbering ?? NR)],
  ];
}

/** A decimated stretch of the capture's main channel from the start of the cranking window (about 1.5 s). */
export function traceExcerpt(bytes: Uint8Array, r: AnalysisResult, mapping?: Parameters<typeof importCapture>[1]): PdfTrace | undefined {
  const cap = importCapture(bytes, mapping);
  const c = cap.columns;
  let t: Float64Array | undefined;
  let y: Float64Array | undefined;
  let unit = '';
  let label = '';
  if (c.current && c.time) [t, y, unit, label] = [c.time, c.current, 'A', 'Starter current'];
  else if (c.rpm && c.time) [t, y, unit, label] = [c.time, c.rpm, 'rpm', 'Engine speed'];
  else if (c.crank && c.time) [t, y, unit, label] = [c.time, c.crank, 'V', 'Crank sensor'];
  else if (c.toothTimes) {
    const tt = c.toothTimes;
    t = tt.subarray(1);
    y = new Float64Array(tt.length - 1);
    for (let i = 1; i < tt.length; i++) y[i - 1] = (tt[i] - tt[i - 1]) * 1000;
    unit = 'ms';
    label = 'Tooth period';
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

