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
  channels?: ('current' | 'hall' | 'vr' | 'sync' | 'rpm')[];
}

const NAMES = {
  current: 'Starter current [A]',
  hall: 'Crank sensor [V]',
  vr: 'Crank sensor [V]',
  sync: 'Cyl 1 sync [V]',
  rpm: 'Engine speed [rpm]',
} as const;

const DIGITS = { current: 2, hall: 3, vr: 3, sync: 3, rpm: 2 } as const;

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
  const cols = channels.map((c) => sim[c]!);
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
