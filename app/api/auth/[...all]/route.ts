/**
 * better-auth's own endpoints: sign-up, sign-in, sign-out, e-mail verification, password reset, session,
 * invitations. Each POST spends the client's budget for its purpose (server/rate-limit.ts); bodies are read
 * with the JSON limit while they stream, then handed on.
 */
import { getAuth } from '@/server/auth';
import { errorResponse, HttpError } from '@/server/http';
import { announceMembershipChange } from '@/server/membership-cache';
import { type Purpose, spend } from '@/server/rate-limit';
import { readLimited } from '@/server/request-body';
import { inRequest, requestIdOf } from '@/server/log';

/** Which budget a POST to better-auth spends, by the path after /api/auth. */
function purposeOf(path: string): Purpose {
  // Everything that checks a password spends the sign-in budget.
  if (path.startsWith('/sign-in') || path === '/change-password' || path === '/change-email' || path === '/delete-user') return 'sign-in';
  if (path.startsWith('/sign-up')) return 'sign-up';
  if (path === '/request-password-reset' || path === '/reset-password' || path === '/send-verification-email') return 'password-reset';
  return 'auth';
}

/** The least time a password-reset request takes: longer than its work takes, so both answers take the same. */
const RESET_FLOOR_MS = 400;

const waitUntil = (at: number) => new Promise((r) => setTimeout(r, Math.max(0, at - performance.now())));

async function handle(req: Request): Promise<Response> {
  try {
    let forward = req;
    if (req.method !== 'GET' && req.method !== 'HEAD') {
      await spend(purposeOf(new URL(req.url).pathname.replace(/^\/api\/auth/, '')), req.headers);
      const body = await readLimited(req);
      forward = new Request(req.url, { method: req.method, headers: req.headers, body: body as unknown as BodyInit, signal: req.signal });
    }
    const auth = await getAuth();
    const started = performance.now();
    const res = await auth.handler(forward);
    // A reset request answers no sooner than the floor, whether the account exists or not.
    if (req.method === 'POST' && new URL(req.url).pathname.endsWith('/request-password-reset')) await waitUntil(started + RESET_FLOOR_MS);
    // Accepting an invitation or switching shops changes who is a member where.
    if (req.method === 'POST' && req.url.includes('/organization/')) await announceMembershipChange();
    return res;
  } catch (e) {
    if (e instanceof HttpError) return errorResponse(e);
    throw e;
  }
}

/** Each request runs with its id, so better-auth's own lines carry it. */
const run = (req: Request) => inRequest(requestIdOf(req.headers), () => handle(req));
export { run as GET, run as POST };
