// npm run db:backup and db:restore round-trip the embedded database (row counts and a capture's bytes).
import { spawnSync } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { sql } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { readChunks } from '@/db/chunks';
import { openDatabase } from '@/db/client';
import { captures } from '@/db/schema';
import { seedDemoIfEmpty } from '@/db/seed';

const counts = async (dir: string) => {
  const d = await openDatabase({ dataDir: dir });
  const [{ n }] = await d.db.select({ n: sql<number>`(select count(*) from jobs) + (select count(*) from analyses) + (select count(*) from capture_chunks)` }).from(sql`(select 1) as one`);
  const [c] = await d.db.select().from(captures).limit(1);
  const bytes = await readChunks(d.db, c.id, c.sizeBytes);
  await d.close();
  return { n: Number(n), sha: c.sha256, size: bytes.length };
};

describe('db:backup and db:restore', () => {
  it('round-trip, and refuse to restore over a database', async () => {
    const src = mkdtempSync(join(tmpdir(), 'crankprint-src-'));
    const dst = mkdtempSync(join(tmpdir(), 'crankprint-dst-'));
    const file = join(tmpdir(), `crankprint-${Date.now()}.tar.gz`);
    const d = await openDatabase({ dataDir: src });
    await seedDemoIfEmpty(d.db);
    await d.close();
    const before = await counts(src);
    const env = { ...process.env, CRANKPRINT_DATA_DIR: src, DATABASE_URL: '' };
    const b = spawnSync('npx', ['tsx', 'scripts/db-backup.ts', file], { env, encoding: 'utf8' });
    expect(b.status, b.stderr).toBe(0);
    const r = spawnSync('npx', ['tsx', 'scripts/db-restore.ts', file], { env: { ...env, CRANKPRINT_DATA_DIR: dst }, encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    expect(await counts(dst)).toEqual(before);
    const again = spawnSync('npx', ['tsx', 'scripts/db-restore.ts', file], { env: { ...env, CRANKPRINT_DATA_DIR: dst }, encoding: 'utf8' });
    expect(again.status).toBe(2);
    expect(again.stderr).toMatch(/not empty/);
  }, 120_000);
});
