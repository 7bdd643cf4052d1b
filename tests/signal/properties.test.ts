/**
 * Property-based checks (fast-check) on the parser and the engine: whatever the bytes, only typed errors are
 * thrown; results keep their invariants (percentages finite and not negative, or none with `uncertain`, one result per cylinder, deterministic).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyzeCapture } from '@/signal/analyze';
import { CaptureError } from '@/signal/errors';
import { importCapture } from '@/signal/import/import-capture';
import { simulateCranking } from '@/signal/sim/simulate';
import { simToCsv } from '@/signal/sim/to-csv';

const enc = (s: string) => new TextEncoder().encode(s);

function importOrTypedError(bytes: Uint8Array) {
  try {
    return importCapture(bytes);
  } catch (e) {
    expect(e, String(e)).toBeInstanceOf(CaptureError);
    return null;
  }
}

describe('parser: only typed errors', () => {
  it('on arbitrary bytes', () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 4000 }), (bytes) => {
        importOrTypedError(bytes);
      }),
      { numRuns: 300 },
    );
  });

  it('on text that looks almost like a capture', () => {
    const cell = fc.oneof(fc.double({ noNaN: false }).map(String), fc.constantFrom('', 'NaN', '-', '1e308', '-1e308', '1,5', 'x', '"3"', ' 4 '));
    const row = fc.tuple(fc.array(cell, { minLength: 1, maxLength: 4 }), fc.constantFrom(',', ';', '\t')).map(([c, d]) => c.join(d));
    fc.assert(
      fc.property(fc.array(row, { maxLength: 60 }), fc.boolean(), (rows, header) => {
        importOrTypedError(enc(`${header ? 'Time (s),current [A]\n' : ''}${rows.join('\n')}`));
      }),
      { numRuns: 300 },
    );
  });
});

describe('engine: invariants on any decodable capture', () => {
  const engine = { cylinders: 4, firingOrder: [1, 3, 4, 2] };
  it('random columns give one result per cylinder, finite percentages, the same twice', () => {
    fc.assert(
      fc.property(
        fc.float64Array({ minLength: 20, maxLength: 3000, noNaN: true, noDefaultInfinity: true }),
        fc.integer({ min: 100, max: 20000 }),
        (values, rate) => {
          const time = Float64Array.from(values, (_, i) => i / rate);
          const run = () => {
            try {
              return analyzeCapture({ time, current: values }, { engine });
            } catch (e) {
              expect(e).toBeInstanceOf(CaptureError);
              return null;
            }
          };
          const a = run();
          if (!a) return;
          expect(a.cylinders).toHaveLength(4);
          for (const c of a.cylinders) {
            // No figure at all is allowed only with an uncertain status.
            if (c.relativePercent === null) {
              expect(c.status).toBe('uncertain');
              continue;
            }
            expect(c.relativePercent).toBeGreaterThanOrEqual(0);
            expect(Number.isFinite(c.relativePercent)).toBe(true);
          }
          expect(run()).toEqual(a);
        },
      ),
      { numRuns: 60 },
    );
  });

  it('a simulated capture with noise, cut at a random point, never crashes and never gives a confident number without cycles', () => {
    const sim = simulateCranking({ engine, leakPerS: [0, 2, 0, 0], channels: ['current', 'sync'], sampleRateHz: 2000, seed: 9 });
    const text = simToCsv(sim, { channels: ['current', 'sync'] });
    fc.assert(
      fc.property(fc.integer({ min: 0, max: text.length }), (cut) => {
        const cap = importOrTypedError(enc(text.slice(0, cut)));
        if (!cap) return;
        const r = analyzeCapture(cap.columns, { engine }, cap.warnings);
        if (r.cylinders.some((c) => c.events < 3)) expect(r.verdict).toBe('uncertain');
      }),
      { numRuns: 40 },
    );
  });
});
