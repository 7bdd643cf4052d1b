/** Header cells: a channel name and its unit, from `Time (ms)`, `current [A]` or `rpm/min`. */

export interface HeaderCell {
  name: string;
  unit: string | null;
}

export function parseHeaderCell(raw: string): HeaderCell {
  const text = raw.trim().replace(/^"|"$/g, '').trim();
  const m = /^(.*?)\s*[[(]\s*([^\])]*?)\s*[\])]\s*$/.exec(text);
  if (m && m[1]) return { name: m[1].trim(), unit: m[2] || null };
  // A time column's unit written into its name: `time_ms`, `Time ms`, `t_us`, `timestamp.ns`.
  if (TIME_NAME_WITH_UNIT.test(text)) return { name: text, unit: timeUnitInName(text) };
  return { name: text, unit: null };
}

const TIME_UNITS = 's|sec|ms|msec|us|µs|μs|usec|ns|min';
const UNIT_SUFFIX = new RegExp(`[\\s_.-](${TIME_UNITS})$`, 'i');
const TIME_NAME_WITH_UNIT = new RegExp(`^(t|time|timestamp|zeit|temps)[\\s_.-]+(${TIME_UNITS})$`, 'i');

/** A time unit written at the end of a name after a space, `_`, `.` or `-` (`toothPeriod_us`, `time ms`), or null. */
export function timeUnitInName(name: string): string | null {
  return UNIT_SUFFIX.exec(name)?.[1] ?? null;
}

/** Seconds per unit of a time column, or null when the unit is not a time unit. */
export function timeScale(unit: string | null): number | null {
  if (!unit) return null;
  const u = unit.trim().toLowerCase();
  if (u === 's' || u === 'sec' || u === 'seconds' || u === 'second') return 1;
  if (u === 'ms' || u === 'msec' || u === 'milliseconds') return 1e-3;
  if (u === 'us' || u === 'µs' || u === 'μs' || u === 'usec' || u === 'microseconds') return 1e-6;
  if (u === 'ns') return 1e-9;
  if (u === 'min' || u === 'minutes') return 60;
  return null;
}

/** Parses one numeric field as written in captures: `.` or (with decimalComma) `,` as the decimal mark. */
export function parseNumberField(raw: string, decimalComma: boolean): number {
  const t = raw.trim().replace(/^"|"$/g, '');
  if (!NUMBER.test(t)) return NaN;
  return Number(decimalComma ? t.replace(',', '.') : t);
}

export const NUMBER = /^[+-]?(\d+([.,]\d*)?|[.,]\d+)([eE][+-]?\d+)?$/;
