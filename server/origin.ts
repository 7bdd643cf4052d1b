/**
 * A cross-site request check for every state-changing route, on top of SameSite=Lax cookies, as better-auth
 * does on its own endpoints: the request must name our origin in Origin, or — when a browser left Origin out —
 * come with a Referer from our origin. A request with neither (or from another site) is refused.
 */
import 'server-only';
import { APP_URL } from './auth';
import { HttpError } from './http';

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);
const APP_ORIGIN = new URL(APP_URL).origin;

function originOf(url: string): string | null {
  try {
    return new URL(url).origin;
  } catch {
    return null;
  }
}

export function checkOrigin(req: Request): void {
  if (SAFE.has(req.method)) return;
  const origin = req.headers.get('origin');
  const referer = req.headers.get('referer');
  const from = origin && origin !== 'null' ? origin : referer ? originOf(referer) : null;
  if (!from) throw new HttpError(403, 'ORIGIN_REQUIRED', 'This request did not say which site sent it (no Origin or Referer header) and was refused; send it from Crankprint, or set Origin to Crankprint’s address.');
  if (from !== APP_ORIGIN || req.headers.get('sec-fetch-site') === 'cross-site') {
    throw new HttpError(403, 'CROSS_SITE', 'This request came from another site and was refused; open Crankprint itself and try again.');
  }
}
