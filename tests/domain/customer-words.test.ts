/**
 * The customer's page in plain words (issue: "Cylinder 3 holds about 60 % of the pressure of the others"; no
 * interval notation or status codes; numbering said to be assumed without a cylinder 1 signal). Results come
 * from the simulator (SIGNAL.md physics), so the sentences are those a real analysis produces.
 */
import { describe, expect, it } from 'vitest';
import { analyzeCapture, NUMBERING_ASSUMED } from '@/signal';
import { simulateCranking } from '@/signal/sim/simulate';
import { customerFindings } from '@/domain/customer-words';
import { gaugeToConfirm } from '@/domain/report-wording';

const I4 = { cylinders: 4, firingOrder: [1, 3, 4, 2] };

describe('customer findings', () => {
  it('a leaking cylinder with sync: its share of the others to the nearest 5 %, the rest measured normal', () => {
    const s = simulateCranking({ engine: I4, leakPerS: [0, 0, 3, 0], channels: ['current', 'sync'], seed: 5 });
    const r = analyzeCapture({ time: s.time, current: s.current, sync: s.sync }, { engine: I4 });
    const c3 = r.cylinders[2];
    expect(c3.status).toBe('low');
    const f = customerFindings(r);
    expect(f[0]).toEqual({ cylinders: [3], weak: true, sentence: `Cylinder 3 holds about ${Math.round(c3.relativePercent! / 5) * 5} % of the pressure of the others.` });
    const text = f.map((x) => x.sentence).join(' ');
    expect(text).not.toMatch(/\d–\d|✓|\bok\b|\blow\b|uncertain|interval|\(/);
    if (r.cylinders.every((c) => c.cylinder === 3 || c.status === 'ok')) expect(f.at(-1)!.sentence).toBe('Cylinders 1, 2 and 4 measured normal.');
  });

  it('without sync every sentence that names a cylinder says the numbering is assumed', () => {
    const s = simulateCranking({ engine: I4, leakPerS: [0, 0, 3, 0], channels: ['current'], seed: 5 });
    const r = analyzeCapture({ time: s.time, current: s.current }, { engine: I4 });
    expect(r.identity).toBe('assumed');
    for (const f of customerFindings(r).filter((x) => x.cylinders.length < 4)) expect(f.sentence).toContain(NUMBERING_ASSUMED);
  });

  it('a healthy engine: one sentence', () => {
    const s = simulateCranking({ engine: I4, channels: ['current', 'sync'], seed: 7 });
    const r = analyzeCapture({ time: s.time, current: s.current, sync: s.sync }, { engine: I4 });
    if (r.cylinders.every((c) => c.status === 'ok')) expect(customerFindings(r)).toEqual([{ cylinders: [1, 2, 3, 4], weak: false, sentence: 'All 4 cylinders measured alike.' }]);
    else expect(customerFindings(r).some((f) => /could not be measured clearly; the shop checks/.test(f.sentence))).toBe(true);
  });
});

describe('what a gauge test should confirm', () => {
  it('the low cylinder, with the numbering said to be assumed without sync; nothing when all read clearly', () => {
    const leak = simulateCranking({ engine: I4, leakPerS: [0, 0, 3, 0], channels: ['current'], seed: 5 });
    const r = analyzeCapture({ time: leak.time, current: leak.current }, { engine: I4 });
    const low = r.cylinders.filter((c) => c.status === 'low').map((c) => c.cylinder);
    expect(low).toHaveLength(1);
    expect(gaugeToConfirm(r)).toMatch(new RegExp(`^To confirm with a gauge compression test: cylinders? ${low[0]} \\(read low\\)`));
    expect(gaugeToConfirm(r)).toContain(NUMBERING_ASSUMED);
    const healthy = simulateCranking({ engine: I4, channels: ['current', 'sync'], seed: 7 });
    const h = analyzeCapture({ time: healthy.time, current: healthy.current, sync: healthy.sync }, { engine: I4 });
    if (h.cylinders.every((c) => c.status === 'ok')) expect(gaugeToConfirm(h)).toBeNull();
  });
});
