/**
 * Request bodies read with a limit that is checked while they stream: a declared length over the limit is
 * refused before reading, and a chunked body is cut off as soon as it passes it, so no client can make the
 * server hold a large body in memory. Capture uploads stream through their own reader with their own limit.
 */
import 'server-only';
import { HttpError } from './http';

/** JSON bodies: forms, settings, report text. */
export const JSON_BODY_LIMIT = 64 * 1024;

/** The body's bytes, or a 413 once it passes `limit`. */
export async function readLimited(req: Request, limit = JSON_BODY_LIMIT): Promise<Uint8Array> {
  const tooLarge = () => new HttpError(413, 'TOO_LARGE', `The request body is larger than ${Math.round(limit / 1024)} KB; send less.`);
  const declared = Number(req.headers.get('content-length'));
  if (declared > limit) throw tooLarge();
  if (!req.body) return new Uint8Array(0);
  const reader = req.body.getReader();
  const parts: Uint8Array[] = [];
  let size = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    size += value.length;
    if (size > limit) {
      await reader.cancel().catch(() => {});
      throw tooLarge();
    }
    parts.push(value);
  }
  const out = new Uint8Array(size);
  let o = 0;
  for (const p of parts) {
    out.set(p, o);
    o += p.length;
  }
  return out;
}

/** A NUL character anywhere in the input's text: databases refuse it, and no form needs it. */
export function findNul(value: unknown, path = ''): string | null {
  if (typeof value === 'string') return value.includes('\u0000') ? path || 'text' : null;
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      const hit = findNul(value[i], `${path}[${i}]`);
      if (hit) return hit;
    }
    return null;
  }
  if (value && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) {
      const hit = findNul(v, path ? `${path}.${k}` : k);
      if (hit) return hit;
    }
  }
  return null;
}
