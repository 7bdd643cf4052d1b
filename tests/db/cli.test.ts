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

describe('progress on long work', () => {
  // util-linux's `script` runs the command on a pseudo-terminal, as a person at a terminal would.
  // Run from the project (the migrations live there) on a data directory of the test's own.
  const env = (dir: string) => ({ ...process.env, CRANKPRINT_DATA_DIR: join(dir, 'data') });
  const onTerminal = (command: string, dir: string) => spawnSync('script', ['-qec', command, '/dev/null'], { cwd: root, encoding: 'utf8', env: env(dir) });

  it('db:check shows a progress line on a terminal and nothing extra when piped', () => {
    const cwd = mkdtempSync(join(tmpdir(), 'cp-progress-'));
    const piped = spawnSync(join(root, 'node_modules', '.bin', 'tsx'), [join(root, 'scripts', 'db-check.ts')], { cwd: root, encoding: 'utf8', env: env(cwd) });
    expect(piped.status).toBe(0);
    expect(piped.stderr).toBe('');
    expect(piped.stdout).not.toContain('\r');
    const tty = onTerminal(`${join(root, 'node_modules', '.bin', 'tsx')} ${join(root, 'scripts', 'db-check.ts')}`, cwd);
    expect(tty.status).toBe(0);
    expect(tty.stdout).toContain('Checking captures: opening the database');
    expect(tty.stdout).toMatch(/All \d+ captures are whole/);
  });

  it('the analysis command line shows its step on a terminal only', () => {
    const cwd = mkdtempSync(join(tmpdir(), 'cp-progress-'));
    const sample = join(root, 'samples', 'i4-burnt-valve-current-sync.csv');
    const args = `${sample} --cylinders 4 --firing-order 1-3-4-2`;
    const tty = onTerminal(`${join(root, 'node_modules', '.bin', 'tsx')} ${join(root, 'scripts', 'analyze.ts')} ${args}`, cwd);
    expect(tty.stdout).toMatch(/analysing \d+\.\d MB/);
    const piped = spawnSync(join(root, 'node_modules', '.bin', 'tsx'), [join(root, 'scripts', 'analyze.ts'), ...args.split(' ')], { cwd: root, encoding: 'utf8', env: env(cwd) });
    expect(piped.status).toBe(0);
    expect(piped.stderr).not.toContain('analysing');
  });
});
