/**
 * Object storage that fails, between the app and a real S3-compatible server (s3rver) through a proxy the test
 * switches (tests/support/switch-proxy.ts):
 * - a job removed while its capture's object is being written: the upload answers "no job" and leaves no object;
 * - storage down during a job removal: the removal still completes, with its activity line, and the object is
 *   removed by the sweep once storage answers again;
 * - storage that accepts connections and never answers: a read fails with StorageUnavailableError (the routes'
 *   503) after the client's timeouts, not minutes; the next read fails at once; the health check's probe says no.
 */
import { createHash, randomBytes } from 'node:crypto';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ListObjectsV2Command } from '@aws-sdk/client-s3';
import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Db } from '@/db/client';
import { captureStoreTarget, s3, STORAGE_TIMEOUTS, StorageUnavailableError, storageAnswers } from '@/db/object-store';
import { createCapture, readCaptureStream } from '@/db/queries/captures';
import { deleteJob } from '@/db/queries/jobs';
import { pendingObjectDeleteCount } from '@/db/queries/object-deletes';
import { auditEvents, captures, jobs } from '@/db/schema';
import { sweepObjectDeletes } from '@/server/object-sweeper';
import { type LocalS3, startLocalS3 } from '../support/s3-server';
import { seededDemo } from '../support/seeded-db';
import { startSwitchProxy, type SwitchProxy } from '../support/switch-proxy';

let store: LocalS3;
let proxy: SwitchProxy;
let db: Db;
let shopId: string;
let userId: string;
const sha = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');

async function objectKeys(): Promise<string[]> {
  const mode = proxy.mode;
  proxy.mode = 'pass';
  const r = await s3().send(new ListObjectsV2Command({ Bucket: store.bucket }));
  proxy.mode = mode;
  return (r.Contents ?? []).map((o) => o.Key!);
}

async function newJob(ro: string): Promise<string> {
  const [any] = await db.select().from(jobs).where(eq(jobs.shopId, shopId)).limit(1);
  const [j] = await db.insert(jobs).values({ shopId, vehicleId: any.vehicleId, repairOrder: ro, concern: 'storage faults' }).returning({ id: jobs.id });
  return j.id;
}

/** The capture's stored row (with its object's address), or null when the upload found no job. */
async function upload(jobId: string, bytes: Uint8Array) {
  const pieces = Array.from({ length: Math.ceil(bytes.length / (1 << 20)) }, (_, i) => bytes.subarray(i << 20, (i + 1) << 20));
  const row = await createCapture(shopId, { jobId, fileName: 'faults — ü "100%".csv', contentType: 'text/csv', sizeBytes: bytes.length, sha256: sha(bytes), pieces, chunks: [], uploadedBy: userId });
  if (!row) return null;
  const [stored] = await db.select().from(captures).where(eq(captures.id, row.id));
  expect(stored.storageUrl).toMatch(/^s3:\/\//);
  return stored;
}

beforeAll(async () => {
  store = await startLocalS3('crankprint-faults', 'shops');
  proxy = await startSwitchProxy(Number(new URL(store.env.AWS_ENDPOINT_URL_S3).port));
  Object.assign(process.env, store.env, { AWS_ENDPOINT_URL_S3: proxy.url });
  ({ db, shopId, userId } = await seededDemo(mkdtempSync(join(tmpdir(), 'crankprint-faults-'))));
}, 60_000);

afterAll(async () => {
  await proxy?.close();
  await store?.close();
});

describe('object storage that fails', () => {
  it('a job removed while its 20 MB upload is written: the upload finds no job and leaves no object', async () => {
    expect(captureStoreTarget()).not.toBeNull();
    const jobId = await newJob('FAULT-MIDWRITE');
    const before = await objectKeys();
    let removed: unknown = 'not yet';
    let removal: Promise<unknown> = Promise.resolve();
    proxy.onFirstData = () => (removal = deleteJob(shopId, jobId, userId).then((r) => (removed = r)));
    const row = await upload(jobId, randomBytes(20 << 20));
    await removal;
    expect(removed).toEqual({ captures: 0, objectsLeft: 0 });
    expect(row).toBeNull();
    expect(await objectKeys()).toEqual(before);
    expect(await db.select().from(captures).where(eq(captures.jobId, jobId))).toHaveLength(0);
    expect(await pendingObjectDeleteCount()).toBe(0);
  }, 120_000);

  it('storage down during a removal: the removal completes with its activity line; the sweep removes the object later', async () => {
    const jobId = await newJob('FAULT-DOWN');
    const row = (await upload(jobId, randomBytes(1 << 16)))!;
    const key = new URL(row.storageUrl!.replace('s3://', 'http://')).pathname.slice(1);
    expect(await objectKeys()).toContain(key);
    proxy.mode = 'down';
    const removed = await deleteJob(shopId, jobId, userId);
    expect(removed).toEqual({ captures: 1, objectsLeft: 1 });
    expect(await db.select().from(jobs).where(eq(jobs.id, jobId))).toHaveLength(0);
    expect(await db.select().from(auditEvents).where(and(eq(auditEvents.action, 'job.delete'), eq(auditEvents.subjectId, jobId)))).toHaveLength(1);
    expect(await pendingObjectDeleteCount()).toBe(1);
    // Still down: the sweep keeps it queued.
    expect(await sweepObjectDeletes()).toBe(0);
    expect(await pendingObjectDeleteCount()).toBe(1);
    proxy.mode = 'pass';
    expect(await sweepObjectDeletes()).toBe(1);
    expect(await pendingObjectDeleteCount()).toBe(0);
    expect(await objectKeys()).not.toContain(key);
  }, 60_000);

  it('storage that never answers: a read fails as unavailable after the timeouts, the next at once, and the probe says no', async () => {
    const jobId = await newJob('FAULT-STALL');
    const row = (await upload(jobId, randomBytes(1 << 16)))!;
    proxy.mode = 'stall';
    const t0 = Date.now();
    await expect(readCaptureStream(shopId, row.id)).rejects.toBeInstanceOf(StorageUnavailableError);
    const held = Date.now() - t0;
    console.log(`stalled object storage held a read for ${(held / 1000).toFixed(1)} s`);
    // Two attempts of at most the idle timeout each (and a connect timeout), never the minutes of no timeout.
    expect(held).toBeLessThan(2 * (STORAGE_TIMEOUTS.idleMs + STORAGE_TIMEOUTS.connectMs) + 5_000);
    const t1 = Date.now();
    await expect(readCaptureStream(shopId, row.id)).rejects.toBeInstanceOf(StorageUnavailableError);
    expect(Date.now() - t1).toBeLessThan(1_000);
    expect(await storageAnswers(captureStoreTarget()!, 2_000)).toBe(false);
    proxy.mode = 'pass';
    expect(await storageAnswers(captureStoreTarget()!, 2_000)).toBe(true);
  }, 90_000);
});
