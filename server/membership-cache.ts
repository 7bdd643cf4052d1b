/**
 * A few seconds' memory of who is a member of which shop with which role, so a busy page or integration does
 * not ask the database on every request (bench:load). Every change made through this process forgets it at
 * once; another instance on the same PostgreSQL server sees a role change or removal within TTL_MS.
 */
import 'server-only';

export const TTL_MS = 5_000;
const MAX_ENTRIES = 10_000;

interface Entry<T> {
  value: T;
  until: number;
}
const g = globalThis as unknown as { __crankprintMemberships?: Map<string, Entry<unknown>> };
const entries = (g.__crankprintMemberships ??= new Map());

/** The remembered value for `key`, or what `load` finds (remembered for TTL_MS; a failure is not). */
export async function rememberMembership<T>(key: string, load: () => Promise<T>): Promise<T> {
  const now = Date.now();
  const hit = entries.get(key);
  if (hit && hit.until > now) return hit.value as T;
  const value = await load();
  if (entries.size >= MAX_ENTRIES) entries.clear();
  entries.set(key, { value, until: now + TTL_MS });
  return value;
}

/** Forgets every membership: called after any change to members, roles, shops or invitations. */
export function forgetMemberships(): void {
  entries.clear();
}
