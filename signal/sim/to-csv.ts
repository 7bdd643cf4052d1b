/** Writes a simulated capture as the kind of text a scope or logger exports. */
import type { SimResult } from './simulate';

export interface CsvStyle {
  /** @default ',' */
  delimiter?: ',' | ';' | '\t';
  /** Time unit in the header. @default 'ms' */
  timeUnit?: 's' | 'ms' | 'us';
  /** Free-text lines before the header. */
  preamble?: string[];
  /** Which channels to write, in order. @default ['current'] */
  channels?: ('current' | 'hall' | 'vr' | 'sync' | 'rpm' | 'battery')[];
  /** Write the current negated, as a clamp put on backwards reads it. @default false */
  invertCurrent?: boolean;
}

const NAMES = {
  current: 'Starter current [A]',
  hall: 'Crank sensor [V]',
  vr: 'Crank sensor [V]',
  sync: 'Cyl 1 sync [V]',
  rpm: 'Engine speed [rpm]',
  battery: 'Battery [V]',
} as const;

const DIGITS = { current: 2, hall: 3, vr: 3, sync: 3, rpm: 2, battery: 3 } as const;

export function simToCsv(sim: SimResult, style: CsvStyle = {}): string {
  const d = style.delimiter ?? ',';
  const unit = style.timeUnit ?? 'ms';
  const scale = unit === 's' ? 1 : unit === 'ms' ? 1e3 : 1e6;
  const tDigits = unit === 's' ? 6 : unit === 'ms' ? 3 : 0;
  const channels = style.channels ?? ['current'];
  const comma = d === ';';
  const fmt = (v: number, digits: number) => {
    const s = v.toFixed(digits);
    return comma ? s.replace('.', ',') : s;
  };
  const lines: string[] = [...(style.preamble ?? [])];
  lines.push([`Time (${unit === 'us' ? 'µs' : unit})`, ...channels.map((c) => NAMES[c])].join(d));
  const cols = channels.map((c) => (c === 'current' && style.invertCurrent ? sim.current!.map((v) => -v) : sim[c]!));
  for (let i = 0; i < sim.time.length; i++) {
    let row = fmt(sim.time[i] * scale, tDigits);
    for (let k = 0; k < cols.length; k++) row += d + fmt(cols[k][i], DIGITS[channels[k]]);
    lines.push(row);
  }
  return lines.join('\n') + '\n';
}

/** One column of tooth edge times, in seconds. */
export function toothTimesToCsv(sim: SimResult, preamble: string[] = []): string {
  const lines = [...preamble, 'Tooth edge time (s)'];
  for (let i = 0; i < sim.toothTimes.length; i++) lines.push(sim.toothTimes[i].toFixed(7));
  return lines.join('\n') + '\n';
}

/**
 * A logic analyser's state-change export: `Time[s]`, the crank level and (with cam edges) a cam level, a row per
 * change. Each tooth is low from its edge for half the time to the next.
 */
export function edgeLogToCsv(sim: SimResult, comment: string[] = []): string {
  const changes: { t: number; ch: 0 | 1; level: 0 | 1 }[] = [];
  const tt = sim.toothTimes;
  for (let k = 0; k < tt.length; k++) {
    changes.push({ t: tt[k], ch: 0, level: 0 });
    const next = k + 1 < tt.length ? tt[k + 1] : tt[k] + (tt[k] - tt[k - 1]);
    changes.push({ t: tt[k] + Math.min(next - tt[k], 0.004) / 2, ch: 0, level: 1 });
  }
  for (const t of sim.camEdges?.rising ?? []) changes.push({ t, ch: 1, level: 1 });
  for (const t of sim.camEdges?.falling ?? []) changes.push({ t, ch: 1, level: 0 });
  changes.sort((a, b) => a.t - b.t);
  const cam = !!sim.camEdges;
  const level = [1, 0];
  const lines = [...comment.map((c) => `; ${c}`), cam ? 'Time[s], Channel 0, Channel 1' : 'Time[s], Channel 0', cam ? '0.000000000, 1, 0' : '0.000000000, 1'];
  for (const c of changes) {
    level[c.ch] = c.level;
    lines.push(cam ? `${c.t.toFixed(9)}, ${level[0]}, ${level[1]}` : `${c.t.toFixed(9)}, ${level[0]}`);
  }
  return lines.join('\n') + '\n';
}
