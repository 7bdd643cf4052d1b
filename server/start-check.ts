/**
 * Run once at server start (Node.js only): open the embedded database now, so a second server on the same data
 * directory stops with one sentence naming the process that holds it, instead of listening and failing every
 * request.
 */
import { getDatabase } from '@/db/client';
import { DataDirLockedError } from '@/db/lock';

export async function checkStart(): Promise<void> {
  if (process.env.DATABASE_URL) return;
  try {
    await getDatabase();
  } catch (e) {
    if (e instanceof DataDirLockedError) {
      process.stderr.write(`Crankprint cannot start: ${e.message}\n`);
      process.exit(1);
    }
    throw e;
  }
}
