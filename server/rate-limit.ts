/**
 * One budget per client and purpose, counted by rate-limiter-flexible: in PostgreSQL when DATABASE_URL is set
 * (every instance on that server shares the counts), in memory on the embedded database (one process holds it).
 * The client is the address the server took from the socket or its trusted proxies (server/serve.mjs).
 */
import 'server-only';
import { RateLimiterDrizzle, type RateLimiterAbstract, RateLimiterMemory, RateLimiterRes } from 'rate-limiter-flexible';
import { getDb } from '@/db/client';
import { rateLimits } from '@/db/schema';
import { CLIENT_HEADER } from '@/server/client-address.mjs';
import { clientKey } from './client-key';
import { HttpError } from './http';
import { log } from './log';
import { processShared } from '@/db/process-state.mjs';

/** CRANKPRINT_RATE_LIMIT_SCALE multiplies every budget (the browser tests share one loopback address). */
const scale = Math.max(1, Number(process.env.CRANKPRINT_RATE_LIMIT_SCALE) || 1);

/** Attempts per client per minute. `share` counts the customer's page and its API together. */
export const BUDGETS = {
  share: 30,
  'sign-in': 10,
  'sign-up': 5,
  'password-reset': 5,
  auth: 200,
} as const;
export type Purpose = keyof typeof BUDGETS;

const WINDOW_S = 60;

const g = processShared<{ limiters?: Promise<Record<Purpose, RateLimiterAbstract>> }>('rateLimits', () => ({}));

async function build(): Promise<Record<Purpose, RateLimiterAbstract>> {
  const db = process.env.DATABASE_URL ? await getDb() : null;
  const make = (purpose: Purpose): RateLimiterAbstract => {
    const opts = { keyPrefix: purpose, points: BUDGETS[purpose] * scale, duration: WINDOW_S };
    return db ? new RateLimiterDrizzle({ ...opts, storeClient: db, schema: rateLimits }) : new RateLimiterMemory(opts);
  };
  return Object.fromEntries((Object.keys(BUDGETS) as Purpose[]).map((p) => [p, make(p)])) as Record<Purpose, RateLimiterAbstract>;
}

let warned = false;
/**
 * The client's budget key from the address the server wrote (IPv6 by its /64, `::ffff:` as IPv4); one shared key
 * (and a warning) when the app runs without it.
 */
export function clientOf(headers: Headers): string {
  if (process.env.CRANKPRINT_SERVED === '1') return clientKey(headers.get(CLIENT_HEADER) || 'unknown');
  if (!warned) {
    warned = true;
    log.warn('Crankprint is running without its server (npm start): every client shares one rate-limit budget.');
  }
  return 'unserved';
}

/** Counts one attempt; a 429 with a sentence (and Retry-After) once the client's budget for `purpose` is spent. */
export async function spend(purpose: Purpose, headers: Headers): Promise<void> {
  g.limiters ??= build();
  const limiters = await g.limiters;
  try {
    await limiters[purpose].consume(clientOf(headers));
  } catch (e) {
    if (!(e instanceof RateLimiterRes)) throw e;
    const seconds = Math.max(1, Math.ceil(e.msBeforeNext / 1000));
    const err = new HttpError(429, 'RATE_LIMITED', `Too many attempts from your address; wait ${seconds} s and try again.`);
    err.retryAfterS = seconds;
    throw err;
  }
}

/** True while the client's budget lasts (for pages, which answer with their own not-found). */
export async function withinBudget(purpose: Purpose, headers: Headers): Promise<boolean> {
  try {
    await spend(purpose, headers);
    return true;
  } catch (e) {
    if (e instanceof HttpError && e.status === 429) return false;
    throw e;
  }
}
