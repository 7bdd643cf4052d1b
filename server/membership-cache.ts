/**
 * A few seconds' memory of who is a member of which shop with which role (and the shop's settings), so a busy
 * page or integration does not ask the database on every request (bench:load). A change is announced to every
 * instance on the database (db/changes.ts: LISTEN/NOTIFY on a server), and each forgets at once; TTL_MS bounds
 * what an instance remembers should a notice be lost while its listening connection is down.
 */
import 'server-only';
import { getDatabase } from '@/db/client';
import { onChange } from '@/db/changes';
import { processShared } from '@/db/process-state.mjs';

export const TTL_MS = 5_000;
const MAX_ENTRIES = 10_000;

interface Entry<T> {
  value: T;
  until: number;
}
interface Cache {
  entries: Map<string, Entry<unknown>>;
  /** Counts the changes heard: a value read across one is not remembered. */
  generation: number;
  listening: boolean;
}
// Once per process (db/process-state.mjs): every route bundle shares one cache and registers one listener.
const g = processShared<{ memberships?: Cache }>('memberships', () => ({}));
const cache: Cache = (g.memberships ??= { entries: new Map(), generation: 0, listening: false });

/** The remembered value for `key`, or what `load` finds (remembered for TTL_MS; a failure is not). */
export async function rememberMembership<T>(key: string, load: () => Promise<T>): Promise<T> {
  const now = Date.now();
  const hit = cache.entries.get(key);
  if (hit && hit.until > now) return hit.value as T;
  const generation = cache.generation;
  const value = await load();
  // A change heard while this was being read may have come after the read: use it once, do not remember it.
  if (generation !== cache.generation) return value;
  if (cache.entries.size >= MAX_ENTRIES) cache.entries.clear();
  cache.entries.set(key, { value, until: now + TTL_MS });
  return value;
}

/** Forgets every membership in this process. */
function forgetMemberships(): void {
  cache.generation++;
  cache.entries.clear();
}

if (!cache.listening) {
  cache.listening = true;
  onChange((topic) => topic === 'membership' && forgetMemberships());
}

/**
 * After any change to members, roles, shops, their settings or invitations: every instance forgets its
 * memberships (this one before the call returns, the others as the notice reaches them).
 */
export async function announceMembershipChange(): Promise<void> {
  // The database's announce tells this process's listeners first (so this one forgets before the call returns).
  await (await getDatabase()).announce('membership');
}
