/**
 * Run once at server start (Node.js only):
 *  - open the embedded database now, so a second server on the same data directory stops with one sentence naming
 *    the process that holds it, instead of listening and failing every request;
 *  - in production, start the engine's threads and ask the bundle which engine it is, so a server built without
 *    the engine step (or with an older one) stops with a sentence saying what to run, instead of failing uploads.
 */
import { getDatabase } from '@/db/client';
import { DataDirLockedError } from '@/db/lock';
import { HttpError } from './http';
import { checkEngine } from './engine/pool';

function stop(sentence: string): never {
  process.stderr.write(`Crankprint cannot start: ${sentence}\n`);
  process.exit(1);
}

export async function checkStart(): Promise<void> {
  if (process.env.NODE_ENV === 'production') {
    await checkEngine().catch((e: unknown) => {
      if (!(e instanceof HttpError)) throw e;
      if (e.code === 'ENGINE_MISSING') stop('the analysis engine is not built (.engine/thread.mjs is missing): run npm run build, then start the server again.');
      if (/npm run build/.test(e.message)) stop(e.message.replace(/ If it keeps happening.*$/, ''));
      stop('the analysis engine could not start (the log line above says why): run npm run build, then start the server again.');
    });
  }
  if (process.env.DATABASE_URL) return;
  try {
    await getDatabase();
  } catch (e) {
    if (e instanceof DataDirLockedError) stop(e.message);
    throw e;
  }
}
