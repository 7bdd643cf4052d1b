/**
 * Each role sees what needs them first (issue 22, point 3): the technician, captures not analysed yet; the
 * advisor, a signed report ready to send and the customer's answer; at 390 px the jobs list is cards with
 * status and date. The data are made through the API as a shop would make them.
 */
import { readFileSync } from 'node:fs';
import { expect, type Page, test } from '@playwright/test';
import { DEMO, signIn, unique } from './helpers';

const SAMPLE = readFileSync('samples/i4-burnt-valve-current-sync.csv');

async function jobsPageAs(page: Page, role: RegExp) {
  await page.goto('/sign-in');
  await page.getByRole('button', { name: role }).click();
  await page.getByRole('button', { name: 'Sign in', exact: true }).click();
  await expect(page.getByRole('heading', { name: 'Jobs' })).toBeVisible();
}

test('the technician sees captures to analyse first; the advisor sees a signed report to send, then the answer', async ({ page }) => {
  const tech = await signIn(DEMO.technician);
  const ro = unique('QUEUE').split('@')[0];
  const made = await tech.post('/api/jobs', { data: { repairOrder: ro, concern: 'Queues.', vehicle: { make: 'Test', model: 'Queue', engine: { cylinders: 4, layout: 'inline', firingOrder: '1-3-4-2' } } } });
  const jobId = (await made.json()).job.id as string;
  const up = await tech.post(`/api/jobs/${jobId}/captures`, { headers: { 'content-type': 'text/csv', 'x-file-name': 'queue.csv' }, data: SAMPLE });
  const captureId = (await up.json()).capture.id as string;

  await jobsPageAs(page, /technician/i);
  const needs = page.getByTestId('needs-you');
  await expect(needs.getByRole('listitem').filter({ hasText: ro })).toContainText('1 capture not analysed yet');
  await page.screenshot({ path: 'artifacts/screens/jobs-technician.png', fullPage: true });

  // Analysed and signed: the technician's queue lets go of it, the advisor's takes it.
  const saved = await tech.post(`/api/captures/${captureId}/analyses`, { data: { settings: { engine: { cylinders: 4, firingOrder: [1, 3, 4, 2] } } } });
  await tech.put(`/api/jobs/${jobId}/report`, { data: { analysisIds: [(await saved.json()).analysis.id] } });
  const draft = await (await tech.get(`/api/jobs/${jobId}/report`)).json();
  expect((await tech.post(`/api/jobs/${jobId}/report/sign`, { data: { reportId: draft.revisions[0].id } })).status()).toBe(200);
  await page.reload();
  await expect(page.getByRole('heading', { name: 'Jobs' })).toBeVisible();
  await expect(page.getByTestId('needs-you').filter({ hasText: ro })).toHaveCount(0);

  await page.context().clearCookies();
  await jobsPageAs(page, /advisor/i);
  await expect(page.getByTestId('needs-you').getByRole('listitem').filter({ hasText: ro })).toContainText('Signed report ready to send');
  await page.screenshot({ path: 'artifacts/screens/jobs-advisor.png', fullPage: true });

  // At 390 px: cards with status and date, nothing wider than the screen.
  await page.setViewportSize({ width: 390, height: 844 });
  const card = page.getByTestId('job-cards').getByRole('listitem').filter({ hasText: ro });
  await expect(card).toContainText('Open');
  await expect(card).toContainText(/\d{2}:\d{2} C[SD]T/);
  await expect(page.getByRole('table')).toBeHidden();
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
  await page.screenshot({ path: 'artifacts/screens/jobs-390.png', fullPage: true });
});
