/**
 * better-auth as configured for production: session cookies are Secure, HttpOnly and SameSite=Lax under the
 * __Secure- prefix (RFC 6265bis cookie prefixes), and its origin check refuses a sign-in posted from another
 * site. Run against the handler itself on a throwaway embedded database with the demo shop.
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const APP = 'https://shop.example.test';
process.env.CRANKPRINT_DATA_DIR = mkdtempSync(join(tmpdir(), 'crankprint-cookies-'));
process.env.CRANKPRINT_DEMO = '1';
process.env.BETTER_AUTH_URL = APP;
process.env.BETTER_AUTH_SECRET = 'cookie-test-secret-0123456789abcdef0123456789';
(process.env as Record<string, string>).NODE_ENV = 'production';

const { getAuth } = await import('@/server/auth');
const { getDb } = await import('@/db/client');
await getDb();
const auth = await getAuth();

const signIn = (origin: string) =>
  auth.handler(
    new Request(`${APP}/api/auth/sign-in/email`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', origin, 'x-forwarded-for': '198.51.100.7' },
      body: JSON.stringify({ email: 'tech@demo.crankprint.test', password: 'crank-demo-2026' }),
    }),
  );

describe('session cookies in production', () => {
  it('are Secure, HttpOnly, SameSite=Lax and __Secure- prefixed', async () => {
    const res = await signIn(APP);
    expect(res.status).toBe(200);
    const cookies = res.headers.getSetCookie();
    const session = cookies.find((c) => c.includes('session_token='));
    expect(session).toBeDefined();
    expect(session).toMatch(/^__Secure-crankprint\.session_token=/);
    expect(session).toMatch(/;\s*Secure/i);
    expect(session).toMatch(/;\s*HttpOnly/i);
    expect(session).toMatch(/;\s*SameSite=Lax/i);
  });

  it('a sign-in posted from another site is refused', async () => {
    const res = await signIn('https://evil.example');
    expect(res.status).toBe(403);
    expect(res.headers.getSetCookie().some((c) => c.includes('session_token='))).toBe(false);
  });
});
