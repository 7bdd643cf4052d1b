// The server process's lifecycle, one module for the HTTP server (server/serve.mjs) and the app's handlers alike:
// stopping (SIGTERM or SIGINT arrived: new work answers 503), the cut-off (work still running gives up with a 503)
// and closing the database once the requests under way have finished.
import { processShared } from '../db/process-state.mjs';

const life = () => processShared('lifecycle', () => ({ stopping: false, cutOff: false }));

/** True once SIGTERM or SIGINT has arrived: handlers answer 503 rather than start work. */
export function shuttingDown() {
  return life().stopping;
}

/** True when the server is about to close the database: work still running (a long upload) gives up with a 503. */
export function pastCutOff() {
  return life().cutOff;
}

/** The server begins to stop. */
export function beginStopping() {
  life().stopping = true;
}

/** The server tells work still running to give up. */
export function cutOffWork() {
  life().cutOff = true;
}

/** Closes the process's database, if one was opened (db/client.ts keeps it under 'database'). */
export async function closeDatabase() {
  const holder = processShared('database', () => ({}));
  const d = await holder.ready?.catch(() => null);
  await d?.close();
}
