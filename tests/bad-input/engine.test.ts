/**
 * The bad-input corpus through the engine and the command line: every file gets a typed error or an
 * `uncertain` result with a warning — never a crash, never a confident number. (The upload route sees the
 * same corpus in the browser tests.)
 */
import { spawnSync } from 'node:child_process';
import { mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyzeBytes } from '@/signal';
import { CaptureError } from '@/signal/errors';
import { badCorpus } from './corpus';
import { SURE_MAPPING, refusalFor } from '@/domain/capture-policy';

const engine = { cylinders: 4, firingOrder: [1, 3, 4, 2] };
const corpus = badCorpus();

describe('bad-input corpus', () => {
  it('holds at least 50 files', () => {
    expect(corpus.length).toBeGreaterThanOrEqual(50);
  });

  it.each(corpus.map((c) => [c.name, c] as const))('engine: %s', (_n, c) => {
    try {
      const { result } = analyzeBytes(c.bytes, { engine });
      expect(result.verdict).toBe('uncertain');
      expect(result.warnings.length).toBeGreaterThan(0);
      for (const w of result.warnings) expect(w.message).toMatch(/\.$|\)$/);
    } catch (e) {
      expect(e).toBeInstanceOf(CaptureError);
      expect((e as CaptureError).message.length).toBeGreaterThan(20);
    }
  });

  // What the upload route does with each file: refused by the importer, refused for holding nothing to analyse,
  // or — only when the importer is unsure which column is which — kept so the columns can be mapped by hand.
  it.each(corpus.map((c) => [c.name, c] as const))('upload screen: %s', (_n, c) => {
    let outcome: string;
    try {
      const { capture, result } = analyzeBytes(c.bytes, { engine });
      const refusal = refusalFor(capture, result);
      if (refusal) {
        expect(refusal.code).toBe('NOTHING_TO_ANALYSE');
        expect(refusal.message).toMatch(/\.$/);
        outcome = 'refused';
      } else {
        outcome = result.events.length > 0 ? 'analysed' : 'mapping';
        if (outcome === 'mapping') expect(capture.confidence).toBeLessThan(SURE_MAPPING);
        else expect(result.verdict).toBe('uncertain');
      }
    } catch (e) {
      expect(e).toBeInstanceOf(CaptureError);
      outcome = 'refused';
    }
    expect(['refused', 'mapping', 'analysed']).toContain(outcome);
  });

  it('the upload screen keeps every sample that holds cranking', () => {
    for (const f of readdirSync('samples').filter((n) => /\.(csv|tsv|txt)$/.test(n) && n !== 'malformed.csv')) {
      const { capture, result } = analyzeBytes(new Uint8Array(readFileSync(join('samples', f))), { engine });
      expect(!!refusalFor(capture, result), f).toBe(f === 'no-cranking.csv');
    }
  });

  it('command line: exit 2 with one sentence, or an uncertain result', () => {
    const dir = 'test-results/bad-input';
    mkdirSync(dir, { recursive: true });
    for (const [i, c] of corpus.entries()) {
      const file = join(dir, `${String(i).padStart(2, '0')}.csv`);
      writeFileSync(file, c.bytes);
      const r = spawnSync('node', ['--import', 'tsx', 'scripts/analyze.ts', file, '--cylinders', '4', '--firing-order', '1-3-4-2', '--json'], { encoding: 'utf8' });
      if (r.status === 2) {
        expect(r.stderr.trim().split('\n'), c.name).toHaveLength(1);
        expect(JSON.parse(r.stdout).error.message, c.name).toBeTruthy();
      } else {
        expect(r.status, `${c.name}: ${r.stderr}`).toBe(0);
        expect(JSON.parse(r.stdout).verdict, c.name).toBe('uncertain');
      }
    }
  }, 240_000);
});
