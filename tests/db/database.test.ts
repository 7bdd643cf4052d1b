/**
 * The schema and migrations on a fresh in-memory PGlite and on a real PostgreSQL 15 server (started here in a
 * temporary folder), with the same checks; plus the data-directory lock.
 */
import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { and, eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { joinStoredPieces, readStoredPieces } from '@/db/capture-store';
import { compressPiece, insertChunks } from '@/db/chunks';
import { type Database, openDatabase } from '@/db/client';
import { DataDirLockedError } from '@/db/lock';
import { captureChunks, captures, jobs, members, organizations, users, vehicles } from '@/db/schema';
import { seedDemoIfEmpty } from '@/db/seed';
import { createDatabase, startPgServer, type PgServer } from '../../scripts/pg-server.mjs';

const TABLES = ['users', 'sessions', 'accounts', 'verifications', 'shops', 'members', 'invitations', 'vehicles', 'jobs', 'captures', 'capture_chunks', 'analyses', 'reports', 'engine_profiles', 'audit_events'];

function suite(name: string, open: () => Promise<Database>) {
  describe(name, () => {
    let d: Database;
    beforeAll(async () => {
      d = await open();
    }, 60_000);
    afterAll(async () => {
      await d?.close();
    });

    it('migrations create every table', async () => {
      const rows = await d.db.execute<{ table_name: string }>(sql`select table_name from information_schema.tables where table_schema = 'public'`);
      const names = (rows as unknown as { rows: { table_name: string }[] }).rows.map((r) => r.table_name);
      for (const t of TABLES) expect(names).toContain(t);
    });

    it('seeds the demo shop once, with one member per role', async () => {
      expect(await seedDemoIfEmpty(d.db)).toBe(true);
      expect(await seedDemoIfEmpty(d.db)).toBe(false);
      const roles = await d.db.select({ role: members.role }).from(members);
      expect(roles.map((r) => r.role).sort()).toEqual(['advisor', 'owner', 'technician']);
      const [{ count }] = await d.db.select({ count: sql<number>`count(*)::int` }).from(jobs);
      // Five current jobs, and six earlier visits of the hatchback (its engine's baseline).
      expect(count).toBe(11);
    });

    it('a repair-order number is unique within a shop', async () => {
      const [shop] = await d.db.select().from(organizations).limit(1);
      const [v] = await d.db.select().from(vehicles).where(eq(vehicles.shopId, shop.id)).limit(1);
      const [j] = await d.db.select().from(jobs).where(eq(jobs.shopId, shop.id)).limit(1);
      await expect(d.db.insert(jobs).values({ shopId: shop.id, vehicleId: v.id, repairOrder: j.repairOrder, concern: 'again' })).rejects.toThrow();
    });

    it('stores capture bytes in chunk rows and a failed transaction leaves nothing', async () => {
      const [j] = await d.db.select().from(jobs).limit(1);
      const [u] = await d.db.select().from(users).limit(1);
      const bytes = Uint8Array.from({ length: 5000 }, (_, i) => (i * 31) % 256);
      const id = crypto.randomUUID();
      await d.db.transaction(async (tx) => {
        await tx.insert(captures).values({ id, shopId: j.shopId, jobId: j.id, fileName: 'a.csv', contentType: 'text/csv', sizeBytes: 5000, sha256: 'x', chunkCount: 2, uploadedBy: u.id });
        await insertChunks(tx, id, [compressPiece(bytes.subarray(0, 2500)), compressPiece(bytes.subarray(2500))]);
      });
      expect(joinStoredPieces(await readStoredPieces(d.db, { id, sizeBytes: bytes.length, storageUrl: null }))).toEqual(bytes);
      const stored = await d.db.select().from(captureChunks).where(eq(captureChunks.captureId, id));
      expect(stored).toHaveLength(2);
      const failedId = crypto.randomUUID();
      await expect(
        d.db.transaction(async (tx) => {
          await tx.insert(captures).values({ id: failedId, shopId: j.shopId, jobId: j.id, fileName: 'b.csv', contentType: 'text/csv', sizeBytes: 1, sha256: 'y', chunkCount: 1 });
          throw new Error('upload cancelled');
        }),
      ).rejects.toThrow('upload cancelled');
      expect(await d.db.select().from(captures).where(and(eq(captures.id, failedId)))).toHaveLength(0);
    });
  });
}

suite('embedded PGlite (in memory)', () => openDatabase({ dataDir: 'memory' }));

// In the PostgreSQL pass of `npm test` the test server is given; otherwise one is started here.
const given = process.env.CRANKPRINT_TEST_PG_URL;
let server: PgServer | null = null;
const pgAvailable = (() => {
  if (given) return true;
  try {
    server = startPgServer();
  } catch (e) {
    console.warn(`NOTICE: could not start PostgreSQL for the server-path tests: ${(e as Error).message}`);
  }
  if (!server) console.warn('NOTICE: PostgreSQL server programs not found; the PostgreSQL 15 database tests are skipped.');
  return !!server;
})();
afterAll(() => server?.stop());

if (pgAvailable) suite('PostgreSQL server (DATABASE_URL path)', async () => openDatabase({ url: await createDatabase(given ?? server!.url) }));
else describe.skip('PostgreSQL server (DATABASE_URL path) — skipped: no server programs', () => it('skipped', () => {}));

describe('the data-directory lock (STACK.md: PGlite takes no lock of its own)', () => {
  it('refuses a second process with the PID that holds the directory, and is released on close', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'crankprint-lock-'));
    const holder = spawn(process.execPath, ['--import', 'tsx', 'tests/support/hold-db.ts', dir], { stdio: ['pipe', 'pipe', 'inherit'] });
    await new Promise<void>((resolve, reject) => {
      holder.stdout.on('data', (b: Buffer) => b.toString().includes('ready') && resolve());
      holder.on('exit', (c) => reject(new Error(`holder exited ${c}`)));
    });
    try {
      await openDatabase({ dataDir: dir });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(DataDirLockedError);
      expect((e as DataDirLockedError).pid).toBe(holder.pid);
      expect((e as Error).message).toContain(String(holder.pid));
    }
    holder.stdin.end();
    await new Promise((r) => holder.on('exit', r));
    const d = await openDatabase({ dataDir: dir });
    await d.close();
    rmSync(dir, { recursive: true, force: true });
  }, 60_000);
});
