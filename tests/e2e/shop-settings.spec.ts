/**
 * A shop's time zone, units and contact: the zone starts as the creator's browser's, the owner changes them,
 * and pages, the report e-mail and the PDF show dates in that zone with the zone named and the coolant in that
 * unit; a new job's odometer starts in the shop's distance unit; the customer's page and the e-mail carry the
 * shop's phone and address, lines kept. Expected zone names follow the IANA database's rules (Europe/Berlin is UTC+1 in winter, UTC+2 in summer).
 */
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { expect, test } from '@playwright/test';
import { strFromU8, unzipSync } from 'fflate';
import { DEMO, signIn, signUpVerified, unique, waitForMail } from './helpers';

const SAMPLE = readFileSync('samples/i4-burnt-valve-current-sync.csv');


test('a new shop starts in the creator’s zone; the owner sets Berlin, °F, miles and a contact; the PDF, e-mail, job form and customer page follow', async ({ page, context }) => {
  const owner = await signUpVerified(unique('zone-owner'), 'Zone Owner');
  const created = await owner.post('/api/shops', { data: { name: 'Zone Test Garage', timeZone: 'Asia/Kolkata' } });
  expect(created.status(), await created.text()).toBe(200);
  // The defaults: kPa, and the starting-system limits with their sources (signal/starting/limits.ts).
  const defaults = { crankingMinRpm: 150, crankingMinV: 9.6, currentBaseA: 80, currentPerLitreA: 50, internalMaxMilliOhm: 20, restingMinV: 12.4 };
  expect((await (await owner.get('/api/shop')).json()).shop.settings).toEqual({ timeZone: 'Asia/Kolkata', temperatureUnit: 'C', distanceUnit: 'km', phone: '', address: '', pressureUnit: 'kPa', startingLimits: defaults });
  // A limit out of range is refused in words; a good one is kept, and a later change that leaves the limits out keeps them.
  const wrongLimit = await owner.patch('/api/shop', { data: { timeZone: 'Asia/Kolkata', temperatureUnit: 'C', startingLimits: { ...defaults, crankingMinV: 30 } } });
  expect(wrongLimit.status()).toBe(400);
  expect(JSON.stringify((await wrongLimit.json()).error)).toContain('The cranking voltage limit must be between 6 and 12 V.');
  expect((await owner.patch('/api/shop', { data: { timeZone: 'Asia/Kolkata', temperatureUnit: 'C', pressureUnit: 'bar', startingLimits: { ...defaults, crankingMinV: 9.8 } } })).status()).toBe(200);
  expect((await owner.patch('/api/shop', { data: { timeZone: 'Asia/Kolkata', temperatureUnit: 'C' } })).status()).toBe(200);
  expect((await (await owner.get('/api/shop')).json()).shop.settings).toMatchObject({ pressureUnit: 'bar', startingLimits: { crankingMinV: 9.8 } });
  // A zone the database does not know is refused in words.
  const bad = await owner.patch('/api/shop', { data: { timeZone: 'Mars/Olympus', temperatureUnit: 'C' } });
  expect(bad.status()).toBe(400);
  expect((await bad.json()).error.fields.timeZone).toMatch(/Choose a time zone/);
  // Typed text keeps its lines (CR/LF becomes LF) and any Unicode.
  const address = 'Hof 3 — Ölweg 12 "Werkstatt"\r\n北区 🚗 100%';
  const patched = await owner.patch('/api/shop', { data: { timeZone: 'Europe/Berlin', temperatureUnit: 'F', distanceUnit: 'mi', phone: '+49 30 1234567', address } });
  expect(patched.status(), await patched.text()).toBe(200);
  expect((await patched.json()).settings.address).toBe('Hof 3 — Ölweg 12 "Werkstatt"\n北区 🚗 100%');
  await context.addCookies((await owner.storageState()).cookies);
  await page.goto('/jobs/new');
  await expect(page.getByLabel('Unit')).toHaveValue('mi');

  const job = await owner.post('/api/jobs', { data: { repairOrder: 'ZONE-1', concern: 'Dates in the shop zone.', vehicle: { make: 'Test', model: 'Zone', engine: { cylinders: 4, layout: 'inline', firingOrder: '1-3-4-2' } } } });
  const jobId = (await job.json()).job.id as string;
  const up = await owner.post(`/api/jobs/${jobId}/captures`, { headers: { 'content-type': 'text/csv', 'x-file-name': 'zone.csv' }, data: SAMPLE });
  const saved = await owner.post(`/api/captures/${(await up.json()).capture.id}/analyses`, { data: { settings: { engine: { cylinders: 4, firingOrder: [1, 3, 4, 2] } } } });
  const analysisId = (await saved.json()).analysis.id as string;
  await owner.put(`/api/jobs/${jobId}/report`, { data: { analysisIds: [analysisId], conditions: { coolantTempC: 90 } } });
  const draft = await (await owner.get(`/api/jobs/${jobId}/report`)).json();
  expect((await owner.post(`/api/jobs/${jobId}/report/sign`, { data: { reportId: draft.revisions[0].id } })).status()).toBe(200);
  const pdf = await owner.get(`/api/reports/${draft.revisions[0].id}/pdf`);
  const text = execFileSync('pdftotext', ['-layout', '-', '-'], { input: await pdf.body() }).toString();
  expect(text).toMatch(/GMT\+[12]/);
  expect(text).not.toMatch(/\d{2}:\d{2} UTC/);
  expect(text).toContain('194 °F');

  const to = unique('zone-customer');
  expect((await owner.post(`/api/reports/${draft.revisions[0].id}/send`, { data: { to } })).status()).toBe(200);
  const mail = (await waitForMail(to, /compression test report for ZONE-1/)) as unknown as { text: string };
  expect(mail.text).toMatch(/signed [A-Z][a-z]{2} \d+, \d{4}, \d{2}:\d{2} GMT\+[12]/);
  expect(mail.text).toContain('Hof 3 — Ölweg 12 "Werkstatt"\n北区 🚗 100%\nPhone +49 30 1234567');
  const shared = await owner.post(`/api/reports/${draft.revisions[0].id}/share`, { data: {} });
  await page.goto(new URL((await shared.json()).url).pathname);
  await expect(page.getByText('北区 🚗 100%')).toBeVisible();
  await expect(page.getByRole('link', { name: '+49 30 1234567' }).first()).toHaveAttribute('href', 'tel:+49301234567');
});

test('the demo shop’s pages show dates in its zone, named', async ({ page }) => {
  await signIn(DEMO.technician);
  await page.goto('/sign-in');
  await page.getByRole('button', { name: /technician/i }).click();
  await page.getByRole('button', { name: 'Sign in', exact: true }).click();
  await expect(page.getByRole('heading', { name: 'Jobs' })).toBeVisible();
  await expect(page.getByRole('table').getByText(/\d{2}:\d{2} C[SD]T/).first()).toBeVisible();
});

test('owners read the API reference drawn from /api/openapi.json; others are not shown it', async ({ page }) => {
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  await page.goto('/sign-in');
  await page.getByRole('button', { name: /owner/i }).click();
  await page.getByRole('button', { name: 'Sign in', exact: true }).click();
  await expect(page.getByRole('heading', { name: 'Jobs' })).toBeVisible();
  await page.goto('/shop');
  await page.getByRole('link', { name: 'API reference for integrations' }).click();
  await expect(page.getByRole('heading', { name: 'API reference' })).toBeVisible();
  await expect(page.getByTestId('api-reference').getByText('/api/jobs/{jobId}/captures').first()).toBeVisible({ timeout: 30_000 });
  await page.screenshot({ path: 'artifacts/screens/api-reference.png' });
  expect(errors).toEqual([]);
  const tech = await signIn(DEMO.technician);
  // The page streams, so the not-found answer is its content rather than its status.
  const html = await (await tech.get('/shop/api')).text();
  expect(html).toContain('That page does not exist');
  expect(html).not.toContain('swagger');
});

test('an owner sets data retention: 0 days and 100 years are refused with a sentence, two years is saved and recorded', async ({ page, context }) => {
  const owner = await signUpVerified(unique('retention-owner'), 'Retention Owner');
  expect((await owner.post('/api/shops', { data: { name: 'Retention Garage' } })).status()).toBe(200);
  const refused = await owner.patch('/api/shop/retention', { data: { retentionDays: 0 } });
  expect(refused.status()).toBe(400);
  expect((await refused.json()).error.fields.retentionDays).toMatch(/at least 30 days/);
  await context.addCookies((await owner.storageState()).cookies);
  await page.goto('/shop');
  const section = page.getByRole('region', { name: 'Data retention' });
  await expect(section).toContainText('Now: kept for ever');
  await section.getByLabel('Remove them a number of days after the job is done').check();
  const days = section.getByRole('textbox', { name: 'Days after the job is done' });
  for (const [typed, said] of [
    ['0', /at least 30 days/],
    ['36 500', /at most 3650 days/],
  ] as const) {
    await days.fill(typed);
    await section.getByRole('button', { name: 'Save retention' }).click();
    await expect(section.getByText(said)).toBeVisible();
  }
  await days.fill('730');
  await section.getByRole('button', { name: 'Save retention' }).click();
  await expect(section.getByText('Saved: captures and analyses are kept 2 years after a job is done.')).toBeVisible();
  await page.reload();
  await expect(section).toContainText('Now: kept 2 years after a job is done');
  await expect(page.getByTestId('activity')).toContainText('set captures and analyses to be kept 2 years after a job is done');
  await page.screenshot({ path: 'artifacts/screens/retention.png', fullPage: true });
});

test('an owner downloads the shop’s data as one zip, then removes the shop by typing its name (not without)', async ({ page, context }) => {
  const email = unique('leaving-owner');
  const owner = await signUpVerified(email, 'Leaving Owner');
  const name = 'Ölwechsel — 東 Garage "100%"';
  expect((await owner.post('/api/shops', { data: { name } })).status()).toBe(200);
  const job = await owner.post('/api/jobs', { data: { repairOrder: 'LEAVE-1', concern: 'Export before leaving.', vehicle: { make: 'Test', model: 'Leave', engine: { cylinders: 4, layout: 'inline', firingOrder: '1-3-4-2' } } } });
  const jobId = (await job.json()).job.id as string;
  const up = await owner.post(`/api/jobs/${jobId}/captures`, { headers: { 'content-type': 'text/csv', 'x-file-name': encodeURIComponent('brems—ü.csv') }, data: SAMPLE });
  expect(up.status(), await up.text()).toBe(200);
  const saved = await owner.post(`/api/captures/${(await up.json()).capture.id}/analyses`, { data: { settings: { engine: { cylinders: 4, firingOrder: [1, 3, 4, 2] } } } });
  const analysisId = (await saved.json()).analysis.id as string;
  await owner.put(`/api/jobs/${jobId}/report`, { data: { analysisIds: [analysisId] } });
  const draft = await (await owner.get(`/api/jobs/${jobId}/report`)).json();
  expect((await owner.post(`/api/jobs/${jobId}/report/sign`, { data: { reportId: draft.revisions[0].id } })).status()).toBe(200);

  // The zip (read with fflate's own reader, which checks every entry's CRC-32): the file as uploaded, the jobs, the signed PDF.
  const zip = await owner.get('/api/shop/export');
  expect(zip.status()).toBe(200);
  expect(zip.headers()['content-type']).toBe('application/zip');
  const files = unzipSync(new Uint8Array(await zip.body()));
  const names = Object.keys(files);
  expect(names).toContain('shop.json');
  expect(JSON.parse(strFromU8(files['shop.json'])).name).toBe(name);
  const jobs = JSON.parse(strFromU8(files['jobs.json']));
  expect(jobs.map((j: { repairOrder: string }) => j.repairOrder)).toEqual(['LEAVE-1']);
  expect(jobs[0].analyses).toHaveLength(1);
  const capture = names.find((n) => n.startsWith('captures/LEAVE-1/') && n.endsWith('brems—ü.csv'))!;
  expect(Buffer.from(files[capture]).equals(SAMPLE)).toBe(true);
  expect(strFromU8(files['reports/LEAVE-1-rev1.pdf'].subarray(0, 5))).toBe('%PDF-');

  // Without its name typed, nothing is removed.
  for (const confirmName of ['', 'Another shop']) {
    const refused = await owner.delete('/api/shop', { data: { confirmName } });
    expect(refused.status()).toBe(400);
    expect((await refused.json()).error.message).toContain('Type the shop’s name exactly');
  }
  expect((await owner.get(`/api/jobs/${jobId}`)).status()).toBe(200);

  await context.addCookies((await owner.storageState()).cookies);
  await page.goto('/shop');
  const section = page.getByRole('region', { name: 'The shop’s data' });
  const remove = section.getByRole('button', { name: 'Remove the shop and all its data' });
  await expect(remove).toBeDisabled();
  await section.getByLabel(/Type the shop’s name/).fill(name);
  await page.screenshot({ path: 'artifacts/screens/shop-remove.png', fullPage: true });
  await remove.click();
  await page.waitForURL((u) => !u.pathname.startsWith('/shop'));
  expect((await owner.get(`/api/jobs/${jobId}`)).status()).not.toBe(200);
  expect((await owner.get('/api/jobs')).status()).toBe(403);
});
