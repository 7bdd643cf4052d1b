/** Shared steps for the browser and HTTP tests: the mail sink's messages, sign-up with verification, demo sign-in. */
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { type APIRequestContext, expect, type Locator, type Page, request } from '@playwright/test';

export const BASE_URL = `http://127.0.0.1:${process.env.E2E_PORT || '3210'}`;
const MAIL_DIR = process.env.MAIL_SINK_DIR || '.e2e/mail';
export const DEMO_PASSWORD = 'crank-demo-2026';
export const DEMO = {
  owner: 'owner@demo.crankprint.test',
  technician: 'tech@demo.crankprint.test',
  advisor: 'advisor@demo.crankprint.test',
} as const;

interface Kept {
  to: string[];
  subject: string;
  links: string[];
  receivedAt: string;
}

/** Waits for the newest message to `to` whose subject matches, and returns it. */
export async function waitForMail(to: string, subject: RegExp, timeoutMs = 15_000): Promise<Kept> {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    if (existsSync(MAIL_DIR)) {
      const found = readdirSync(MAIL_DIR)
        .filter((f) => f.endsWith('.json'))
        .map((f) => JSON.parse(readFileSync(join(MAIL_DIR, f), 'utf8')) as Kept)
        .filter((m) => m.to.includes(to) && subject.test(m.subject))
        .sort((a, b) => b.receivedAt.localeCompare(a.receivedAt));
      if (found[0]) return found[0];
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`No mail to ${to} matching ${subject}`);
}

export async function newContext(): Promise<APIRequestContext> {
  return request.newContext({ baseURL: BASE_URL, extraHTTPHeaders: { origin: BASE_URL } });
}

export async function signIn(email: string, password = DEMO_PASSWORD): Promise<APIRequestContext> {
  const ctx = await newContext();
  const res = await ctx.post('/api/auth/sign-in/email', { data: { email, password } });
  expect(res.status(), `sign-in ${email}`).toBe(200);
  return ctx;
}

/** Signs up, opens the verification link from the sink, and returns the signed-in context. */
export async function signUpVerified(email: string, name: string, password = 'correct-horse-battery'): Promise<APIRequestContext> {
  const ctx = await newContext();
  const res = await ctx.post('/api/auth/sign-up/email', { data: { email, name, password } });
  expect(res.status(), await res.text()).toBe(200);
  const mail = await waitForMail(email, /Confirm your e-mail/);
  const link = mail.links.find((l) => l.includes('verify-email'))!;
  const verify = await ctx.get(link.replace(/^https?:\/\/[^/]+/, ''), { maxRedirects: 0 });
  expect([200, 302, 307]).toContain(verify.status());
  const session = await ctx.get('/api/auth/get-session');
  expect((await session.json())?.user?.email).toBe(email);
  return ctx;
}

export function unique(prefix: string): string {
  return `${prefix}-${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}@example.com`;
}

/**
 * Answers the job's cautions if they are asked (once per job and member, recorded by the server), then waits for
 * `then`: the two are never on screen together, so whichever shows first is answered.
 */
export async function pastCautions(page: Page, then: Locator, timeout = 60_000): Promise<void> {
  const gate = page.getByRole('button', { name: /I have read this/ });
  await expect(gate.or(then)).toBeVisible({ timeout });
  if (await gate.isVisible()) await gate.click();
  await expect(then).toBeVisible({ timeout });
}

/** Chooses a file in the job page's uploader, past the job's cautions. */
export async function uploadOnJobPage(page: Page, file: string): Promise<void> {
  const uploader = page.getByTestId('uploader');
  await pastCautions(page, uploader, 30_000);
  await uploader.locator('input[type=file]').first().setInputFiles(file);
}

/** Signs in through the page as one of the demo members, and waits for the jobs list. */
export async function signInAs(page: Page, role: 'technician' | 'advisor' | 'owner'): Promise<void> {
  await page.goto('/sign-in');
  await page.getByRole('button', { name: new RegExp(role, 'i') }).click();
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('heading', { name: 'Jobs' })).toBeVisible();
}
