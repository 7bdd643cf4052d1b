// Every curated sample analyses as samples/README.md says, against the simulator's truth in manifest.json.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { analyzeBytes } from '@/signal';
import { CaptureError } from '@/signal/errors';
import { NUMBERING_ASSUMED } from '@/signal/grade/pattern';
import { parseWheel } from '@/signal/teeth/wheel';
import type { EngineSetup } from '@/signal/engine/firing';

interface Entry {
  file: string;
  engine?: EngineSetup;
  teeth?: string;
  truthPercent?: number[] | null;
  synced?: boolean;
  codes?: string[];
  verdict?: string;
  identity?: string;
  method?: string;
  sensor?: 'vr';
}

const manifest: Entry[] = JSON.parse(readFileSync('samples/manifest.json', 'utf8'));
const bytes = (f: string) => new Uint8Array(readFileSync(`samples/${f}`));

describe('curated samples', () => {
  it.each(manifest.filter((m) => m.truthPercent).map((m) => [m.file, m] as const))('%s', (_f, m) => {
    const { result } = analyzeBytes(bytes(m.file), { engine: m.engine!, teeth: m.teeth ? parseWheel(m.teeth)! : undefined, sensor: m.sensor });
    expect(result.warnings.map((w) => w.code)).toEqual(expect.arrayContaining(m.codes ?? []));
    if (m.identity) expect(result.identity).toBe(m.identity);
    if (m.method) expect(result.method).toBe(m.method);
    const lowTruth = m.truthPercent!.filter((v) => v < 90).length;
    const low = result.cylinders.filter((c) => c.status === 'low');
    expect(result.verdict).not.toBe('uncertain');
    expect(low.length).toBe(lowTruth);
    if (m.synced) expect(low.map((c) => c.cylinder)).toEqual(m.truthPercent!.map((v, i) => (v < 90 ? i + 1 : 0)).filter(Boolean));
    if (lowTruth === 2 && m.synced) expect(result.pattern.kind).toBe('neighbours-low');
    // A headline that names a cylinder says when its number is a guess (no cylinder 1 signal), and only then.
    if (lowTruth > 0) expect(result.pattern.hint.includes(NUMBERING_ASSUMED)).toBe(result.identity === 'assumed');
  });

  it.each(manifest.filter((m) => m.verdict).map((m) => [m.file, m] as const))('%s gives its verdict and warning', (_f, m) => {
    const { result } = analyzeBytes(bytes(m.file), { engine: m.engine! });
    expect(result.verdict).toBe(m.verdict);
    expect(result.warnings.map((w) => w.code)).toEqual(expect.arrayContaining(m.codes ?? []));
    expect(result.cylinders.every((c) => c.relativePercent === null)).toBe(true);
  });

  it('no-cranking.csv is uncertain with NO_CRANKING', () => {
    const { result } = analyzeBytes(bytes('no-cranking.csv'), { engine: { cylinders: 4, firingOrder: [1, 3, 4, 2] } });
    expect(result.verdict).toBe('uncertain');
    expect(result.warnings[0].code).toBe('NO_CRANKING');
  });

  it('malformed.csv is refused naming line 7, column 2', () => {
    try {
      analyzeBytes(bytes('malformed.csv'), { engine: { cylinders: 4, firingOrder: [1, 3, 4, 2] } });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(CaptureError);
      expect((e as CaptureError).line).toBe(7);
      expect((e as CaptureError).column).toBe(2);
    }
  });
});
