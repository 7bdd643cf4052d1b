/**
 * A throwaway PostgreSQL server for tests: Debian's postgresql server programs, a cluster in a temporary folder
 * owned by the postgres user (the server refuses to run as root), on a loopback port with its own socket folder.
 */
import { execFileSync } from 'node:child_process';
import { chownSync, existsSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export interface PgServer {
  url: string;
  stop(): void;
}

export function findPgBin(): string | null {
  const root = '/usr/lib/postgresql';
  if (!existsSync(root)) return null;
  for (const v of readdirSync(root).sort().reverse()) {
    const bin = join(root, v, 'bin');
    if (existsSync(join(bin, 'initdb')) && existsSync(join(bin, 'pg_ctl'))) return bin;
  }
  return null;
}

export function startPgServer(port = 54_000 + Math.floor(Math.random() * 1000)): PgServer | null {
  const bin = findPgBin();
  if (!bin) return null;
  const dir = mkdtempSync(join(tmpdir(), 'crankprint-pg-'));
  const asRoot = process.getuid?.() === 0;
  let uid = 0;
  let gid = 0;
  if (asRoot) {
    uid = Number(execFileSync('id', ['-u', 'postgres']).toString().trim());
    gid = Number(execFileSync('id', ['-g', 'postgres']).toString().trim());
    chownSync(dir, uid, gid);
  }
  const run = (cmd: string, args: string[]) =>
    asRoot ? execFileSync('runuser', ['-u', 'postgres', '--', join(bin, cmd), ...args], { stdio: 'pipe' }) : execFileSync(join(bin, cmd), args, { stdio: 'pipe' });
  const data = join(dir, 'data');
  run('initdb', ['-D', data, '-A', 'trust', '-U', 'postgres', '--no-sync']);
  run('pg_ctl', ['-D', data, '-l', join(dir, 'log'), '-w', '-o', `-p ${port} -k ${dir} -c listen_addresses=127.0.0.1 -c fsync=off`, 'start']);
  return {
    url: `postgres://postgres@127.0.0.1:${port}/postgres`,
    stop() {
      try {
        run('pg_ctl', ['-D', data, '-m', 'fast', '-w', 'stop']);
      } finally {
        rmSync(dir, { recursive: true, force: true });
      }
    },
  };
}
