/**
 * At server start (Next.js calls this once per server process): the Node.js server checks that it can open the
 * embedded database, so a second server on the same data directory stops at once (server/start-check.ts).
 */
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME === 'nodejs') await (await import('./server/start-check')).checkStart();
}
