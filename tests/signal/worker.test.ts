// The worker's API over comlink (Node's MessageChannel through comlink's node adapter): import with progress,
// analyse, decimate with transferred buffers, cancel.
import { readFileSync } from 'node:fs';
import { MessageChannel } from 'node:worker_threads';
import * as Comlink from 'comlink';
import nodeEndpoint from 'comlink/dist/esm/node-adapter.mjs';
import { afterAll, describe, expect, it } from 'vitest';
import { createAnalysisApi } from '@/workers/analysis-api';

const { port1, port2 } = new MessageChannel();
Comlink.expose(createAnalysisApi(), nodeEndpoint(port1 as never));
const remote = Comlink.wrap<ReturnType<typeof createAnalysisApi>>(nodeEndpoint(port2 as never));
afterAll(() => {
  port1.close();
  port2.close();
});

const sample = new Uint8Array(readFileSync('samples/i4-burnt-valve-current-sync.csv'));

describe('analysis worker API', () => {
  it('imports with progress, analyses, and answers decimated views of any range', async () => {
    const stages: string[] = [];
    const summary = await remote.importCapture(sample, {}, Comlink.proxy((stage: string) => void stages.push(stage)));
    expect(summary.rows).toBeGreaterThan(20_000);
    await new Promise((r) => setTimeout(r, 50)); // progress messages are one-way; let them arrive
    expect(summary.channels.map((c) => c.role)).toEqual(['time', 'current', 'sync']);
    expect(stages).toContain('parsing');
    const result = await remote.analyze({ engine: { cylinders: 4, firingOrder: [1, 3, 4, 2] } });
    expect(result.cylinders[2].status).toBe('low');
    const all = await remote.decimate('current', 0, 1e9, 500);
    expect(all!.x.length).toBe(500);
    const zoom = await remote.decimate('current', 2, 2.05, 500);
    // 50 ms at 5 kS/s is 250 samples: fewer than the columns, so the samples themselves come back.
    expect(zoom!.x.length).toBe(251);
    expect(zoom!.x[0]).toBeGreaterThanOrEqual(2);
  });

  it('cancel stops an import with a CANCELLED error', async () => {
    const api = createAnalysisApi();
    const big = new Uint8Array(readFileSync('samples/i4-36-1-hall-sync.csv'));
    const p = api.importCapture(new Blob([big]), {}, () => api.cancel());
    await expect(p).rejects.toMatchObject({ code: 'CANCELLED' });
  });
});
