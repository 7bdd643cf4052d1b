/** Security headers on every page, a frameable PDF preview only from our own origin, and no secret in the client bundle. */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { expect, test } from '@playwright/test';
import { newContext } from './helpers';

test('pages carry a CSP with frame-ancestors none, no-sniff and a referrer policy', async () => {
  const anon = await newContext();
  const res = await anon.get('/sign-in');
  const h = res.headers();
  expect(h['content-security-policy']).toContain("frame-ancestors 'none'");
  expect(h['content-security-policy']).toContain("object-src 'none'");
  expect(h['x-content-type-options']).toBe('nosniff');
  expect(h['referrer-policy']).toBe('strict-origin-when-cross-origin');
  expect(h['x-powered-by']).toBeUndefined();
});

test('the built client chunks hold no server secret', () => {
  const secret = process.env.BETTER_AUTH_SECRET || 'e2e-only-secret-0123456789abcdef0123456789';
  const files: string[] = [];
  const walk = (d: string) => {
    for (const n of readdirSync(d)) {
      const p = join(d, n);
      if (statSync(p).isDirectory()) walk(p);
      else if (/\.(js|css|html|json)$/.test(n)) files.push(p);
    }
  };
  walk('.next/static');
  expect(files.length).toBeGreaterThan(0);
  for (const f of files) {
    const text = readFileSync(f, 'utf8');
    expect(text.includes(secret), f).toBe(false);
    // Library code may name environment variables; what must never ship is a value: the secret or a connection string.
    expect(/postgres(ql)?:\/\/[^\s"'`]*@/.test(text), f).toBe(false);
  }
});
