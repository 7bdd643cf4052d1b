/**
 * At server start (Next.js calls this once per server process): open the embedded database now, so a second
 * server on the same data directory stops at once with one sentence naming the process that holds it, instead
 * of listening and failing every request.
 */
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME !== 'nodejs' || process.env.DATABASE_URL) return;
  const { getDatabase } = await import('./db/client');
  const { DataDirLockedError } = await import('./db/lock');
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
