/** A per-process sliding-window limit for the public share-link routes (several instances: put it in front). */
import 'server-only';

const hits = new Map<string, number[]>();

/** true when the key is still within `max` hits per `windowMs`; records this hit. */
export function allow(key: string, max: number, windowMs = 60_000): boolean {
  const now = Date.now();
  const list = (hits.get(key) ?? []).filter((t) => now - t < windowMs);
  list.push(now);
  hits.set(key, list);
  if (hits.size > 10_000) for (const [k, v] of hits) if (now - v[v.length - 1] > windowMs) hits.delete(k);
  return list.length <= max;
}

export function clientKey(headers: Headers): string {
  return headers.get('x-forwarded-for')?.split(',')[0].trim() || headers.get('x-real-ip') || 'local';
}

export const PUBLIC_LIMIT_PER_MIN = 30 * Math.max(1, Number(process.env.CRANKPRINT_RATE_LIMIT_SCALE) || 1);
