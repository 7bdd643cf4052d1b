/**
 * A shop's time zone and temperature unit: the zone starts as the creator's browser's, the owner changes both,
 * and pages, the report e-mail and the PDF show dates in that zone with the zone named and the coolant in that
 * unit. Expected zone names follow the IANA database's rules (Europe/Berlin is UTC+1 in winter, UTC+2 in summer).
 */
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { expect, test } from '@playwright/test';
import { DEMO, signIn, signUpVerified, unique, waitForMail } from './helpers';

const SAMPLE = readFileSync('samples/i4-burnt-valve-current-sync.csv');


test('a new shop starts in the creator’s zone; the owner sets Berlin and °F; the PDF and e-mail follow', async () => {
  const owner = await signUpVerified(unique('zone-owner'), 'Zone Owner');
  const created = await owner.post('/api/shops', { data: { name: 'Zone Test Garage', timeZone: 'Asia/Kolkata' } });
  expect(created.status(), await created.text()).toBe(200);
  expect((await (await owner.get('/api/shop')).json()).shop.settings).toEqual({ timeZone: 'Asia/Kolkata', temperatureUnit: 'C' });
  // A zone the database does not know is refused in words.
  const bad = await owner.patch('/api/shop', { data: { timeZone: 'Mars/Olympus', temperatureUnit: 'C' } });
  expect(bad.status()).toBe(400);
  expect((await bad.json()).error.fields.timeZone).toMatch(/Choose a time zone/);
  expect((await owner.patch('/api/shop', { data: { timeZone: 'Europe/Berlin', temperatureUnit: 'F' } })).status()).toBe(200);

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
