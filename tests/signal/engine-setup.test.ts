/**
 * A capture analysed with the wrong engine set up is not a finding. Common practice: the cylinder count and
 * firing order come from the vehicle's service information, and a relative test read against the wrong ones
 * is meaningless. Checked on the simulator (its truth is the cylinder count it was run with): the right count
 * never trips the event-count check, healthy or leaking; clear wrong counts make the result `uncertain` with
 * FIRING_ORDER_MISMATCH instead of reading cylinders near zero.
 */
import { describe, expect, it } from 'vitest';
import { analyzeCapture } from '@/signal/analyze';
import type { EngineSetup } from '@/signal/engine/firing';
import { simulateCranking, type SimChannel } from '@/signal/sim/simulate';
import type { CaptureColumns } from '@/signal/types';
import { drawEngine } from '@/signal/sim/ensemble';

const I3: EngineSetup = { cylinders: 3, firingOrder: [1, 2, 3] };
const I4: EngineSetup = { cylinders: 4, firingOrder: [1, 3, 4, 2] };
const I5: EngineSetup = { cylinders: 5, firingOrder: [1, 2, 4, 5, 3] };
const I6: EngineSetup = { cylinders: 6, firingOrder: [1, 5, 3, 6, 2, 4] };
const V6odd: EngineSetup = { cylinders: 6, firingOrder: [1, 6, 5, 4, 3, 2], intervalsDeg: [90, 150, 90, 150, 90, 150], layout: 'v' };
const V8: EngineSetup = { cylinders: 8, firingOrder: [1, 8, 4, 3, 6, 5, 7, 2], layout: 'v' };
type Method = 'current+sync' | 'teeth' | 'hall+sync' | 'rpm';
const METHODS: Method[] = ['current+sync', 'teeth', 'hall+sync', 'rpm'];
const LEAKS = ['healthy', 'one leak', 'two leaks'] as const;

function capture(engine: EngineSetup, leak: (typeof LEAKS)[number], method: Method, seed = 3): CaptureColumns {
  const leakPerS = Array.from({ length: engine.cylinders }, (_, i) => (leak === 'one leak' ? (i === 0 ? 3 : 0) : leak === 'two leaks' ? (i === 1 || i === 2 ? 2.5 : 0) : 0));
  const channels: SimChannel[] = method === 'current+sync' ? ['current', 'sync'] : method === 'hall+sync' ? ['hall', 'sync'] : method === 'rpm' ? ['rpm'] : [];
  const sim = simulateCranking({ engine, leakPerS, channels, noise: 1, sampleRateHz: method === 'hall+sync' ? 50_000 : method === 'rpm' ? 1000 : 10_000, seed });
  return method === 'teeth' ? { toothTimes: sim.toothTimes } : { time: sim.time, current: sim.current, sync: sim.sync, crank: sim.hall, rpm: sim.rpm };
}

const countWarning = (r: ReturnType<typeof analyzeCapture>) => r.warnings.find((w) => w.code === 'FIRING_ORDER_MISMATCH' && w.message.includes('compression events per engine cycle'));

describe('the right cylinder count never trips the event-count check', () => {
  for (const engine of [I3, I4, I5, I6, V6odd, V8]) {
    it(`${engine.cylinders} cylinders${engine.intervalsDeg ? ' (odd fire)' : ''}`, () => {
      for (const leak of LEAKS) for (const m of METHODS) expect(countWarning(analyzeCapture(capture(engine, leak, m), { engine })), `${leak}, ${m}`).toBeUndefined();
    });
  }
});

describe('a wrong cylinder count gives uncertain, never a confident finding', () => {
  const wrong: [EngineSetup, EngineSetup][] = [
    [I4, I6],
    [I4, V8],
    [I6, I4],
    [V8, I4],
    [V8, I6],
    [I5, I4],
    [I4, I3],
    // A 3-cylinder engine set up as an odd-firing V6 (whose own intervals repeat three times a cycle): its trace
    // repeats purely at three, which is a wrong count, not three dead cylinders.
    [I3, V6odd],
  ];
  for (const [recorded, setUp] of wrong) {
    it(`recorded on ${recorded.cylinders} cylinders, set up as ${setUp.cylinders}`, () => {
      for (const m of METHODS) {
        const r = analyzeCapture(capture(recorded, 'healthy', m), { engine: setUp });
        expect(r.verdict, m).toBe('uncertain');
        expect(r.warnings.map((w) => w.code), m).toContain('FIRING_ORDER_MISMATCH');
        expect(countWarning(r)?.message, m).toMatch(new RegExp(`like ${recorded.cylinders} compression events per engine cycle, not ${setUp.cylinders}`));
      }
    });
  }
});

/**
 * An odd-firing V6 makes the third order itself (its 90°, 150° intervals repeat three times a cycle), and a nearly
 * dead cylinder adds power at every order: the right count is not taken for a 3-cylinder engine, and the dead
 * cylinder is read. The engine's physics are the ensemble's draws with a nearly dead cylinder (signal/sim/ensemble.ts).
 */
describe('an odd-firing V6 with a nearly dead cylinder is read, not taken for three cylinders', () => {
  for (const seed of [15]) {
    it(`ensemble draw ${seed}`, () => {
      const draw = drawEngine(V6odd, seed, 'ensemble');
      const dead = draw.leakPerS.findIndex((l) => l >= 20);
      expect(dead, draw.label).toBeGreaterThanOrEqual(0);
      for (const m of ['current+sync', 'hall+sync'] as const) {
        const channels: SimChannel[] = m === 'current+sync' ? ['current', 'sync'] : ['hall', 'sync'];
        const sim = simulateCranking({ ...draw.physics, engine: V6odd, leakPerS: draw.leakPerS, channels, seed, sampleRateHz: m === 'hall+sync' ? 50_000 : 10_000 });
        const r = analyzeCapture({ time: sim.time, current: sim.current, sync: sim.sync, crank: sim.hall }, { engine: V6odd });
        expect(countWarning(r), m).toBeUndefined();
        expect(r.cylinders[dead].status, m).toBe('low');
        expect(r.cylinders.every((c) => c.relativePercent !== null), m).toBe(true);
      }
    });
  }
});
