/**
 * A signed revision's snapshot: the whole bundle the PDF and the customer page render (job, vehicle, shop name and
 * settings, each included analysis with its result, settings and trace excerpt, the signer), as text written once
 * at signing with its SHA-256. Dates are kept as `{"$date": ISO}` so the bundle reads back exactly as it was.
 */
import { createHash } from 'node:crypto';

export function writeSnapshot(value: unknown): { text: string; sha256: string } {
  const text = JSON.stringify(value, function (this: Record<string, unknown>, key, v) {
    const raw = this[key];
    return raw instanceof Date ? { $date: raw.toISOString() } : v;
  });
  return { text, sha256: createHash('sha256').update(text).digest('hex') };
}

export function readSnapshot<T>(text: string): T {
  return JSON.parse(text, (_key, v) => (v && typeof v === 'object' && typeof v.$date === 'string' && Object.keys(v).length === 1 ? new Date(v.$date) : v)) as T;
}

/** Whether a stored snapshot is still the text that was signed. */
export function snapshotIntact(text: string, sha256: string | null): boolean {
  return !!sha256 && createHash('sha256').update(text).digest('hex') === sha256;
}
