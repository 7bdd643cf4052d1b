/**
 * Every read and write of the data-access layer is scoped to the shop it is given: with another shop's id, the
 * demo shop's job, capture, analyses, report, vehicle and members are not found (null or empty) and nothing is
 * changed, while the demo shop's own id finds them. (The route wrapper turns "not found" into a 404.)
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { type Db, getDb } from '@/db/client';
import { listShopActivity } from '@/db/queries/audit';
import { shopBaseline } from '@/db/queries/baselines';
import { getCapture, latestAnalysesForJob, listAnalyses, listCaptures, readCapturePacked, readCaptureStream } from '@/db/queries/captures';
import { deleteJob, getJob, listJobs, updateJob } from '@/db/queries/jobs';
import { listProfiles } from '@/db/queries/profiles';
import { candidateAnalyses, getReport, listApprovalsForJob, listRevisions, reportBundle, saveDraft, signReport } from '@/db/queries/reports';
import { changeMember, getMember, listMembers } from '@/db/queries/shops';
import { getVehicle, listVehicles, vehicleJobs } from '@/db/queries/vehicles';
import { captures, jobs, members, organizations } from '@/db/schema';
import { seedDemoIfEmpty } from '@/db/seed';

let db: Db;
let shop: string;
let other: string;
let job: { id: string; vehicleId: string };
let captureId: string;
let memberId: string;
let userId: string;

beforeAll(async () => {
  if (!process.env.DATABASE_URL) process.env.CRANKPRINT_DATA_DIR = mkdtempSync(join(tmpdir(), 'crankprint-scope-'));
  db = await getDb();
  await seedDemoIfEmpty(db);
  [{ id: shop }] = await db.select({ id: organizations.id }).from(organizations).limit(1);
  other = crypto.randomUUID();
  await db.insert(organizations).values({ id: other, name: 'Another shop', slug: `another-${other.slice(0, 8)}` });
  [job] = await db.select({ id: jobs.id, vehicleId: jobs.vehicleId }).from(jobs).where(eq(jobs.shopId, shop)).limit(1);
  [{ id: captureId }] = await db.select({ id: captures.id }).from(captures).where(eq(captures.jobId, job.id)).limit(1);
  [{ id: memberId, userId }] = await db.select({ id: members.id, userId: members.userId }).from(members).where(eq(members.organizationId, shop)).limit(1);
}, 60_000);

describe('the data-access layer is scoped to the shop it is given', () => {
  it('finds the demo shop’s records with its own id', async () => {
    expect(await getJob(shop, job.id)).not.toBeNull();
    expect((await listJobs(shop)).length).toBeGreaterThan(0);
    expect(await getCapture(shop, captureId)).not.toBeNull();
    expect((await listAnalyses(shop, captureId)).length).toBeGreaterThan(0);
    expect(await getVehicle(shop, job.vehicleId)).not.toBeNull();
    expect(await getMember(shop, memberId)).not.toBeNull();
  });

  it('builds the demo shop’s baseline for its hatchback’s engine from its six signed healthy visits, and none for another shop', async () => {
    const engine = { cylinders: 4, layout: 'inline' as const, firingOrder: [1, 3, 4, 2], displacementL: 2.0 };
    const own = await shopBaseline(shop, engine);
    expect(own.crankingRpm?.captures).toBeGreaterThanOrEqual(6);
    expect(own.crankingRpm!.low).toBeLessThanOrEqual(own.crankingRpm!.high);
    expect(await shopBaseline(other, engine)).toEqual({});
    // Another engine has none in the demo shop.
    expect(await shopBaseline(shop, { ...engine, displacementL: 1.6 })).toEqual({});
  });

  it('finds nothing of it with another shop’s id', async () => {
    expect(await getJob(other, job.id)).toBeNull();
    expect(await listJobs(other)).toEqual([]);
    expect(await listCaptures(other, job.id)).toEqual([]);
    expect(await getCapture(other, captureId)).toBeNull();
    expect(await readCaptureStream(other, captureId)).toBeNull();
    expect(await readCapturePacked(other, captureId)).toBeNull();
    expect(await listAnalyses(other, captureId)).toEqual([]);
    expect((await latestAnalysesForJob(other, job.id)).size).toBe(0);
    expect(await listRevisions(other, job.id)).toEqual([]);
    expect(await listApprovalsForJob(other, job.id)).toEqual([]);
    expect(await candidateAnalyses(other, job.id)).toEqual([]);
    expect(await getVehicle(other, job.vehicleId)).toBeNull();
    expect(await listVehicles(other)).toEqual([]);
    expect(await vehicleJobs(other, job.vehicleId)).toEqual([]);
    expect(await listMembers(other)).toEqual([]);
    expect(await getMember(other, memberId)).toBeNull();
    expect(await listProfiles(other)).toEqual([]);
    expect(await listShopActivity(other)).toEqual([]);
  });

  it('changes nothing of it with another shop’s id', async () => {
    expect(await updateJob(other, job.id, { status: 'done' })).toBeNull();
    expect(await deleteJob(other, job.id)).toBeNull();
    expect(await changeMember(other, memberId, 'remove')).toBeFalsy();
    expect(await changeMember(other, memberId, { role: 'advisor' })).toBeFalsy();
    expect(await getJob(shop, job.id)).not.toBeNull();
    expect(await getMember(shop, memberId)).not.toBeNull();
    // A report drafted in the demo shop is the demo shop's alone.
    const [analysis] = await listAnalyses(shop, captureId);
    const draft = await saveDraft(shop, job.id, { analysisIds: [analysis.id], conditions: {}, interpretation: '', nextSteps: [] });
    expect(draft).toBeTruthy();
    const reportId = (draft as { id: string }).id;
    expect(await getReport(other, reportId)).toBeNull();
    expect(await reportBundle(other, reportId)).toBeNull();
    expect(await signReport(other, reportId, userId)).toBeFalsy();
    expect((await getReport(shop, reportId))?.status).toBe('draft');
  });
});
