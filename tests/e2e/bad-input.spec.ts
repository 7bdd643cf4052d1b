/**
 * The bad-input corpus through the upload API and the job page: every malformed file is refused with a
 * sentence and nothing is stored — except a file whose columns the importer cannot name, which is kept so the
 * technician can name them (the workspace then asks), and a readable file in which compression events were
 * found (clipped, say), whose analysis is `uncertain` and says why. A gzip bomb, a compressed body, a wrong content type and
 * an oversized body are refused by the server before they are stored.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { type APIRequestContext, expect, test } from '@playwright/test';
import { analyzeBytes, isCaptureError } from '../../signal';
import { badCorpus } from '../bad-input/corpus';
import { BASE_URL, DEMO, pastCautions, signIn, uploadOnJobPage } from './helpers';
import { refusalFor } from '@/domain/capture-policy';

const engine = { cylinders: 4, firingOrder: [1, 3, 4, 2] };
const corpus = badCorpus();

/**
 * What the engine says the upload must do with a file: refuse it; keep it for mapping by hand (no events and
 * unsure columns); or keep it because events were found (the analysis then says why it is uncertain).
 */
function expected(bytes: Uint8Array): 'refused' | 'mapping' | 'kept' {
  let outcome: { capture: ReturnType<typeof analyzeBytes>['capture']; result: ReturnType<typeof analyzeBytes>['result'] };
  try {
    outcome = analyzeBytes(bytes, { engine });
  } catch (e) {
    if (!isCaptureError(e)) throw e;
    return 'refused';
  }
  if (refusalFor(outcome.capture, outcome.result)) return 'refused';
  return outcome.result.events.length === 0 ? 'mapping' : 'kept';
}

async function newJob(ctx: APIRequestContext, ro: string): Promise<string> {
  const res = await ctx.post('/api/jobs', {
    data: { repairOrder: ro, concern: 'Bad-input check.', vehicle: { make: 'Test', model: 'Corpus', engine: { cylinders: 4, layout: 'inline', firingOrder: '1-3-4-2' } } },
  });
  expect(res.status(), await res.text()).toBe(200);
  return (await res.json()).job.id;
}

const captureCount = async (ctx: APIRequestContext, jobId: string) => (await (await ctx.get(`/api/jobs/${jobId}/captures`)).json()).captures.length as number;

test('the upload API refuses every malformed file with a sentence and stores nothing', async () => {
  const tech = await signIn(DEMO.technician);
  const jobId = await newJob(tech, `BAD-API-${Date.now().toString(36)}`);
  let kept = 0;
  for (const [i, c] of corpus.entries()) {
    const res = await tech.post(`/api/jobs/${jobId}/captures`, { headers: { 'content-type': 'text/csv', 'x-file-name': `bad-${i}.csv` }, data: Buffer.from(c.bytes) });
    const body = await res.json();
    const outcome = expected(c.bytes);
    if (outcome !== 'refused') {
      expect(res.status(), c.name).toBe(200);
      kept++;
      if (outcome === 'kept') {
        // Stored because it holds compression events; the saved analysis says why it cannot be trusted.
        const saved = await tech.post(`/api/captures/${body.capture.id}/analyses`, { data: { settings: { engine } } });
        const result = (await saved.json()).analysis.result;
        expect(result.verdict, c.name).toBe('uncertain');
        expect(result.warnings.length, c.name).toBeGreaterThan(0);
      }
    } else {
      expect([400, 415, 422], `${c.name}: ${JSON.stringify(body)}`).toContain(res.status());
      expect(body.error.message.length, c.name).toBeGreaterThan(30);
      expect(body.error.message, c.name).toMatch(/[.)]$/);
    }
    expect(await captureCount(tech, jobId), c.name).toBe(kept);
  }
  // Kept: three files whose columns cannot be told apart, two clipped currents with events, the tooth log
  // that decodes but shows no compression (stored, so the technician sees why it cannot be ranked), and two
  // tooth files the event-duration method times as a coarse wheel (read `uncertain`, with the reasons).
  expect(kept).toBeLessThanOrEqual(8);
});

test('a gzip bomb, a compressed body, a wrong content type and an oversized body are refused before storing', async () => {
  const tech = await signIn(DEMO.technician);
  const jobId = await newJob(tech, `BAD-BOMB-${Date.now().toString(36)}`);
  // 1 GiB of a repeated CSV row, compressed to about 1 MB.
  const row = Buffer.from('0.001,120\n');
  const gib = 1 << 30;
  const bomb = gzipSync(Buffer.alloc(gib / 64, row), { level: 9 });
  const many = Buffer.concat(Array.from({ length: 64 }, () => bomb));
  expect(many.length).toBeLessThan(64 * 1024 * 1024);

  const asFile = await tech.post(`/api/jobs/${jobId}/captures`, { headers: { 'content-type': 'text/csv', 'x-file-name': 'bomb.csv.gz' }, data: many });
  expect(asFile.status()).toBe(415);
  expect((await asFile.json()).error.message).toContain('compressed (gzip)');

  // Refused from its headers alone, before the body is read; Node's fetch hears an answer that comes early.
  const cookie = (await tech.storageState()).cookies.map((c) => `${c.name}=${c.value}`).join('; ');
  const send = (headers: Record<string, string>, body: BodyInit) =>
    fetch(`${BASE_URL}/api/jobs/${jobId}/captures`, { method: 'POST', headers: { cookie, origin: BASE_URL, ...headers }, body, duplex: 'half' } as RequestInit);
  const encoded = await send({ 'content-type': 'text/csv', 'content-encoding': 'gzip', 'x-file-name': 'bomb.csv' }, many);
  expect(encoded.status).toBe(415);
  expect((await encoded.json()).error.message).toContain('sent compressed');

  for (const type of ['application/gzip', 'image/png', 'application/json', 'multipart/form-data; boundary=x']) {
    const res = await tech.post(`/api/jobs/${jobId}/captures`, { headers: { 'content-type': type, 'x-file-name': 'x.csv' }, data: Buffer.from('Time (s),A\n0,1\n') });
    expect(res.status(), type).toBe(415);
    expect((await res.json()).error.message, type).toContain('text file');
  }

  // A body larger than 256 MB with no length up front: the server counts while it reads and stops at the limit.
  const piece = new TextEncoder().encode(`${'0.001,120\n'.repeat(100_000)}`);
  let sent = 0;
  const body = new ReadableStream<Uint8Array>({
    pull(ctrl) {
      if (sent > 300 * 1024 * 1024) return ctrl.close();
      sent += piece.length;
      ctrl.enqueue(piece);
    },
  });
  const res = await send({ 'content-type': 'text/csv', 'x-file-name': 'huge.csv' }, body).catch((e: Error) => e);
  if (res instanceof Error) {
    // The server may close the connection once it has refused; it must not have stored anything either way.
    expect(sent).toBeLessThan(300 * 1024 * 1024);
  } else {
    expect(res.status).toBe(413);
    expect((await res.json()).error.message).toContain('256 MB');
  }
  expect(await captureCount(tech, jobId)).toBe(0);
});

const uploadFile = uploadOnJobPage;

test('the job page shows the reason for every refused file and lists nothing; an unnamed-column file asks for its mapping', async ({ page }) => {
  test.setTimeout(600_000);
  const dir = 'test-results/bad-input-ui';
  mkdirSync(dir, { recursive: true });
  const tech = await signIn(DEMO.technician);
  const ro = `BAD-UI-${Date.now().toString(36)}`;
  const jobId = await newJob(tech, ro);
  await page.context().addCookies((await tech.storageState()).cookies);
  // What the page said, for a failure's message.
  const said: string[] = [];
  page.on('console', (m) => m.type() !== 'log' && said.push(`${m.type()}: ${m.text()}`));
  page.on('pageerror', (e) => said.push(`page error: ${e.message}`));
  let kept = 0;
  for (const [i, c] of corpus.entries()) {
    // Uppy takes ten files per page: open the page afresh for every file.
    await page.goto(`/jobs/${jobId}`);
    const name = `${String(i).padStart(2, '0')}-${c.name.replace(/[^a-z0-9]+/gi, '-')}.csv`;
    const file = join(dir, name);
    writeFileSync(file, c.bytes);
    await uploadFile(page, file);
    const outcome = expected(c.bytes);
    if (outcome === 'kept') {
      kept++;
      await expect(page.locator('[data-testid=capture-list] a', { hasText: name }), c.name).toBeVisible({ timeout: 30_000 });
    } else if (outcome === 'mapping') {
      kept++;
      const item = page.locator('[data-testid=capture-list] a', { hasText: name });
      await expect(item, c.name).toBeVisible({ timeout: 30_000 });
      await item.click();
      // The job page may show its own cautions (for the file just chosen): wait until the workspace is the page.
      await page.waitForURL(/\/captures\//);
      await expect(page.getByRole('heading', { level: 1, name: new RegExp(name.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')) })).toBeVisible({ timeout: 30_000 });
      // The cautions were read on the job page for this job; the workspace asks which column is which.
      const mapping = page.locator('[role=dialog][aria-labelledby=mapping-title]');
      await pastCautions(page, mapping, 45_000).catch((e: Error) => {
        throw new Error(`${c.name}; the page said:\n${said.join('\n')}\n${e.message}`);
      });
    } else {
      const alert = page.getByTestId('upload-errors');
      await expect(alert, c.name).toContainText(name, { timeout: 30_000 });
      const text = (await alert.textContent()) ?? '';
      expect(text.length, c.name).toBeGreaterThan(name.length + 30);
      // One sentence that says nothing was stored, and no retry for a file that would be refused again.
      expect(text, c.name).toContain('Nothing was stored.');
      await expect(page.getByRole('button', { name: /retry/i }), c.name).toHaveCount(0);
      if (i === 0) await page.screenshot({ path: 'artifacts/screens/upload-refused.png', fullPage: true });
    }
    expect(await captureCount(tech, jobId), c.name).toBe(kept);
  }
});
