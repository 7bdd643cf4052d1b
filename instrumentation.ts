/**
 * At server start (Next.js calls this once per server process): the Node.js server checks that it can open the
 * embedded database, so a second server on the same data directory stops at once (server/start-check.ts), and
 * starts the sweep of objects left to remove (server/object-sweeper.ts) and the daily retention sweep
 * (server/retention-sweeper.ts).
 * Errors thrown while rendering a page are logged with their stack, the request id and Next.js's digest (the
 * reference the error page shows).
 */
import type { Instrumentation } from 'next';

export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME !== 'nodejs') return;
  await (await import('./server/start-check')).checkStart();
  // Objects whose rows were removed while object storage was down are removed once it answers again.
  (await import('./server/object-sweeper')).startObjectSweeper();
  // Captures of jobs done for longer than their shop keeps them go once a day.
  (await import('./server/retention-sweeper')).startRetentionSweeper();
}

export const onRequestError: Instrumentation.onRequestError = async (error, request, context) => {
  if (process.env.NEXT_RUNTIME !== 'nodejs') return;
  const { log, safeError } = await import('./server/log');
  const headers = request.headers as Record<string, string | string[] | undefined>;
  log.error(
    { err: safeError(error), requestId: headers['x-request-id'], digest: (error as { digest?: string }).digest, route: context.routePath, routeType: context.routeType, method: request.method },
    'error while rendering',
  );
};
