// npm run db:backup and db:restore round-trip the embedded database (row counts and a capture's bytes).
import { spawnSync } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { sql } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { joinStoredPieces, readStoredPieces } from '@/db/capture-store';
import { openDatabase } from '@/db/client';
import { captures } from '@/db/schema';
import { seedDemoIfEmpty } from '@/db/seed';
import { createDatabase } from '../../scripts/pg-server.mjs';

const counts = async (at: string) => {
  const d = await openDatabase(at.startsWith('postgres') ? { url: at } : { dataDir: at });
  const [{ n }] = await d.db.select({ n: sql<number>`(select count(*) from jobs) + (select count(*) from analyses) + (select count(*) from capture_chunks)` }).from(sql`(select 1) as one`);
  const [c] = await d.db.select().from(captures).limit(1);
  const bytes = joinStoredPieces(await readStoredPieces(d.db, c));
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

  // With DATABASE_URL the same commands are pg_dump and pg_restore (the PostgreSQL pass of `npm test`).
  it.runIf(!!process.env.CRANKPRINT_TEST_PG_URL)('round-trip a PostgreSQL database with pg_dump and pg_restore', async () => {
    const src = await createDatabase(process.env.CRANKPRINT_TEST_PG_URL!, 'backup_src');
    const dst = await createDatabase(process.env.CRANKPRINT_TEST_PG_URL!, 'backup_dst');
    const d = await openDatabase({ url: src });
    await seedDemoIfEmpty(d.db);
    await d.close();
    const before = await counts(src);
    const file = join(tmpdir(), `crankprint-${Date.now()}.dump`);
    const b = spawnSync('npx', ['tsx', 'scripts/db-backup.ts', file], { env: { ...process.env, DATABASE_URL: src }, encoding: 'utf8' });
    expect(b.status, b.stderr).toBe(0);
    const r = spawnSync('npx', ['tsx', 'scripts/db-restore.ts', file], { env: { ...process.env, DATABASE_URL: dst }, encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    expect(await counts(dst)).toEqual(before);
  }, 120_000);
});
