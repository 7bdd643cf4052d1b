/**
 * The report's trace excerpt on tooth-time captures: a 60-2 wheel (samples/, the common trigger wheel with two
 * teeth missing), and, when ../shared/captures-real/ (or CRANKPRINT_REAL_DIR) is there, real crank-edge
 * recordings (its README: the V6's wheel misses teeth as 2-1-1, the three-cylinder's has two double gaps a
 * revolution). A gap spans several tooth
 * pitches, so the raw interval there is two or three times its neighbours; the excerpt divides it by the
 * pitches it spans, as the screen does, so no point stands out as a spike (a point more than 1.5× both its
 * neighbours). Cranking speed swings within each compression event, but only over many teeth.
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { traceExcerpt } from '@/domain/trace-excerpt';
import { analyzeBytes } from '@/signal';

const REAL = process.env.CRANKPRINT_REAL_DIR ?? join(process.cwd(), '../shared/captures-real');
const spikes = (v: number[]) => v.filter((x, i) => i > 0 && i < v.length - 1 && x > 1.5 * v[i - 1] && x > 1.5 * v[i + 1]).length;

describe('trace excerpt of a tooth-edge recording', () => {
  for (const [file, engine] of [
    ['samples/i4-60-2-tooth-times.csv', { cylinders: 4, layout: 'inline', firingOrder: [1, 3, 4, 2] }],
    [join(REAL, 'v6-3.8l-crank-cam-edges-plugs-in.csv'), { cylinders: 6, layout: 'v', firingOrder: [1, 2, 3, 4, 5, 6] }],
    [join(REAL, 'i3-1.2l-crank-edges-plugs-out.csv'), { cylinders: 3, layout: 'inline', firingOrder: [1, 2, 3] }],
  ] as const) {
    it.runIf(existsSync(file))(`${file}: tooth period without a spike at the gaps, where the raw intervals have them`, () => {
      const { capture, result } = analyzeBytes(new Uint8Array(readFileSync(file)), { engine: { ...engine, firingOrder: [...engine.firingOrder] } });
      const tt = capture.columns.toothTimes!;
      expect(tt.length).toBeGreaterThan(100);
      const raw = Array.from({ length: tt.length - 1 }, (_, i) => tt[i + 1] - tt[i]);
      expect(spikes(raw)).toBeGreaterThan(3);
      const x = traceExcerpt(capture.columns, result)!;
      expect(x.label).toMatch(/^Tooth period \(ms\)/);
      // Decimated min/max pairs: take the maxima, one per column.
      const maxima = x.v.filter((_, i) => i % 2 === 1);
      expect(maxima.length).toBeGreaterThan(20);
      expect(spikes(maxima)).toBe(0);
    });
  }
});
