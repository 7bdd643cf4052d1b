/**
 * A PID lock on the embedded database's data directory: PGlite takes no lock of its own, and two processes
 * on one directory lose data. Refused while the holder lives; taken over when it is gone.
 */
import { closeSync, openSync, readFileSync, unlinkSync, writeSync } from 'node:fs';

export class DataDirLockedError extends Error {
  readonly pid: number;
  constructor(dir: string, pid: number) {
    super(`The database in ${dir} is in use by process ${pid}; stop that process first (only one process may open the embedded database), or set DATABASE_URL to use a PostgreSQL server.`);
    this.name = 'DataDirLockedError';
    this.pid = pid;
  }
}

function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    return (e as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/** Takes the lock file at `path` for this process; returns a release function. */
export function acquireLock(path: string, dir: string): () => void {
  for (let attempt = 0; attempt < 3; attempt++) {
    try {
      const fd = openSync(/*turbopackIgnore: true*/ path, 'wx');
      writeSync(fd, String(process.pid));
      closeSync(fd);
      return () => {
        try {
          if (readFileSync(path, 'utf8').trim() === String(process.pid)) unlinkSync(path);
        } catch {
          // already gone
        }
      };
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code !== 'EEXIST') throw e;
      const pid = Number(readFileSync(path, 'utf8').trim());
      if (pid === process.pid) return () => {};
      if (Number.isInteger(pid) && pid > 0 && alive(pid)) throw new DataDirLockedError(dir, pid);
      // The holder is gone: take the stale lock over.
      try {
        unlinkSync(path);
      } catch {
        // another process took it first; try again
      }
    }
  }
  throw new Error(`Could not take the database lock at ${path}.`);
}
