/**
 * Captures in object storage (CAPTURE_STORE=s3://…) against a real S3-compatible server started here (s3rver):
 * upload (one request, and multipart for a large file), read back, the SHA-256 check of db:check, a failed
 * row write leaving no object, delete on job removal, and db:backup/db:restore putting a lost object back.
 * Byte checks use SHA-256 (FIPS 180-4, through node:crypto).
 */
import { execFile } from 'node:child_process';
import { createHash, randomBytes } from 'node:crypto';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { DeleteObjectCommand, ListObjectsV2Command, PutObjectCommand } from '@aws-sdk/client-s3';
import { and, eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { joinStoredPieces } from '@/db/capture-store';
import { type Db, getDatabase } from '@/db/client';
import { checkIntegrity } from '@/db/integrity';
import { captureStoreTarget, headObject, parseObjectUrl, s3 } from '@/db/object-store';
import { findOrphans, ORPHAN_MIN_AGE_MS, removeOrphans } from '@/db/orphans';
import { createCapture, DuplicateCaptureError, readCapturePacked, readCaptureStream } from '@/db/queries/captures';
import { deleteJob } from '@/db/queries/jobs';
import { auditEvents, captures, jobs } from '@/db/schema';
import { type LocalS3, startLocalS3 } from '../support/s3-server';
import { seededDemo } from '../support/seeded-db';

const FILE = 'samples/i4-noisy-current-sync.csv';
/** A command line, run without blocking this process (the S3 server the command talks to runs here). */
const run = (args: string[], env: NodeJS.ProcessEnv) =>
  new Promise<{ status: number; stdout: string; stderr: string }>((resolve) =>
    execFile('npx', ['tsx', ...args], { env, encoding: 'utf8' }, (e, stdout, stderr) => resolve({ status: e ? Number(e.code ?? 1) : 0, stdout, stderr })),
  );
const sha = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');
const split = (b: Uint8Array, size = 1 << 20) => Array.from({ length: Math.ceil(b.length / size) }, (_, i) => b.subarray(i * size, (i + 1) * size));

let store: LocalS3;
let db: Db;
let shopId: string;
let userId: string;
const dataDir = mkdtempSync(join(tmpdir(), 'crankprint-objects-'));

async function upload(jobId: string, bytes: Uint8Array) {
  const pieces = split(bytes);
  const row = await createCapture(shopId, { jobId, fileName: 'ü—"100%".csv', contentType: 'text/csv', sizeBytes: bytes.length, sha256: sha(bytes), pieces, chunks: [], uploadedBy: userId });
  if (!row) throw new Error('job not found');
  const [stored] = await db.select().from(captures).where(eq(captures.id, row.id));
  return stored;
}

async function objectCount(): Promise<number> {
  const r = await s3().send(new ListObjectsV2Command({ Bucket: store.bucket }));
  return r.KeyCount ?? 0;
}

async function newJob(ro: string): Promise<string> {
  const [any] = await db.select().from(jobs).where(eq(jobs.shopId, shopId)).limit(1);
  const [j] = await db.insert(jobs).values({ shopId, vehicleId: any.vehicleId, repairOrder: ro, concern: 'object storage check' }).returning({ id: jobs.id });
  return j.id;
}

beforeAll(async () => {
  store = await startLocalS3();
  Object.assign(process.env, store.env);
  ({ db, shopId, userId } = await seededDemo(dataDir));
}, 60_000);

afterAll(async () => {
  await store?.close();
});

describe('objects no capture references (an instance stopped between an object and its row)', () => {
  it('are listed once older than the minimum age, removed with an activity line, and every capture keeps its object', async () => {
    const jobId = await newJob('OBJ-ORPHAN');
    const kept = await upload(jobId, new TextEncoder().encode(`${readFileSync(FILE, 'utf8')}9.9999999,0,0\n`));
    const key = `captures/${shopId}/${crypto.randomUUID()}.txt`;
    await s3().send(new PutObjectCommand({ Bucket: store.bucket, Key: key, Body: 'time,current\n0,1\n' }));
    const target = captureStoreTarget()!;
    // Just written: an upload under way looks the same, so it is not listed yet.
    expect((await findOrphans(db, target)).map((o) => o.url)).not.toContain(`s3://${store.bucket}/${key}`);
    const found = await findOrphans(db, target, ORPHAN_MIN_AGE_MS, Date.now() + ORPHAN_MIN_AGE_MS + 60_000);
    expect(found.map((o) => o.url)).toContain(`s3://${store.bucket}/${key}`);
    expect(found.map((o) => o.url)).not.toContain(kept.storageUrl);
    await removeOrphans(db, target, found);
    expect(await headObject(`s3://${store.bucket}/${key}`)).toBeNull();
    expect(await headObject(kept.storageUrl!)).not.toBeNull();
    const [line] = await db.select().from(auditEvents).where(and(eq(auditEvents.shopId, shopId), eq(auditEvents.action, 'storage.remove-orphans')));
    expect((line.detail as { objects: string[] }).objects).toContain(`s3://${store.bucket}/${key}`);
    expect(await findOrphans(db, target, 0)).toEqual([]);
    // The tests below count the bucket's objects from empty.
    await deleteJob(shopId, jobId);
  });

  it('db:check --orphans on a bucket these credentials may not list names the permission to grant', async () => {
    const env = { ...process.env, ...store.env, AWS_ACCESS_KEY_ID: 'NOT-A-KEY-OF-THIS-BUCKET', DATABASE_URL: '', CRANKPRINT_DATA_DIR: mkdtempSync(join(tmpdir(), 'crankprint-orphans-')) };
    const r = await run(['scripts/db-check.ts', '--orphans'], env);
    expect(r.status, r.stderr).toBe(3);
    expect(r.stderr).toContain('s3:ListBucket');
    expect(r.stderr).toContain(store.bucket);
  }, 120_000);
});

describe('captures in object storage', () => {
  let jobId: string;
  let small: Awaited<ReturnType<typeof upload>>;
  const real = new Uint8Array(readFileSync(FILE));

  it('stores a capture as one object under the shop, with no chunk rows, and reads it back byte for byte', async () => {
    jobId = await newJob('OBJ-1');
    small = await upload(jobId, real);
    expect(small.storageUrl).toBe(`s3://${store.bucket}/captures/${shopId}/${small.id}.txt`);
    expect(small.chunkCount).toBe(0);
    const [{ n }] = await db.select({ n: sql<number>`count(*)::int` }).from(sql`capture_chunks`).where(sql`capture_id = ${small.id}`);
    expect(n).toBe(0);
    expect(await headObject(small.storageUrl!)).toEqual({ size: real.length, sha256: sha(real) });
    const stream = await readCaptureStream(shopId, small.id);
    expect(sha(new Uint8Array(await new Response(stream).arrayBuffer()))).toBe(sha(real));
    const packed = await readCapturePacked(shopId, small.id);
    expect(packed?.gzip).toBe(false);
    expect(sha(joinStoredPieces(packed!))).toBe(sha(real));
    // Another shop asking for it gets nothing.
    expect(await readCaptureStream('another-shop', small.id)).toBeNull();
  });

  it('sends a large file in parts and streams it back whole', async () => {
    const big = randomBytes(21 << 20);
    const row = await upload(jobId, big);
    const got = new Uint8Array(await new Response(await readCaptureStream(shopId, row.id)).arrayBuffer());
    expect(got.length).toBe(big.length);
    expect(sha(got)).toBe(sha(big));
  }, 120_000);

  it('refuses the same file twice on a job and leaves no second object behind', async () => {
    const before = await objectCount();
    await expect(upload(jobId, real)).rejects.toBeInstanceOf(DuplicateCaptureError);
    expect(await objectCount()).toBe(before);
  });

  it('db:check finds every object whole, then names a changed one and a missing one', async () => {
    const ok = await checkIntegrity(db);
    expect(ok.ok).toBe(true);
    expect(ok.captures.filter((c) => c.storageUrl).length).toBe(2);
    const victim = await upload(jobId, new TextEncoder().encode(new TextDecoder().decode(real).replace(/\n$/, '\n\n')));
    const { bucket, key } = parseObjectUrl(victim.storageUrl!);
    await s3().send(new PutObjectCommand({ Bucket: bucket, Key: key, Body: Buffer.from('Time (s),Current (A)\n0,1\n') }));
    const changed = await checkIntegrity(db);
    expect(changed.ok).toBe(false);
    expect(changed.captures.find((c) => c.id === victim.id)?.problem).toMatch(/bytes are stored where|SHA-256/);
    await s3().send(new DeleteObjectCommand({ Bucket: bucket, Key: key }));
    const missing = await checkIntegrity(db);
    expect(missing.captures.find((c) => c.id === victim.id)?.problem).toMatch(/missing from object storage/);
    await db.delete(captures).where(eq(captures.id, victim.id));
    expect((await checkIntegrity(db)).ok).toBe(true);
  });

  it('removing a job removes its rows and its objects; chunk-row captures on other jobs stay', async () => {
    const urls = (await db.select({ u: captures.storageUrl }).from(captures).where(eq(captures.jobId, jobId))).map((r) => r.u!);
    expect(urls.length).toBe(2);
    expect(await deleteJob('another-shop', jobId)).toBeNull();
    expect(await deleteJob(shopId, jobId)).toEqual({ captures: 2, objectsLeft: 0 });
    for (const u of urls) expect(await headObject(u)).toBeNull();
    expect(await db.select().from(captures).where(and(eq(captures.shopId, shopId), eq(captures.jobId, jobId)))).toEqual([]);
    expect(await objectCount()).toBe(0);
    const report = await checkIntegrity(db);
    expect(report.ok).toBe(true);
    expect(report.captures.length).toBeGreaterThan(0); // the demo's captures, kept as chunk rows
  });

  // The CLI on the embedded database (the PostgreSQL pass runs pg_dump's round trip in backup.test.ts).
  it.runIf(!process.env.DATABASE_URL)('db:backup copies the objects beside the dump; db:restore puts a lost one back', async () => {
    const kept = await upload(await newJob('OBJ-2'), real);
    await (await getDatabase()).close();
    const file = join(tmpdir(), `crankprint-objects-${Date.now()}.tar.gz`);
    const env = { ...process.env, CRANKPRINT_DATA_DIR: dataDir };
    const b = await run(['scripts/db-backup.ts', file], env);
    expect(b.status, b.stderr).toBe(0);
    expect(b.stdout).toMatch(/Copied 1 capture\(s\) from object storage/);
    expect(sha(readFileSync(join(`${file}.objects`, kept.id)))).toBe(sha(real));
    const { bucket, key } = parseObjectUrl(kept.storageUrl!);
    await s3().send(new DeleteObjectCommand({ Bucket: bucket, Key: key }));
    const dst = mkdtempSync(join(tmpdir(), 'crankprint-objects-dst-'));
    const r = await run(['scripts/db-restore.ts', file], { ...env, CRANKPRINT_DATA_DIR: dst });
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/1 capture\(s\) put back, 0 already there/);
    expect(await headObject(kept.storageUrl!)).toEqual({ size: real.length, sha256: sha(real) });
    const check = await run(['scripts/db-check.ts', '--json'], { ...env, CRANKPRINT_DATA_DIR: dst });
    expect(check.status, check.stdout + check.stderr).toBe(0);
    expect(JSON.parse(check.stdout).captures.filter((c: { storageUrl: string | null }) => c.storageUrl)).toHaveLength(1);
  }, 180_000);
});

