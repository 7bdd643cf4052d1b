/**
 * A throwaway PostgreSQL server for tests: Debian's postgresql server programs, a cluster in a temporary folder
 * owned by the postgres user (the server refuses to run as root), on a loopback port with its own socket
 * folder. Used by `npm test` for its PostgreSQL pass and by the database tests; `createDatabase` gives each
 * test file or server a fresh database on it.
 */
import { execFileSync } from 'node:child_process';
import { chownSync, existsSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pg from 'pg';

/** The newest installed server's bin folder, or null. */
export function findPgBin() {
  const root = '/usr/lib/postgresql';
  if (!existsSync(root)) return null;
  for (const v of readdirSync(root).sort().reverse()) {
    const bin = join(root, v, 'bin');
    if (existsSync(join(bin, 'initdb')) && existsSync(join(bin, 'pg_ctl'))) return bin;
  }
  return null;
}

/** Starts a server; null when the server programs are not installed. */
export function startPgServer(port = 54_000 + Math.floor(Math.random() * 1000)) {
  const bin = findPgBin();
  if (!bin) return null;
  const dir = mkdtempSync(join(tmpdir(), 'crankprint-pg-'));
  const asRoot = process.getuid?.() === 0;
  if (asRoot) {
    const uid = Number(execFileSync('id', ['-u', 'postgres']).toString().trim());
    const gid = Number(execFileSync('id', ['-g', 'postgres']).toString().trim());
    chownSync(dir, uid, gid);
  }
  const run = (cmd, args) =>
    asRoot ? execFileSync('runuser', ['-u', 'postgres', '--', join(bin, cmd), ...args], { stdio: 'pipe' }) : execFileSync(join(bin, cmd), args, { stdio: 'pipe' });
  const data = join(dir, 'data');
  run('initdb', ['-D', data, '-A', 'trust', '-U', 'postgres', '--no-sync']);
  run('pg_ctl', ['-D', data, '-l', join(dir, 'log'), '-w', '-o', `-p ${port} -k ${dir} -c listen_addresses=127.0.0.1 -c fsync=off -c max_connections=300`, 'start']);
  return {
    url: `postgres://postgres@127.0.0.1:${port}/postgres`,
    version: execFileSync(join(bin, 'postgres'), ['--version']).toString().trim(),
    stop() {
      try {
        run('pg_ctl', ['-D', data, '-m', 'fast', '-w', 'stop']);
      } finally {
        rmSync(dir, { recursive: true, force: true });
      }
    },
  };
}

/** Creates an empty database named `prefix_…` on the server at `serverUrl`; returns its URL. */
export async function createDatabase(serverUrl, prefix = 'crankprint') {
  const name = `${prefix}_${Date.now().toString(36)}_${Math.random().toString(36).slice(2, 8)}`.replace(/[^a-z0-9_]/g, '_');
  const client = new pg.Client({ connectionString: serverUrl });
  await client.connect();
  try {
    await client.query(`create database ${name}`);
  } finally {
    await client.end();
  }
  const url = new URL(serverUrl);
  url.pathname = `/${name}`;
  return url.toString();
}
