/**
 * Pages only: a fresh script nonce per request in the Content-Security-Policy, passed to the render in the
 * request's own CSP header (Next.js puts it on its scripts) and in x-nonce (the layout's theme script).
 * No checks here: session and role are checked in each page and handler.
 */
import { type NextRequest, NextResponse } from 'next/server';
import { contentSecurityPolicy } from '@/server/csp.mjs';

export function proxy(request: NextRequest): NextResponse {
  const nonce = btoa(crypto.randomUUID());
  const csp = contentSecurityPolicy({ nonce, dev: process.env.NODE_ENV !== 'production' });
  const headers = new Headers(request.headers);
  headers.set('x-nonce', nonce);
  headers.set('content-security-policy', csp);
  const response = NextResponse.next({ request: { headers } });
  response.headers.set('content-security-policy', csp);
  return response;
}

// Every page response carries the policy, prefetches included (a prefetched page is shown without asking again).
export const config = {
  matcher: ['/((?!api/|_next/static|_next/image|icon.svg).*)'],
};
