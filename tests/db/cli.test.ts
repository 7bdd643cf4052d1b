/**
 * The database scripts' command lines: --help prints the usage and exits 0, an unknown option or a stray argument
 * exits 2 with one sentence, and no file is ever written under an option's name (a backup once was).
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';

const root = resolve('.');
const run = (script: string, args: string[], cwd: string) =>
  spawnSync(join(root, 'node_modules', '.bin', 'tsx'), [join(root, 'scripts', script), ...args], { cwd, encoding: 'utf8', env: { ...process.env, CRANKPRINT_DATA_DIR: join(cwd, 'data') } });

describe('database scripts', () => {
  it.each(['db-backup.ts', 'db-restore.ts', 'db-check.ts'])('%s: --help, unknown options and stray arguments', (script) => {
    const cwd = mkdtempSync(join(tmpdir(), 'cp-cli-'));
    const help = run(script, ['--help'], cwd);
    expect(help.status).toBe(0);
    expect(help.stdout).toMatch(/^Usage: npm run db:/);
    expect(existsSync(join(cwd, '--help'))).toBe(false);
    const unknown = run(script, ['--nope'], cwd);
    expect(unknown.status).toBe(2);
    expect(unknown.stderr.trim().split('\n')).toHaveLength(1);
    const stray = run(script, ['a', 'b'], cwd);
    expect(stray.status).toBe(2);
  });
});
