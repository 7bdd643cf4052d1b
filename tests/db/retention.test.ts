/**
 * The retention sweep on the demo shop: captures and analyses of a job done for longer than the shop keeps them
 * go (chunk rows included) with its unsigned drafts; its signed report, the job and the activity stay; a job done
 * recently and an open job keep everything; the sweep runs once a day however often it is asked. The ranges
 * for the setting are the product's own rule (domain/retention.ts).
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { and, eq, inArray, sql } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import type { Db } from '@/db/client';
import { setRetention, sweepRetention } from '@/db/queries/retention';
import { analyses, auditEvents, captures, jobs, reports } from '@/db/schema';
import { retentionInput } from '@/domain/retention';
import { seededDemo } from '../support/seeded-db';

let db: Db;
let shopId: string;
let userId: string;
const now = new Date('2027-06-01T03:00:00Z');
const daysAgo = (d: number) => new Date(now.getTime() - d * 86_400_000);

beforeAll(async () => {
  ({ db, shopId, userId } = await seededDemo(mkdtempSync(join(tmpdir(), 'crankprint-retention-'))));
}, 60_000);

const countOf = async (table: typeof captures | typeof analyses, jobIds: string[]) => {
  if (table === captures) return (await db.select({ id: captures.id }).from(captures).where(inArray(captures.jobId, jobIds))).length;
  const ids = (await db.select({ id: captures.id }).from(captures).where(inArray(captures.jobId, jobIds))).map((c) => c.id);
  return ids.length ? (await db.select({ id: analyses.id }).from(analyses).where(inArray(analyses.captureId, ids))).length : 0;
};

describe('the retention sweep', () => {
  it('removes what a done job keeps past the shop’s period, keeps signed reports, the job and its activity, and runs once a day', async () => {
    const all = await db.select({ id: jobs.id, status: jobs.status }).from(jobs).where(eq(jobs.shopId, shopId));
    const [old, recent, open] = all;
    const withCaptures = async (id: string) => (await countOf(captures, [id])) > 0;
    for (const j of [old, recent, open]) expect(await withCaptures(j.id)).toBe(true);
    // The demo's other done jobs (its hatchback's earlier visits) were done within the period here.
    await db.update(jobs).set({ doneAt: daysAgo(5) }).where(and(eq(jobs.shopId, shopId), eq(jobs.status, 'done')));
    await db.update(jobs).set({ status: 'done', doneAt: daysAgo(100) }).where(eq(jobs.id, old.id));
    await db.update(jobs).set({ status: 'done', doneAt: daysAgo(10) }).where(eq(jobs.id, recent.id));
    await db.update(jobs).set({ status: 'open', doneAt: null, createdAt: daysAgo(400) }).where(eq(jobs.id, open.id));
    const content = { findings: '', nextSteps: [], analysisIds: [] } as unknown as typeof reports.$inferInsert.content;
    const [signed] = await db.insert(reports).values({ shopId, jobId: old.id, revision: 91, status: 'signed', content, signedBy: userId, signedAt: daysAgo(101), snapshot: '{"kept":true}', snapshotSha256: 'x' }).returning({ id: reports.id });
    await db.insert(reports).values({ shopId, jobId: old.id, revision: 92, status: 'draft', content });
    const analysesBefore = await countOf(analyses, [old.id]);
    expect(analysesBefore).toBeGreaterThan(0);

    await setRetention(shopId, 30);
    const r = await sweepRetention(now);
    expect(r.ran).toBe(true);
    expect(r.shops).toEqual([{ shopId, jobs: 1, captures: expect.any(Number), drafts: 1 }]);
    expect(await countOf(captures, [old.id])).toBe(0);
    expect(await countOf(analyses, [old.id])).toBe(0);
    const [{ n: chunks }] = await db.select({ n: sql<number>`count(*)::int` }).from(sql`capture_chunks c`).where(sql`not exists (select 1 from captures k where k.id = c.capture_id)`);
    expect(chunks).toBe(0);
    expect(await withCaptures(recent.id)).toBe(true);
    expect(await withCaptures(open.id)).toBe(true);
    // The signed revision, with its snapshot, and the job stay; the draft goes.
    const left = await db.select({ id: reports.id, status: reports.status, snapshot: reports.snapshot }).from(reports).where(and(eq(reports.jobId, old.id), inArray(reports.revision, [91, 92])));
    expect(left).toEqual([{ id: signed.id, status: 'signed', snapshot: '{"kept":true}' }]);
    expect(await db.select({ id: jobs.id }).from(jobs).where(eq(jobs.id, old.id))).toHaveLength(1);
    const [line] = await db.select().from(auditEvents).where(and(eq(auditEvents.shopId, shopId), eq(auditEvents.action, 'shop.retention-sweep')));
    expect(line.detail).toMatchObject({ days: 30, jobs: 1, drafts: 1 });

    // Asked again within the day (another instance, say): nothing runs.
    expect((await sweepRetention(new Date(now.getTime() + 60 * 60_000))).ran).toBe(false);
    // A day later it runs again; the recent job is now 11 days done and stays.
    const next = await sweepRetention(new Date(now.getTime() + 25 * 60 * 60_000));
    expect(next).toMatchObject({ ran: true, shops: [] });
    expect(await withCaptures(recent.id)).toBe(true);
  });

  it('refuses a period of 0 days or 100 years with a sentence, and takes none (keep for ever)', () => {
    for (const days of [0, 36_500]) {
      const r = retentionInput.safeParse({ retentionDays: days });
      expect(r.success).toBe(false);
      expect(r.error!.issues[0].message).toMatch(/Keep captures at (least|most)/);
    }
    expect(retentionInput.parse({ retentionDays: null })).toEqual({ retentionDays: null });
    expect(retentionInput.parse({ retentionDays: 730 })).toEqual({ retentionDays: 730 });
  });
});
