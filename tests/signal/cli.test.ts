// The command-line contract of SIGNAL.md: the JSON shape, exit status 2 and one sentence for bad input.
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';

function analyze(...args: string[]) {
  const r = spawnSync('node', ['--import', 'tsx', 'scripts/analyze.ts', ...args], { encoding: 'utf8' });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

describe('npm run analyze', () => {
  it('prints the JSON contract', () => {
    const r = analyze('samples/i4-burnt-valve-current-sync.csv', '--cylinders', '4', '--firing-order', '1-3-4-2', '--json');
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out).toMatchObject({ engineVersion: expect.any(String), method: 'current', crankingRpm: expect.any(Number), identity: 'sync' });
    expect(out.cylinders).toHaveLength(4);
    for (const c of out.cylinders) {
      expect(c).toMatchObject({ cylinder: expect.any(Number), relativePercent: expect.any(Number), status: expect.stringMatching(/^(ok|low|uncertain)$/), events: expect.any(Number) });
    }
    expect(out.cylinders[2].status).toBe('low');
    expect(Array.isArray(out.warnings)).toBe(true);
  });

  it.each([
    [['samples/i4-healthy-current-sync.csv', '--cylinders', '4', '--firing-order', '1-3-4-4', '--json'], /exactly once/],
    [['samples/i4-healthy-current-sync.csv', '--cylinders', 'x', '--firing-order', '1-3-4-2', '--json'], /--cylinders/],
    [['samples/nope.csv', '--cylinders', '4', '--firing-order', '1-3-4-2', '--json'], /No file/],
    [['samples/malformed.csv', '--cylinders', '4', '--firing-order', '1-3-4-2', '--json'], /Line 7, column 2/],
    [['samples/i4-healthy-current-sync.csv', '--cylinders', '4', '--firing-order', '1-3-4-2', '--teeth', 'sixty', '--json'], /--teeth/],
    // The limits go through the workspace's own schema: the same ranges and sentences, named by their flag.
    [['samples/i4-healthy-current-sync.csv', '--cylinders', '4', '--firing-order', '1-3-4-2', '--low-limit', '100', '--json'], /^--low-limit: The low limit is a percentage below 100\.$/m],
    [['samples/i4-healthy-current-sync.csv', '--cylinders', '4', '--firing-order', '1-3-4-2', '--high-limit', 'ten', '--json'], /--high-limit must be a number/],
  ])('bad input %j exits 2 with one sentence', (args, message) => {
    const r = analyze(...(args as string[]));
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(message as RegExp);
    expect(JSON.parse(r.stdout).error.message).toMatch(message as RegExp);
  });
});
