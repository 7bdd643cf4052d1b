/**
 * The job-file report: sign-off freezes a revision, the PDF goes by e-mail with the attachment, a customer link
 * opens one report without an account and records the answer against the revision seen; revoked or guessed
 * links are a 404 with no hint which; an advisor can send but not edit.
 */
import { expect, test } from '@playwright/test';
import { DEMO, newContext, signIn, waitForMail } from './helpers';

test('sign, e-mail, share, approve, revoke; the old revision stays readable', async ({ page, browser }) => {
  await page.goto('/sign-in');
  await page.getByRole('button', { name: /technician/i }).click();
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('link', { name: 'RO-24104' }).click();
  await page.getByRole('link', { name: /Write the report|Open the report/ }).click();
  await expect(page.getByRole('heading', { name: 'Analyses to include' }).or(page.getByText('Analyses to include'))).toBeVisible();
  // The demo shop reads temperatures in °F: 185 °F is stored as 85 °C.
  await page.getByLabel('Coolant (°F)').fill('185');
  await page.getByLabel('Battery at rest (V)').fill('12.6');
  await page.getByRole('button', { name: 'Save draft' }).click();
  await expect(page.getByText(/Draft saved as revision 1/)).toBeVisible();
  await page.getByRole('button', { name: 'Sign revision 1' }).click();
  await expect(page.getByText('Revision 1 is signed. Send it or share it with the customer below.')).toBeVisible();
  // One notice says it is frozen, not two.
  await expect(page.getByText(/signed and frozen/)).toHaveCount(1);
  await page.screenshot({ path: 'artifacts/screens/report-editor.png', fullPage: true });

  // The e-mail carries the advisor's note (its lines kept) and a link the customer can answer from.
  const note = 'Hi — the test is done; see cylinder ü 3 “below”, 100% sure?\n\n二行目 🚗';
  await page.getByLabel('E-mail the PDF to').fill('service-desk@example.com');
  await page.getByLabel('Note to go with it (optional)').fill(note);
  await expect(page.getByLabel('Include a link the customer can answer from (open 14 days)')).toBeChecked();
  await page.getByRole('button', { name: 'Send', exact: true }).click();
  await expect(page.getByText(/Report sent to service-desk@example\.com, with a link to answer from, open until/)).toBeVisible();
  const tech = await signIn(DEMO.technician);
  const [mine] = (await (await tech.get('/api/jobs?q=RO-24104')).json()).jobs;
  expect(mine.status).toBe('waiting');
  const mail = (await waitForMail('service-desk@example.com', /compression test report for RO-24104/)) as unknown as { text: string; links: string[]; attachments: { filename: string; contentType: string }[] };
  expect(mail.attachments.map((a) => a.contentType)).toContain('application/pdf');
  expect(mail.text.startsWith(note)).toBe(true);
  expect(mail.text).toContain('Phone (555) 010-4821');
  const mailed = mail.links.find((l) => l.includes('/r/'))!;
  expect((await (await newContext()).get(mailed.replace(/^https?:\/\/[^/]+/, ''))).status()).toBe(200);

  await page.getByRole('button', { name: 'Create a customer link (14 days)' }).click();
  const url = (await page.getByTestId('share-url').textContent())!;
  const path = url.replace(/^https?:\/\/[^/]+/, '');
  const customer = await (await browser.newContext()).newPage();
  await customer.goto(path);
  await expect(customer.getByText('What we recommend next')).toBeVisible();
  // Plain words: a sentence per finding, no interval notation or status codes; the shop's phone and address.
  await expect(customer.getByTestId('customer-findings')).toContainText(/measured (alike|normal)|holds about \d+ % of the pressure of the others/);
  const words = (await customer.locator('main').innerText()).replace(/\s+/g, ' ');
  expect(words).not.toMatch(/\d–\d|✓|\bok\b|uncertain|interval/);
  await expect(customer.getByRole('link', { name: '(555) 010-4821' }).first()).toHaveAttribute('href', 'tel:5550104821');
  await expect(customer.getByText('48 Gearwheel Lane')).toBeVisible();
  await customer.screenshot({ path: 'artifacts/screens/customer.png', fullPage: true });
  // At 390 px nothing is wider than the screen.
  await customer.setViewportSize({ width: 390, height: 844 });
  expect(await customer.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
  await customer.screenshot({ path: 'artifacts/screens/customer-390.png', fullPage: true });
  await customer.setViewportSize({ width: 1280, height: 800 });
  await customer.getByLabel('Your name').fill('Pat Customer');
  await customer.getByRole('button', { name: 'Approve the next step' }).click();
  await expect(customer.getByText('you approved the recommended next step')).toBeVisible();
  // After a reload the page shows the answer and its time, not the buttons; the member who made the link is told.
  await customer.reload();
  await expect(customer.getByTestId('customer-answer')).toContainText('You approved the recommended next step');
  await expect(customer.getByRole('button', { name: 'Approve the next step' })).toHaveCount(0);
  await waitForMail(DEMO.technician, /RO-24104: the customer approved the recommended next step/);

  // The advisor sees the answer, against revision 1.
  const advisor = await signIn(DEMO.advisor);
  const jobs = (await (await advisor.get('/api/jobs?q=RO-24104')).json()).jobs;
  const report = await (await advisor.get(`/api/jobs/${jobs[0].id}/report`)).json();
  expect(report.approvals[0]).toMatchObject({ decision: 'approve', typedName: 'Pat Customer', revision: 1 });
  // The job followed the work: e-mailed (waiting on the customer), then answered (approved).
  expect((await (await advisor.get(`/api/jobs/${jobs[0].id}`)).json()).job.status).toBe('approved');
  // The advisor closes it with a reason, and may reopen it; a close without a reason is refused.
  const noReason = await advisor.post(`/api/jobs/${jobs[0].id}/status`, { data: { status: 'done' } });
  expect(noReason.status()).toBe(400);
  expect((await advisor.post(`/api/jobs/${jobs[0].id}/status`, { data: { status: 'done', reason: 'Customer booked the repair — “next week”.' } })).status()).toBe(200);
  expect((await (await advisor.get(`/api/jobs?status=done&q=RO-24104`)).json()).jobs.map((j: { repairOrder: string }) => j.repairOrder)).toContain('RO-24104');
  expect((await advisor.post(`/api/jobs/${jobs[0].id}/status`, { data: { status: 'open' } })).status()).toBe(200);
  await page.goto(`/jobs/${jobs[0].id}`);
  await expect(page.getByTestId('activity')).toContainText('moved a job from customer approved to done: “Customer booked the repair — “next week”.”');
  await expect(page.getByTestId('activity')).toContainText('The customer’s answer moved a job from waiting on customer to customer approved');
  await page.goBack();
  // The advisor can send but not edit.
  expect((await advisor.put(`/api/jobs/${jobs[0].id}/report`, { data: { interpretation: 'changed' } })).status()).toBe(403);
  expect((await advisor.post(`/api/reports/${report.revisions[0].id}/send`, { data: { to: 'customer@example.com' } })).status()).toBe(200);

  // Editing a signed report starts revision 2; revision 1 stays readable.
  await page.getByLabel('Interpretation').fill('Revised after a second look.');
  await page.getByRole('button', { name: 'Save as a new revision' }).click();
  await expect(page.getByText(/Draft saved as revision 2/)).toBeVisible();
  expect((await advisor.get(`/api/reports/${report.revisions[0].id}/pdf`)).status()).toBe(200);

  // Withdrawn and guessed links: the same 404, on the page and on the decision route.
  await page.reload();
  await page.getByRole('button', { name: 'Withdraw' }).first().click();
  await expect(page.getByText('withdrawn').first()).toBeVisible();
  const anon = await newContext();
  for (const p of [path, `/r/${'x'.repeat(43)}`]) {
    const res = await anon.get(p);
    expect(res.status()).toBe(404);
    expect(await res.text()).toContain('This link does not open a report');
  }
  const token = path.split('/r/')[1];
  const decision = await anon.post('/api/public/decision', { data: { token, decision: 'decline', typedName: 'Pat Customer' } });
  expect(decision.status()).toBe(404);
});

test('a report without a saved analysis cannot be signed', async () => {
  const tech = await signIn(DEMO.technician);
  const jobs = (await (await tech.get('/api/jobs?q=RO-24102')).json()).jobs;
  const draft = (await (await tech.put(`/api/jobs/${jobs[0].id}/report`, { data: { analysisIds: [], interpretation: 'nothing measured' } })).json()).report;
  const res = await tech.post(`/api/jobs/${jobs[0].id}/report/sign`, { data: { reportId: draft.id } });
  expect(res.status()).toBe(409);
  expect((await res.json()).error.message).toMatch(/at least one saved analysis/);
  // A draft is never e-mailed: it can still change.
  const send = await tech.post(`/api/reports/${draft.id}/send`, { data: { to: 'customer@example.com' } });
  expect(send.status()).toBe(409);
  expect((await send.json()).error.message).toMatch(/Sign the report before sending it/);
});

test('two tabs on one draft: the second save is told the draft changed and keeps what was typed; Enter starts a next step', async ({ page, context }) => {
  const tech = await signIn(DEMO.technician);
  const made = await tech.post('/api/jobs', {
    data: { repairOrder: `TABS-${Date.now().toString(36)}`, concern: 'Two tabs.', vehicle: { make: 'Test', model: 'Tabs', engine: { cylinders: 4, layout: 'inline', firingOrder: '1-3-4-2' } } },
  });
  const { job } = await made.json();
  await context.addCookies((await tech.storageState()).cookies);
  const other = await context.newPage();
  for (const p of [page, other]) {
    await p.goto(`/jobs/${job.id}/report`);
    await expect(p.getByLabel('Interpretation')).toBeVisible();
  }
  await page.getByLabel('Interpretation').fill('Typed in the first tab.');
  // Typed as a person types, Enter included: each line is one step.
  await page.getByLabel('Recommended next steps, one per line').pressSequentially('Check cam timing marks\nScope ignition coil 2', { delay: 20 });
  await expect(page.getByLabel('Recommended next steps, one per line')).toHaveValue('Check cam timing marks\nScope ignition coil 2');
  await page.getByRole('button', { name: 'Save draft' }).click();
  await expect(page.getByText(/Draft saved as revision 1/)).toBeVisible();
  await other.getByLabel('Interpretation').fill('Typed in the second tab — “keep me”.\nLine two.');
  await other.getByRole('button', { name: 'Save draft' }).click();
  await expect(other.getByText(/saved or signed in another tab/)).toBeVisible();
  // The second tab's text is still there to copy; the stored draft is the first tab's.
  await expect(other.getByLabel('Interpretation')).toHaveValue('Typed in the second tab — “keep me”.\nLine two.');
  const stored = await (await tech.get(`/api/jobs/${job.id}/report`)).json();
  expect(stored.revisions).toHaveLength(1);
  expect(stored.revisions[0].content.interpretation).toBe('Typed in the first tab.');
  expect(stored.revisions[0].content.nextSteps).toEqual(['Check cam timing marks', 'Scope ignition coil 2']);
});
