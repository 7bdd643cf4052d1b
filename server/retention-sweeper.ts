/**
 * The daily retention sweep (db/queries/retention.ts), asked for by every instance a minute after start and then
 * every hour; the sweep itself runs once a day across the fleet (an advisory lock and its last run's time).
 */
import { sweepRetention } from '@/db/queries/retention';
import { log, safeError } from './log';
import { processShared } from '@/db/process-state.mjs';

const ASK_EVERY_MS = 60 * 60_000;
const g = processShared<{ retention?: NodeJS.Timeout }>('retentionSweeper', () => ({}));

export function startRetentionSweeper(): void {
  if (g.retention) return;
  const run = () =>
    void sweepRetention().then(
      (r) => r.ran && log.info({ shops: r.shops, objectsLeft: r.objectsLeft }, 'retention sweep'),
      (e: unknown) => log.warn({ err: safeError(e) }, 'retention sweep failed'),
    );
  setTimeout(run, 60_000).unref();
  g.retention = setInterval(run, ASK_EVERY_MS).unref();
}
