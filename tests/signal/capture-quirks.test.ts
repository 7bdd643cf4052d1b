/**
 * What real files and real probes do to a capture, on the simulator's cranking: a clamp on backwards, a scope's
 * over-range value (9.9E37 is the IEEE-style "overload" many scopes write), a units row under the names, a
 * sample rate stated above the header, and battery voltage read as the starter current upside down
 * (Ohm's law: V = V_rest − I·R_battery).
 */
import { describe, expect, it } from 'vitest';
import { analyzeBytes, analyzeCapture } from '@/signal';
import { simulateCranking } from '@/signal/sim/simulate';
import { edgeLogToCsv } from '@/signal/sim/to-csv';
import { parseWheel } from '@/signal/teeth/wheel';

const I4 = { cylinders: 4, firingOrder: [1, 3, 4, 2] };
const enc = (s: string) => new TextEncoder().encode(s);
const sim = simulateCranking({ engine: I4, leakPerS: [0, 0, 3, 0], channels: ['current', 'sync', 'battery'], seed: 4 });
const lowOf = (r: ReturnType<typeof analyzeCapture>) => r.cylinders.filter((c) => c.status === 'low').map((c) => c.cylinder);

describe('capture quirks', () => {
  it('a reversed clamp is read as its magnitude, with a notice, and finds the same low cylinder', () => {
    const straight = analyzeCapture({ time: sim.time, current: sim.current, sync: sim.sync }, { engine: I4 });
    const reversed = analyzeCapture({ time: sim.time, current: sim.current!.map((v) => -v), sync: sim.sync }, { engine: I4 });
    expect(reversed.warnings.map((w) => w.code)).toContain('CLAMP_REVERSED');
    expect(lowOf(reversed)).toEqual(lowOf(straight));
    expect(lowOf(straight)).toEqual([3]);
  });

  it('over-range samples are missing values with a warning, not a failed upload', () => {
    const rows = Array.from(sim.time, (t, i) => `${(t * 1000).toFixed(3)},${i % 997 === 5 ? '9.9E37' : sim.current![i].toFixed(2)},${sim.sync![i].toFixed(2)}`);
    const { result } = analyzeBytes(enc(`Time (ms),Current [A],Sync [V]\n${rows.join('\n')}\n`), { engine: I4 });
    expect(result.warnings.map((w) => w.code)).toContain('OVER_RANGE');
    expect(lowOf(result)).toEqual([3]);
  });

  it('a units row under the names is read as units (ms stays ms)', () => {
    const rows = Array.from(sim.time, (t, i) => `${(t * 1000).toFixed(3)},${sim.current![i].toFixed(2)},${sim.sync![i].toFixed(2)}`);
    const { capture, result } = analyzeBytes(enc(`Time,Current,Sync\n(ms),(A),(V)\n${rows.join('\n')}\n`), { engine: I4 });
    expect(capture.channels.map((c) => c.unit)).toEqual(['ms', 'A', 'V']);
    expect(result.crankingRpm).toBeGreaterThan(100);
    expect(lowOf(result)).toEqual([3]);
  });

  it('a sample rate stated above the header gives the time', () => {
    const rows = Array.from(sim.current!, (c, i) => `${c.toFixed(2)},${sim.sync![i].toFixed(2)}`);
    const { capture, result } = analyzeBytes(enc(`Bay 2 scope\nSample rate: 10 kHz\nCurrent [A],Sync [V]\n${rows.join('\n')}\n`), { engine: I4 });
    expect(capture.notes.join(' ')).toMatch(/10000 samples\/s/);
    expect(lowOf(result)).toEqual([3]);
  });

  it('battery voltage alone is the starter current upside down', () => {
    const r = analyzeCapture({ time: sim.time, battery: sim.battery, sync: sim.sync }, { engine: I4 });
    expect(r.method).toBe('battery');
    expect(r.rawUnit).toBe('V');
    expect(lowOf(r)).toEqual([3]);
  });

  it('plugs out on the simulator: no compression, no figures', () => {
    const out = simulateCranking({ engine: I4, channels: [], plugsOut: true, seed: 2 });
    const r = analyzeCapture({ toothTimes: out.toothTimes }, { engine: I4 });
    expect(r.warnings.map((w) => w.code)).toContain('NO_COMPRESSION');
    expect(r.cylinders.every((c) => c.relativePercent === null && c.status === 'uncertain')).toBe(true);
  });
});

describe('edge logs', () => {
  const v6 = { cylinders: 6, firingOrder: [1, 2, 3, 4, 5, 6], layout: 'v' as const };
  const log = simulateCranking({ engine: v6, channels: [], leakPerS: [0, 3, 0, 0, 0, 0], wheel: parseWheel('36:15/2,14/1,3/1')!, camWindowDeg: [700, 40], seed: 9 });
  const text = edgeLogToCsv(log, ['exported by a logic analyser']);

  it('are read without the mapping dialog: crank from the busiest channel, cylinder 1 from the cam', () => {
    const { capture, result } = analyzeBytes(enc(text), { engine: v6 });
    expect(capture.confidence).toBeGreaterThanOrEqual(0.7);
    expect(capture.channels.map((c) => c.role)).toEqual(['time', 'crank', 'sync']);
    expect(result.wheel?.description).toBe('36 positions, 32 teeth, gaps of 1, 1 and 2');
    expect(result.identity).toBe('cam');
    expect(lowOf(result)).toEqual([2]);
  });

  it('the mapping dialog can override the choice (the cam channel named as crank gives no wheel)', () => {
    const { result } = analyzeBytes(enc(text), { engine: v6 }, { mapping: ['time', 'sync', 'crank'] });
    expect(result.verdict).toBe('uncertain');
    expect(result.identity).toBe('assumed');
  });
});
