/**
 * Measurements against a running server (scripts/app-server.ts), shared by `npm run bench` and
 * `npm run bench:load`: /api/health latency while analyses run, and, in headless Chromium, the time from
 * choosing a file on a job page to its bars on screen.
 */
import { chromium } from '@playwright/test';
import { TRACE_REDRAW_MEASURE } from '../../components/analysis/trace-timing';

export function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
}

/** Sequential health checks for `ms`, one every 50 ms: the latencies, sorted. */
export async function healthSamples(base: string, ms: number): Promise<number[]> {
  const out: number[] = [];
  const until = Date.now() + ms;
  while (Date.now() < until) {
    const t0 = performance.now();
    await fetch(`${base}/api/health`).then((r) => r.arrayBuffer(), () => null);
    out.push(performance.now() - t0);
    await new Promise((r) => setTimeout(r, 50));
  }
  return out.sort((a, b) => a - b);
}

/** The first demo job on an inline four firing 1-3-4-2. */
async function inlineFourJob(base: string, cookie: string): Promise<{ id: string; repairOrder: string }> {
  const { jobs } = (await (await fetch(`${base}/api/jobs`, { headers: { cookie } })).json()) as { jobs: { id: string; repairOrder: string; vehicle: { engine: { cylinders: number; firingOrder: number[] } } }[] };
  const job = jobs.find((j) => j.vehicle.engine.cylinders === 4 && j.vehicle.engine.firingOrder.join('-') === '1-3-4-2');
  if (!job) throw new Error('no inline-four demo job');
  return job;
}

/**
 * /api/health while three analyses of a 10M-sample capture run (saves, in the engine's thread pool), against
 * the same checks at rest: the request thread must stay free.
 */
export async function healthDuringAnalysis(base: string, cookie: string, big: string): Promise<{ restP99: number; busyP99: number; saves: number; saveMs: number }> {
  const job = await inlineFourJob(base, cookie);
  const up = await fetch(`${base}/api/jobs/${job.id}/captures`, { method: 'POST', headers: { cookie, origin: base, 'content-type': 'text/csv', 'x-file-name': 'ten-million.csv' }, body: big });
  if (up.status !== 200) throw new Error(`the 10M-sample upload answered ${up.status}: ${await up.text()}`);
  const captureId = (await up.json()).capture.id as string;
  const rest = await healthSamples(base, 3_000);
  let stop = false;
  let saves = 0;
  const saveTimes: number[] = [];
  const saver = async () => {
    while (!stop) {
      const t0 = performance.now();
      const r = await fetch(`${base}/api/captures/${captureId}/analyses`, { method: 'POST', headers: { cookie, origin: base, 'content-type': 'application/json' }, body: JSON.stringify({ settings: { engine: { cylinders: 4, firingOrder: [1, 3, 4, 2] } } }) });
      await r.arrayBuffer();
      if (r.status === 200) {
        saves++;
        saveTimes.push(performance.now() - t0);
      }
    }
  };
  const savers = [saver(), saver(), saver()];
  await new Promise((r) => setTimeout(r, 500));
  const busy = await healthSamples(base, 15_000);
  stop = true;
  await Promise.all(savers);
  saveTimes.sort((a, b) => a - b);
  return { restP99: percentile(rest, 99), busyP99: percentile(busy, 99), saves, saveMs: percentile(saveTimes, 50) };
}

/**
 * Headless Chromium (Debian's) on the job page of an inline four: choose `file`, time until its bars are on
 * screen (read on the device while it uploads) and until the server's reading has confirmed them. Each repeat
 * uses a copy with one more line, so the server stores each one. Then, in the last one's workspace, the time from
 * each keyboard zoom until the trace has drawn the new view.
 */
export async function chooseToBars(base: string, cookie: string, files: string[]): Promise<{ barsMs: number[]; confirmedMs: number[]; redrawMs: number[] }> {
  const job = await inlineFourJob(base, cookie);
  // The member has read this job's cautions (recorded on the server), so the uploader shows at once.
  await fetch(`${base}/api/jobs/${job.id}/cautions`, { method: 'POST', headers: { cookie, origin: base, 'content-type': 'application/json' }, body: '{}' });
  const browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH || '/usr/bin/chromium', args: ['--no-sandbox', '--disable-gpu'] });
  const barsMs: number[] = [];
  const confirmedMs: number[] = [];
  const redrawMs: number[] = [];
  try {
    const context = await browser.newContext({ baseURL: base });
    await context.addCookies(cookie.split('; ').map((c) => ({ name: c.slice(0, c.indexOf('=')), value: c.slice(c.indexOf('=') + 1), url: base })));
    const page = await context.newPage();
    for (const file of files) {
      await page.goto(`/jobs/${job.id}`);
      const input = page.locator('[data-testid=uploader] input[type=file]').first();
      await input.waitFor({ state: 'attached' });
      const t0 = performance.now();
      await input.setInputFiles(file);
      await page.getByTestId('local-bars').waitFor({ timeout: 60_000 });
      barsMs.push(performance.now() - t0);
      await page.getByTestId('upload-confirmation').filter({ hasText: /same figures|differ/ }).or(page.getByTestId('upload-differences')).first().waitFor({ timeout: 120_000 });
      confirmedMs.push(performance.now() - t0);
    }
    // The last file's workspace: zoom in with the keyboard, and time each zoom until the trace has drawn the
    // worker's new view (the page's own User Timing measure, which includes the 40 ms wait for more zooming).
    await page.locator('[data-testid=capture-list] a').first().click();
    await page.getByTestId('cylinder-chart').waitFor({ timeout: 60_000 });
    await page.getByTestId('trace').focus();
    // The first view's draw (opening the page) is not a zoom: only the measures after it count.
    const opened = await page.evaluate((name) => performance.getEntriesByName(name).length, TRACE_REDRAW_MEASURE);
    for (let k = 0; k < 8; k++) {
      const before = await page.evaluate((name) => performance.getEntriesByName(name).length, TRACE_REDRAW_MEASURE);
      await page.keyboard.press(k < 6 ? '+' : '-');
      await page.waitForFunction(([name, n]) => performance.getEntriesByName(name as string).length > (n as number), [TRACE_REDRAW_MEASURE, before] as const, { timeout: 10_000 });
      await page.waitForTimeout(100);
    }
    redrawMs.push(...(await page.evaluate((name) => performance.getEntriesByName(name).map((e) => e.duration), TRACE_REDRAW_MEASURE)).slice(opened));
  } finally {
    await browser.close();
  }
  return { barsMs, confirmedMs, redrawMs };
}

/**
 * /api/health while four downloads of a large stored capture and one upload of another as large run at once,
 * against the same checks at rest. `big` is stored first (not timed); the upload sends it with one more line.
 */
export async function healthDuringTransfers(base: string, cookie: string, big: string): Promise<{ restP99: number; busyP99: number; downloadMs: number; uploadMs: number; errors: number }> {
  const job = await inlineFourJob(base, cookie);
  const post = (body: string, name: string) =>
    fetch(`${base}/api/jobs/${job.id}/captures`, { method: 'POST', headers: { cookie, origin: base, 'content-type': 'text/csv', 'x-file-name': name }, body });
  const first = await post(big, 'transfer-a.csv');
  if (first.status !== 200) throw new Error(`the large upload answered ${first.status}: ${await first.text()}`);
  const captureId = (await first.json()).capture.id as string;
  const rest = await healthSamples(base, 3_000);
  let errors = 0;
  let busy: number[] = [];
  let done = false;
  const timed = async (work: () => Promise<boolean>) => {
    const t0 = performance.now();
    if (!(await work().catch(() => false))) errors++;
    return performance.now() - t0;
  };
  const download = () =>
    timed(async () => {
      const r = await fetch(`${base}/api/captures/${captureId}/raw`, { headers: { cookie } });
      let n = 0;
      for await (const piece of r.body as unknown as AsyncIterable<Uint8Array>) n += piece.length;
      return r.status === 200 && n === Buffer.byteLength(big);
    });
  const upload = () => timed(async () => (await (await post(`${big}10.5,1,0\n`, 'transfer-b.csv')).arrayBuffer(), true));
  const sampler = (async () => {
    const out: number[] = [];
    while (!done) out.push(...(await healthSamples(base, 1_000)));
    busy = out.sort((a, b) => a - b);
  })();
  const [downloads, uploadMs] = await Promise.all([Promise.all([download(), download(), download(), download()]), upload()]);
  done = true;
  await sampler;
  downloads.sort((a, b) => a - b);
  return { restP99: percentile(rest, 99), busyP99: percentile(busy, 99), downloadMs: percentile(downloads, 50), uploadMs, errors };
}
