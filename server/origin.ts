/**
 * A cross-site request check for every state-changing route, on top of SameSite=Lax cookies and better-auth's
 * own origin check on its endpoints: a browser request from another site (its Origin header, or
 * Sec-Fetch-Site: cross-site) is refused. Clients that send neither (scripts) still need a session cookie.
 */
import 'server-only';
import { APP_URL } from './auth';
import { HttpError } from './http';

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);
const APP_ORIGIN = new URL(APP_URL).origin;

export function checkOrigin(req: Request): void {
  if (SAFE.has(req.method)) return;
  const origin = req.headers.get('origin');
  const crossSite = origin ? origin !== APP_ORIGIN : req.headers.get('sec-fetch-site') === 'cross-site';
  if (crossSite) throw new HttpError(403, 'CROSS_SITE', 'This request came from another site and was refused; open Crankprint itself and try again.');
}
