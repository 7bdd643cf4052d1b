/**
 * A PID lock on the embedded database's data directory: PGlite takes no lock of its own, and two processes
 * on one directory lose data. Refused while the holder lives; taken over when it is gone, a zombie, or its PID
 * now belongs to a process that started later (the lock records the holder's start time from /proc).
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

/** A process's start time from /proc (clock ticks since boot), or null where /proc is not there. */
function startTime(pid: number): string | null {
  try {
    const stat = readFileSync(/*turbopackIgnore: true*/ `/proc/${pid}/stat`, 'utf8');
    // Fields after the command name (which may hold spaces) start after the last ")".
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    if (fields[0] === 'Z' || fields[0] === 'X') return 'dead';
    return fields[19] ?? null;
  } catch {
    return null;
  }
}

/**
 * Whether the lock's holder still runs: the PID answers a signal, is not a zombie, and (where /proc tells)
 * started when the lock says, so a PID reused by another program does not hold the lock.
 */
function alive(pid: number, started: string | undefined): boolean {
  try {
    process.kill(pid, 0);
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code !== 'EPERM') return false;
  }
  const now = startTime(pid);
  if (now === 'dead') return false;
  return !(started && now && now !== started);
}

/** Takes the lock file at `path` for this process; returns a release function. */
export function acquireLock(path: string, dir: string): () => void {
  for (let attempt = 0; attempt < 3; attempt++) {
    try {
      const fd = openSync(/*turbopackIgnore: true*/ path, 'wx');
      writeSync(fd, `${process.pid} ${startTime(process.pid) ?? ''}`.trim());
      closeSync(fd);
      return () => {
        try {
          if (readFileSync(path, 'utf8').trim().split(' ')[0] === String(process.pid)) unlinkSync(path);
        } catch {
          // already gone
        }
      };
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code !== 'EEXIST') throw e;
      const [pidText, started] = readFileSync(path, 'utf8').trim().split(' ');
      const pid = Number(pidText);
      if (pid === process.pid) return () => {};
      if (Number.isInteger(pid) && pid > 0 && alive(pid, started)) throw new DataDirLockedError(dir, pid);
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
