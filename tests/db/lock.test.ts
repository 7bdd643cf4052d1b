/**
 * The data-directory lock (Linux /proc/PID/stat, proc(5): state is field 3, start time field 22): a live holder
 * refuses, a PID now used by a process that started at another time does not, nor does a gone one.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { acquireLock, DataDirLockedError } from '@/db/lock';

const onLinux = (() => {
  try {
    readFileSync('/proc/self/stat');
    return true;
  } catch {
    return false;
  }
})();

function startOf(pid: number): string {
  const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
  return stat.slice(stat.lastIndexOf(')') + 2).split(' ')[19];
}

describe.runIf(onLinux)('data-directory lock', () => {
  it('refuses while the recorded holder runs, with its PID', () => {
    const dir = mkdtempSync(join(tmpdir(), 'cp-lock-'));
    const path = join(dir, 'pglite.lock');
    writeFileSync(path, `${process.ppid} ${startOf(process.ppid)}`);
    expect(() => acquireLock(path, dir)).toThrow(DataDirLockedError);
    expect(() => acquireLock(path, dir)).toThrow(`in use by process ${process.ppid}`);
  });

  it('takes over a lock whose PID now belongs to a process that started at another time', () => {
    const dir = mkdtempSync(join(tmpdir(), 'cp-lock-'));
    const path = join(dir, 'pglite.lock');
    writeFileSync(path, `${process.ppid} 1`);
    const release = acquireLock(path, dir);
    expect(readFileSync(path, 'utf8').split(' ')[0]).toBe(String(process.pid));
    release();
  });

  it('takes over a lock whose holder is gone', () => {
    const dir = mkdtempSync(join(tmpdir(), 'cp-lock-'));
    const path = join(dir, 'pglite.lock');
    writeFileSync(path, '2147483646');
    const release = acquireLock(path, dir);
    release();
  });
});
