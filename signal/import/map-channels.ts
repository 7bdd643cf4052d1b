/** Maps a capture's columns to channels from their names, units and values, each with a confidence 0…1. */
import { isLevelLike, looksLikeEdgeLog } from './edge-log';
import type { HeaderCell } from './header';
import { timeScale } from './header';

/** `battery` is battery voltage; `level` is a 0/1 or bit-mask column of an edge log, sorted out on import. */
/** `toothPeriod` is a tooth logger's period per tooth (one row a tooth). */
export type ChannelRole = 'time' | 'current' | 'crank' | 'sync' | 'rpm' | 'battery' | 'level' | 'toothTimes' | 'toothPeriod' | 'ignore';

export interface ChannelMapping {
  /** Role per column, in column order. */
  roles: ChannelRole[];
  /** Confidence per column, 0…1. */
  confidence: number[];
  /** Seconds per unit of the time (or tooth-time) column. */
  timeScale: number;
  /** The time column counts samples and needs a sample rate. */
  timeIsIndex: boolean;
  /** Rows are level changes (an edge log), not samples at a steady rate. */
  edgeLog: boolean;
}

const RULES: { role: ChannelRole; name: RegExp; units: RegExp }[] = [
  { role: 'time', name: /^(t|time|zeit|temps|sec|seconds|timestamp)(\b|_)/i, units: /^(s|ms|us|µs|μs|ns|sec|msec|min)$/i },
  { role: 'battery', name: /batt|vbat|battery|supply.?volt|bordnetz/i, units: /^$/ },
  { role: 'rpm', name: /rpm|engine.?speed|crank.?speed|speed/i, units: /^(rpm|1\/min|min-1|u\/min)$/i },
  { role: 'current', name: /current|amp|starter|clamp|strom|\bi\b/i, units: /^(a|amps?|ampere)$/i },
  { role: 'sync', name: /sync|cyl(inder)?.?1|trigger|ign|coil|inj|cam|cmp/i, units: /^$/ },
  { role: 'crank', name: /crank|ckp|cps|tooth|hall|vr|reluctance|sensor/i, units: /^(v|mv)$/i },
];

/** Guesses roles; `values` holds the first decoded rows of each column (for monotonic checks). */
export function mapChannels(cells: HeaderCell[], values: Float64Array[]): ChannelMapping {
  const n = cells.length;
  const roles: ChannelRole[] = new Array(n).fill('ignore');
  const confidence: number[] = new Array(n).fill(0);
  const taken = new Set<ChannelRole>();
  const assign = (i: number, role: ChannelRole, c: number) => {
    roles[i] = role;
    confidence[i] = c;
    if (role !== 'ignore') taken.add(role);
  };

  const periods = periodLogMapping(cells, values);
  if (periods) return periods;
  if (n === 1) {
    const mono = isIncreasing(values[0]);
    // One positive column that does not rise: a tooth logger's periods.
    if (!mono && isPositive(values[0])) return { roles: ['toothPeriod'], confidence: [0.75], timeScale: 1, timeIsIndex: false, edgeLog: false };
    assign(0, 'toothTimes', mono ? (/tooth|edge|time/i.test(cells[0].name) ? 0.95 : 0.75) : 0.2);
    return { roles, confidence, timeScale: timeScale(cells[0].unit) ?? 1, timeIsIndex: false, edgeLog: false };
  }
  const edge = edgeLogMapping(cells, values);
  if (edge) return edge;

  // Names and units first.
  for (let i = 0; i < n; i++) {
    const { name, unit } = cells[i];
    for (const r of RULES) {
      if (taken.has(r.role)) continue;
      // A battery-cable clamp reads amps: that is current, not battery voltage.
      if (r.role === 'battery' && unit !== null && !/^(v|mv)$/i.test(unit.trim())) continue;
      const byName = r.name.test(name);
      const byUnit = unit !== null && r.units.source !== '^$' && r.units.test(unit.trim());
      if (byName && byUnit) assign(i, r.role, 0.95);
      else if (byUnit && r.role !== 'crank') assign(i, r.role, 0.85);
      else if (byName) assign(i, r.role, r.role === 'crank' || r.role === 'sync' ? 0.8 : 0.75);
      if (roles[i] !== 'ignore') break;
    }
  }
  // A volt column left over is a crank sensor when none is mapped, else a sync channel.
  for (let i = 0; i < n; i++) {
    if (roles[i] !== 'ignore') continue;
    const u = cells[i].unit?.trim().toLowerCase();
    if (u === 'v' || u === 'mv') {
      if (!taken.has('crank')) assign(i, 'crank', 0.5);
      else if (!taken.has('sync')) assign(i, 'sync', 0.5);
    }
  }
  // No time column by name: the first increasing column, with a low confidence.
  if (!taken.has('time') && isIncreasing(values[0])) assign(0, 'time', 0.6);
  // Positional guesses for what is left: current, then sync.
  for (let i = 0; i < n; i++) {
    if (roles[i] !== 'ignore') continue;
    if (!taken.has('current') && !taken.has('crank') && !taken.has('rpm')) assign(i, 'current', 0.4);
    else if (!taken.has('sync') && looksLikePulses(values[i])) assign(i, 'sync', 0.45);
  }
  const ti = roles.indexOf('time');
  const unit = ti >= 0 ? cells[ti].unit : null;
  const scale = timeScale(unit);
  const timeIsIndex = ti >= 0 && scale === null && (/index|sample|^n$|^#$/i.test(cells[ti].name) || isIntegerRamp(values[ti]));
  return { roles, confidence, timeScale: scale ?? 1, timeIsIndex, edgeLog: false };
}

const ruleFor = (role: ChannelRole) => RULES.find((r) => r.role === role)!;

/**
 * An edge log: a time column by name, irregular steps and 0/1 columns. Whole-number columns are levels (sorted
 * into crank and marks on import), a battery column by name is kept, the rest is ignored.
 */
function edgeLogMapping(cells: HeaderCell[], values: Float64Array[]): ChannelMapping | null {
  const named = cells.findIndex((c) => ruleFor('time').name.test(c.name));
  // Without a time column by name (a file with no header row), a first column that rises is the time.
  const ti = named >= 0 ? named : isIncreasing(values[0]) ? 0 : -1;
  if (ti < 0) return null;
  const others = values.filter((_, i) => i !== ti);
  if (!looksLikeEdgeLog(values[ti], others)) return null;
  const roles: ChannelRole[] = cells.map((c, i) =>
    i === ti ? 'time' : ruleFor('battery').name.test(c.name) ? 'battery' : isLevelLike(values[i]) ? 'level' : 'ignore',
  );
  return { roles, confidence: roles.map(() => (named >= 0 ? 0.9 : 0.8)), timeScale: timeScale(cells[ti].unit) ?? 1, timeIsIndex: false, edgeLog: true };
}

/**
 * A tooth logger's file: one row a tooth holding its period (a column named for it), with or without a time
 * column. The period's unit comes from its name or, failing that, on import from its size.
 */
function periodLogMapping(cells: HeaderCell[], values: Float64Array[]): ChannelMapping | null {
  const pi = cells.findIndex((c, i) => PERIOD_NAME.test(c.name) && isPositive(values[i]));
  if (pi < 0) return null;
  const ti = cells.findIndex((c, i) => i !== pi && ruleFor('time').name.test(c.name));
  const roles: ChannelRole[] = cells.map((_, i) => (i === pi ? 'toothPeriod' : i === ti ? 'time' : 'ignore'));
  return { roles, confidence: roles.map(() => 0.85), timeScale: ti >= 0 ? (timeScale(cells[ti].unit) ?? 1) : 1, timeIsIndex: false, edgeLog: false };
}

const PERIOD_NAME = /period|tooth.?(time|dt|delta)|^dt\b|^delta/i;

function isPositive(v: Float64Array | undefined): boolean {
  if (!v || v.length < 3) return false;
  let finite = 0;
  for (let i = 0; i < v.length; i++) {
    if (v[i] === v[i]) {
      if (!(v[i] > 0)) return false;
      finite++;
    }
  }
  return finite >= 3;
}

/** The lowest confidence among mapped columns: below 0.7 the user should confirm the mapping. */
export function mappingConfidence(m: ChannelMapping): number {
  let c = 1;
  for (let i = 0; i < m.roles.length; i++) if (m.roles[i] !== 'ignore') c = Math.min(c, m.confidence[i]);
  return m.roles.every((r) => r === 'ignore') ? 0 : c;
}

function isIncreasing(v: Float64Array | undefined): boolean {
  if (!v || v.length < 3) return false;
  for (let i = 1; i < v.length; i++) if (!(v[i] > v[i - 1])) return false;
  return true;
}

function isIntegerRamp(v: Float64Array | undefined): boolean {
  if (!v || v.length < 3) return false;
  for (let i = 0; i < v.length; i++) if (v[i] !== Math.round(v[i])) return false;
  return isIncreasing(v) && v[1] - v[0] === 1;
}

function looksLikePulses(v: Float64Array | undefined): boolean {
  if (!v || v.length < 3) return false;
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < v.length; i++) {
    lo = Math.min(lo, v[i]);
    hi = Math.max(hi, v[i]);
  }
  return hi - lo > 1;
}
