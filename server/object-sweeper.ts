/**
 * Retries the removal of queued objects (db/queries/object-deletes.ts): once shortly after start, then every few
 * minutes, in the server process only. Several instances may sweep at once: removing a removed object is no error.
 */
import { flushObjectDeletes, pendingObjectDeleteCount } from '@/db/queries/object-deletes';
import { log, safeError } from './log';
import { processShared } from '@/db/process-state.mjs';

const EVERY_MS = 5 * 60_000;
const g = processShared<{ sweeper?: NodeJS.Timeout }>('objectSweeper', () => ({}));

/** Sweeps until the queue is empty or storage fails; returns how many objects were removed. */
export async function sweepObjectDeletes(): Promise<number> {
  let total = 0;
  for (;;) {
    const { removed, left } = await flushObjectDeletes();
    total += removed;
    if (removed === 0 || left > 0) break;
  }
  const waiting = await pendingObjectDeleteCount();
  if (total || waiting) log.info({ removed: total, waiting }, 'object storage sweep');
  return total;
}

export function startObjectSweeper(): void {
  if (g.sweeper) return;
  const run = () => void sweepObjectDeletes().catch((e: unknown) => log.warn({ err: safeError(e) }, 'object storage sweep failed'));
  setTimeout(run, 5_000).unref();
  g.sweeper = setInterval(run, EVERY_MS).unref();
}
