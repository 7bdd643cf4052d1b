/**
 * What is signed stays signed, at the data layer on a throwaway embedded database: a signed revision's bundle (what
 * the PDF and the customer page render) is copied at signing with its SHA-256, and later edits to the job, a
 * renamed signer and the removal of the job whose analysis it cites change nothing in it. A save racing a signing
 * either lands before it (and is what is signed) or starts the next revision.
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';

process.env.CRANKPRINT_DATA_DIR = mkdtempSync(join(tmpdir(), 'crankprint-snapshot-'));
process.env.CRANKPRINT_DEMO = '1';

const { getDb } = await import('@/db/client');
const schema = await import('@/db/schema');
const q = await import('@/db/queries/reports');
const jobsQ = await import('@/db/queries/jobs');
const { snapshotIntact } = await import('@/db/queries/report-snapshot');

let shopId = '';
let userId = '';
let citedJobId = '';
let reportJobId = '';
let analysisId = '';

beforeAll(async () => {
  const db = await getDb();
  const [analysis] = await db.select().from(schema.analyses).limit(1);
  const [capture] = await db.select().from(schema.captures).where(eq(schema.captures.id, analysis.captureId));
  const [cited] = await db.select().from(schema.jobs).where(eq(schema.jobs.id, capture.jobId));
  const [user] = await db.select().from(schema.users).limit(1);
  shopId = cited.shopId;
  userId = user.id;
  citedJobId = cited.id;
  analysisId = analysis.id;
  // A second visit of the same vehicle whose report cites the first visit's analysis (before/after).
  const [job] = await db
    .insert(schema.jobs)
    .values({ shopId, vehicleId: cited.vehicleId, repairOrder: 'RO-SNAPSHOT-1', concern: 'Rough idle — “again”, 100% sure.\nSecond line.', odometer: 120_000 })
    .returning();
  reportJobId = job.id;
}, 60_000);

const content = (steps: string[]) => ({ analysisIds: [analysisId], conditions: {}, interpretation: 'Cylinder 3 reads low. 日本 🚗', nextSteps: steps });

describe('a signed revision is a snapshot', () => {
  it('edits, a renamed signer and removing the cited job change nothing in it; its SHA-256 holds', async () => {
    const draft = await q.saveDraft(shopId, reportJobId, content(['Gauge cylinder 3', 'Leak-down test']));
    const signed = (await q.signReport(shopId, draft.id, userId))!;
    expect(signed.status).toBe('signed');
    expect('snapshot' in signed).toBe(false);
    const db = await getDb();
    const [stored] = await db.select().from(schema.reports).where(eq(schema.reports.id, signed.id));
    expect(snapshotIntact(stored.snapshot!, stored.snapshotSha256)).toBe(true);
    const atSigning = await q.reportBundle(shopId, signed.id);
    expect(atSigning!.analyses).toHaveLength(1);
    expect(atSigning!.job.concern).toContain('Second line.');

    // The removal dialog of the cited job names the signed revision that cites it.
    expect(await q.reportsCitingJob(shopId, citedJobId)).toEqual([{ jobId: reportJobId, repairOrder: 'RO-SNAPSHOT-1', revision: signed.revision, status: 'signed' }]);
    expect(await q.reportsCitingJob('another-shop', citedJobId)).toEqual([]);
    await jobsQ.updateJob(shopId, reportJobId, { concern: 'Changed after signing', odometer: 1 });
    await db.update(schema.users).set({ name: 'Someone Else' }).where(eq(schema.users.id, userId));
    expect(await jobsQ.deleteJob(shopId, citedJobId)).not.toBeNull();
    expect(await db.select().from(schema.analyses).where(eq(schema.analyses.id, analysisId))).toHaveLength(0);

    const later = await q.reportBundle(shopId, signed.id);
    expect(later).toEqual(atSigning);
    expect(later!.analyses[0].analysis.result.cylinders.length).toBeGreaterThan(0);
    expect(later!.analyses[0].analysis.createdAt).toBeInstanceOf(Date);
    const [row] = await db.select().from(schema.reports).where(eq(schema.reports.id, signed.id));
    expect(snapshotIntact(row.snapshot!, row.snapshotSha256)).toBe(true);
  });

  it('a draft is read as it stands; a save after signing starts the next revision and the signed one stays', async () => {
    const db = await getDb();
    const [job] = await db.select().from(schema.jobs).where(eq(schema.jobs.id, reportJobId));
    const [a] = await db.select().from(schema.analyses).limit(1);
    analysisId = a.id;
    // The cited analysis must be of the same vehicle: move this job onto that analysis's vehicle.
    const [cap] = await db.select().from(schema.captures).where(eq(schema.captures.id, a.captureId));
    const [owner] = await db.select().from(schema.jobs).where(eq(schema.jobs.id, cap.jobId));
    await db.update(schema.jobs).set({ vehicleId: owner.vehicleId }).where(eq(schema.jobs.id, job.id));
    const first = await q.saveDraft(shopId, reportJobId, content(['One']));
    const signed = (await q.signReport(shopId, first.id, userId))!;
    const next = await q.saveDraft(shopId, reportJobId, content(['Two']));
    expect(next.revision).toBe(signed.revision + 1);
    expect(next.status).toBe('draft');
    expect((await q.reportBundle(shopId, signed.id))!.content.nextSteps).toEqual(['One']);
    expect((await q.reportBundle(shopId, next.id))!.content.nextSteps).toEqual(['Two']);
  });

  it('saves racing a signing: what is signed is the draft its snapshot holds, 100 times', async () => {
    let failures = 0;
    for (let i = 0; i < 100; i++) {
      const draft = await q.saveDraft(shopId, reportJobId, content([`race ${i} a`]));
      const [signed] = await Promise.all([q.signReport(shopId, draft.id, userId).catch(() => null), q.saveDraft(shopId, reportJobId, content([`race ${i} b`]))]);
      if (!signed) continue;
      const b = (await q.reportBundle(shopId, signed.id))!;
      // The signed row's own content and its snapshot agree: the signing read what it signed.
      if (JSON.stringify(b.content) !== JSON.stringify(signed.content) || b.analyses.length === 0) failures++;
    }
    expect(failures).toBe(0);
  });
});

describe('drafts carry their version', () => {
  const baseOf = (r: { revision: number; version: number }) => ({ revision: r.revision, version: r.version });

  it('two tabs saving the same draft: one lands, the other is told, 100 times', async () => {
    let draft = await q.saveDraft(shopId, reportJobId, content(['tabs']));
    if (draft.status !== 'draft') draft = await q.saveDraft(shopId, reportJobId, content(['tabs']));
    let lost = 0;
    for (let i = 0; i < 100; i++) {
      const base = baseOf(draft);
      const out = await Promise.allSettled([q.saveDraft(shopId, reportJobId, content([`tab A ${i}`]), base), q.saveDraft(shopId, reportJobId, content([`tab B ${i}`]), base)]);
      const landed = out.filter((o) => o.status === 'fulfilled');
      const told = out.filter((o) => o.status === 'rejected' && o.reason instanceof q.ReportStateError);
      if (landed.length !== 1 || told.length !== 1) lost++;
      draft = (landed[0] as PromiseFulfilledResult<Awaited<ReturnType<typeof q.saveDraft>>>).value;
      // What is stored is what the tab that landed sent.
      const stored = (await q.reportBundle(shopId, draft.id))!.content.nextSteps[0];
      if (stored !== draft.content.nextSteps[0]) lost++;
    }
    expect(lost).toBe(0);
  });

  it('a save or a signing made on a version changed meanwhile is refused; on the version loaded, it lands', async () => {
    const loaded = await q.saveDraft(shopId, reportJobId, content(['loaded']));
    const base = baseOf(loaded);
    const other = await q.saveDraft(shopId, reportJobId, content(['saved in another tab']), base);
    expect(other.version).toBe(loaded.version + 1);
    await expect(q.signReport(shopId, loaded.id, userId, loaded.version)).rejects.toThrow(/another tab/);
    const signed = (await q.signReport(shopId, other.id, userId, other.version))!;
    expect(signed.status).toBe('signed');
    // A save made on the draft as it was before the signing: refused, and the signed revision is untouched.
    await expect(q.saveDraft(shopId, reportJobId, content(['after signing']), baseOf(other))).rejects.toThrow(/another tab/);
    expect((await q.reportBundle(shopId, signed.id))!.content.nextSteps).toEqual(['saved in another tab']);
    // Saving on the signed revision as loaded starts the next one.
    const next = await q.saveDraft(shopId, reportJobId, content(['next']), baseOf(signed));
    expect(next.revision).toBe(signed.revision + 1);
    expect(next.version).toBe(1);
  });
});

describe('an analysis whose capture went while it ran', () => {
  it('is not saved: null, which the route answers as 404 (never a 500)', async () => {
    const { saveAnalysis } = await import('@/db/queries/captures');
    const db = await getDb();
    const [a] = await db.select().from(schema.analyses).limit(1);
    const saved = await saveAnalysis(shopId, {
      captureId: 'removed-while-analysing',
      settings: a.settings,
      engineVersion: a.engineVersion,
      fileSha256: a.fileSha256,
      result: a.result,
      trace: null,
      verdict: a.verdict,
      crankingRpm: a.crankingRpm ?? 0,
      createdBy: userId,
    });
    expect(saved).toBeNull();
  });
});
