/**
 * Changes every instance must hear at once (who is a member where, with which role, and the shop's settings, which
 * instances keep for a few seconds). On a PostgreSQL server they travel by LISTEN/NOTIFY on one channel, each
 * instance holding one listening connection; the embedded database serves one process, so there they are heard
 * in-process only.
 */
import pg from 'pg';
import { processShared } from './process-state.mjs';

export const CHANGES_CHANNEL = 'crankprint_changes';
export type ChangeTopic = 'membership';

type Listener = (topic: ChangeTopic) => void;
const g = processShared<{ changeListeners?: Set<Listener> }>('changes', () => ({}));
const listeners = (g.changeListeners ??= new Set());

/** Calls `fn` for every change heard, from this instance or another. */
export function onChange(fn: Listener): () => void {
  listeners.add(fn);
  return () => listeners.delete(fn);
}

/** Tells this process's listeners. */
export function heard(topic: ChangeTopic): void {
  for (const fn of listeners) fn(topic);
}

/**
 * Holds a listening connection to the server at `url` and passes every notice on to {@link heard}. A dropped
 * connection is opened again (after a second, then up to 10 s); when it drops and when it is back every cache
 * is dropped, since notices sent meanwhile were lost (while it is down, a cache's own time limit is the bound).
 * A first connection that fails does not stop the instance starting: it is tried again the same way. Returns a
 * function that stops listening.
 */
export async function listenForChanges(url: string, onError: (e: unknown) => void = () => {}): Promise<() => Promise<void>> {
  let client: pg.Client | null = null;
  let stopped = false;
  let wait = 1_000;
  let retry: ReturnType<typeof setTimeout> | null = null;
  const connect = async (): Promise<void> => {
    const c = new pg.Client({ connectionString: url });
    c.on('notification', (n) => {
      if (n.channel === CHANGES_CHANNEL && n.payload === 'membership') heard('membership');
    });
    c.on('error', (e) => {
      onError(e);
      lost(c);
    });
    c.on('end', () => lost(c));
    await c.connect();
    await c.query(`listen ${CHANGES_CHANNEL}`);
    if (stopped) return void (await c.end().catch(() => {}));
    client = c;
    wait = 1_000;
    heard('membership');
  };
  const lost = (c: pg.Client) => {
    if (client !== c || stopped) return;
    client = null;
    heard('membership');
    again();
  };
  const again = () => {
    retry = setTimeout(() => {
      retry = null;
      connect().catch((e) => {
        onError(e);
        wait = Math.min(10_000, wait * 2);
        if (!stopped) again();
      });
    }, wait);
    retry.unref?.();
  };
  await connect().catch((e) => {
    onError(e);
    again();
  });
  return async () => {
    stopped = true;
    if (retry) clearTimeout(retry);
    const c = client;
    client = null;
    await c?.end().catch(() => {});
  };
}
