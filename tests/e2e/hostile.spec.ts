/**
 * Real names and hostile clients (faults an adversarial run found): any Unicode, quotes, CR/LF and `%` in file
 * names and repair orders survive into Content-Disposition (RFC 6266 with RFC 5987's filename*); NUL in any
 * text is a 400 with a sentence; every JSON body, the anonymous ones and better-auth's included, is limited
 * while it streams; a 200,000-digit number is a bad field, not a crash; API answers are never cached.
 */
import { readFileSync } from 'node:fs';
import { type APIRequestContext, expect, test } from '@playwright/test';
import { BASE_URL, DEMO, newContext, signIn, signUpVerified, unique } from './helpers';

const SAMPLE = readFileSync('samples/i4-burnt-valve-current-sync.csv');
const NAMES = ['Zündung—bay2.csv', 'Łódź.csv', 'Свеча.csv', '点火テスト.csv', 'crank 🔧.csv', 'say "cheese".csv', 'a;b.csv', 'two\r\nlines.csv', '100%.csv'];

/** ASCII only, a quoted fallback and the exact name in filename* (RFC 6266 §4.3, RFC 5987 §3.2). */
function expectDisposition(header: string | undefined, name: string) {
  expect(header, name).toBeTruthy();
  expect(/^[\x20-\x7e]*$/.test(header!), header).toBe(true);
  const star = /filename\*=UTF-8''([^;]+)/i.exec(header!);
  const clean = [...name].map((ch) => (ch.charCodeAt(0) < 32 || ch.charCodeAt(0) === 127 ? ' ' : ch)).join('');
  if (star) expect(decodeURIComponent(star[1])).toBe(clean);
  else expect(header).toContain(`filename="${clean.replace(/(["\\])/g, '\\$1')}"`);
}

async function newJob(repairOrder: string, as?: APIRequestContext) {
  const tech = as ?? (await signIn(DEMO.technician));
  const res = await tech.post('/api/jobs', {
    data: { repairOrder, concern: 'Hostile names.', vehicle: { make: 'Test', model: 'Names', engine: { cylinders: 4, layout: 'inline', firingOrder: '1-3-4-2' } } },
  });
  expect(res.status(), await res.text()).toBe(200);
  return { tech, jobId: (await res.json()).job.id as string };
}

test('file names and repair orders in any script survive headers, downloads and the PDF', async () => {
  const { tech, jobId } = await newJob('RO—Zü-1 "x" 100%\r\n');
  let captureId = '';
  for (const [i, name] of NAMES.entries()) {
    const body = Buffer.concat([SAMPLE, Buffer.from('\n'.repeat(i + 1))]);
    const header = name === '100%.csv' ? name : encodeURIComponent(name);
    const up = await tech.post(`/api/jobs/${jobId}/captures`, { headers: { 'content-type': 'text/csv', 'x-file-name': header }, data: body });
    expect(up.status(), `${name}: ${await up.text()}`).toBe(200);
    const id = (await up.json()).capture.id as string;
    captureId ||= id;
    const raw = await tech.get(`/api/captures/${id}/raw`);
    expect(raw.status(), name).toBe(200);
    expectDisposition(raw.headers()['content-disposition'], name === '100%.csv' ? '100%.csv' : name);
    expect(raw.headers()['cache-control']).toBe('private, no-store');
  }
  const saved = await tech.post(`/api/captures/${captureId}/analyses`, { data: { settings: { engine: { cylinders: 4, firingOrder: [1, 3, 4, 2] } } } });
  expect(saved.status()).toBe(200);
  const analysisId = (await saved.json()).analysis.id as string;
  const put = await tech.put(`/api/jobs/${jobId}/report`, { data: { analysisIds: [analysisId], interpretation: 'Ünïcödé — “quotes” 100%.' } });
  expect(put.status(), await put.text()).toBe(200);
  const report = await (await tech.get(`/api/jobs/${jobId}/report`)).json();
  const pdf = await tech.get(`/api/reports/${report.revisions[0].id}/pdf`);
  expect(pdf.status(), await pdf.text()).toBe(200);
  expectDisposition(pdf.headers()['content-disposition'], `RO—Zü-1 "x" 100%-rev1.pdf`);
});

test('NUL in any text, a 200,000-digit number and a bare % are 4xx with a sentence, never 500', async () => {
  const { tech, jobId } = await newJob(`NUL-${Date.now().toString(36)}`);
  const nul = await tech.post('/api/jobs', { data: { repairOrder: 'RO-NUL', concern: 'a\u0000b', vehicle: { make: 'Te\u0000st', model: 'x', engine: { cylinders: 4, layout: 'inline', firingOrder: '1-3-4-2' } } } });
  expect(nul.status()).toBe(400);
  expect((await nul.json()).error.message).toMatch(/NUL character.*remove it/);
  const q = await tech.get('/api/jobs?q=%00');
  expect(q.status()).toBe(400);
  const anon = await newContext();
  const decision = await anon.post('/api/public/decision', { data: { token: 'x'.repeat(43), decision: 'approve', typedName: 'Pat\u0000' } });
  expect(decision.status()).toBe(400);
  const long = `Time (s),Current [A]\n${Array.from({ length: 3000 }, (_, i) => `${i / 1000},${i === 5 ? '1'.repeat(200_000) : 100 + (i % 50)}`).join('\n')}\n`;
  const up = await tech.post(`/api/jobs/${jobId}/captures`, { headers: { 'content-type': 'text/csv', 'x-file-name': 'long.csv' }, data: long });
  expect(up.status()).toBeLessThan(500);
  expect(up.status()).toBeGreaterThanOrEqual(200);
});

test('every JSON body is limited while it streams, declared or chunked: 413 promptly', async () => {
  const big = JSON.stringify({ token: 'x'.repeat(43), decision: 'approve', typedName: 'y'.repeat(2_000_000) });
  const anon = await newContext();
  for (const path of ['/api/public/decision', '/api/auth/sign-in/email']) {
    const res = await anon.post(path, { headers: { 'content-type': 'application/json' }, data: big });
    expect(res.status(), path).toBe(413);
  }
  // Chunked, no length up front: the server stops reading at the limit (a route that needs a session answers 401
  // before reading any of it).
  for (const path of ['/api/public/decision', '/api/auth/sign-in/email', '/api/jobs']) {
    let sent = 0;
    const stream = new ReadableStream<Uint8Array>({
      pull(c) {
        if (sent > 50_000_000) return c.close();
        sent += 1 << 16;
        c.enqueue(new Uint8Array(1 << 16).fill(32));
      },
    });
    const res = await fetch(`${BASE_URL}${path}`, { method: 'POST', headers: { 'content-type': 'application/json', origin: BASE_URL }, body: stream, duplex: 'half' } as RequestInit);
    expect([401, 413], path).toContain(res.status);
    if (path === '/api/jobs') continue;
    expect(res.status, path).toBe(413);
    expect(sent, path).toBeLessThan(20_000_000);
  }
});

test('API answers are not cached', async () => {
  const tech = await signIn(DEMO.technician);
  const res = await tech.get('/api/jobs');
  expect(res.headers()['cache-control']).toBe('no-store');
  const err = await tech.get('/api/jobs/nope');
  expect(err.headers()['cache-control']).toBe('no-store');
});

/** Trailing blank lines make each upload's bytes (and SHA-256) its own. */
let serial = 0;

/** A job with a saved analysis and a report whose first revision is signed by the technician. */
async function signedReport(typedName?: string, as?: APIRequestContext) {
  const { tech, jobId } = await newJob(`SIGN-${Date.now().toString(36)}`, as);
  const up = await tech.post(`/api/jobs/${jobId}/captures`, { headers: { 'content-type': 'text/csv', 'x-file-name': 'sign.csv' }, data: Buffer.concat([SAMPLE, Buffer.from('\n'.repeat(20 + ++serial))]) });
  expect(up.status(), await up.text()).toBe(200);
  const captureId = (await up.json()).capture.id as string;
  const saved = await tech.post(`/api/captures/${captureId}/analyses`, { data: { settings: { engine: { cylinders: 4, firingOrder: [1, 3, 4, 2] } } } });
  const analysisId = (await saved.json()).analysis.id as string;
  expect((await tech.put(`/api/jobs/${jobId}/report`, { data: { analysisIds: [analysisId], technicianName: typedName } })).status()).toBe(200);
  const draft = await (await tech.get(`/api/jobs/${jobId}/report`)).json();
  const sign = await tech.post(`/api/jobs/${jobId}/report/sign`, { data: { reportId: draft.revisions[0].id } });
  expect(sign.status(), await sign.text()).toBe(200);
  return { tech, reportId: draft.revisions[0].id as string };
}

test("the PDF's signature names the member who signed, from the signing record; a typed name is only 'prepared by'", async () => {
  const { tech, reportId } = await signedReport('Somebody Else');
  const report = { revisions: [{ id: reportId }] };
  const pdf = await tech.get(`/api/reports/${report.revisions[0].id}/pdf`);
  const { execFileSync } = await import('node:child_process');
  const text = execFileSync('pdftotext', ['-', '-'], { input: await pdf.body() }).toString();
  expect(text).toMatch(new RegExp(`Signed by .*<${DEMO.technician.replace(/\./g, '\\.')}>`));
  expect(text).not.toMatch(/Signed by Somebody Else/);
  expect(text).toContain('Prepared by Somebody Else');

  // One answer per revision through a link: the second is a 409 and the first stands.
  const share = await tech.post(`/api/reports/${report.revisions[0].id}/share`, { data: {} });
  const token = ((await share.json()).url as string).split('/r/')[1];
  const anon = await newContext();
  const first = await anon.post('/api/public/decision', { data: { token, decision: 'approve', typedName: 'Pat Customer' } });
  expect(first.status()).toBe(200);
  const second = await anon.post('/api/public/decision', { data: { token, decision: 'decline', typedName: 'Pat Customer' } });
  expect(second.status()).toBe(409);
  expect((await second.json()).error.message).toMatch(/already given.*it stands/);
});

test('sending the report by e-mail is limited per member (429 with a sentence) and every send is audited', async () => {
  // A shop of its own, so the demo shop's members keep their sends for the other tests.
  const owner = await signUpVerified(unique('limits-owner'), 'Limits Owner');
  expect((await owner.post('/api/shops', { data: { name: 'Limits Shop' } })).status()).toBe(200);
  const { tech, reportId } = await signedReport(undefined, owner);
  let last = 0;
  for (let i = 0; i < 11; i++) {
    const res = await tech.post(`/api/reports/${reportId}/send`, { data: { to: `someone${i}@example.com`, note: 'https://example.com/look' } });
    last = res.status();
    if (last === 429) {
      expect((await res.json()).error.message).toMatch(/in the last hour/);
      break;
    }
    expect(last).toBe(200);
  }
  expect(last).toBe(429);
});
