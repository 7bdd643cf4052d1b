/**
 * The retention sweep: for every shop with a retention period, the captures (their chunk rows or objects) and
 * analyses of jobs done for longer than it go, with any unsigned report revision of those jobs (its figures would
 * be gone). Jobs, signed revisions with their snapshots, share links, answers and the activity trail stay.
 * One instance of a fleet does it per day: under a transaction-scoped advisory lock, and only when the last run
 * recorded in maintenance_runs is a day old.
 */
import 'server-only';
import { and, eq, inArray, isNotNull, lt, sql } from 'drizzle-orm';
import { getDb } from '../client';
import { auditEvents, captures, jobs, maintenanceRuns, reports, shopSettings } from '../schema';
import { flushObjectDeletes, queueObjectDeletes } from './object-deletes';

const RUN = 'retention';
export const SWEEP_EVERY_MS = 24 * 60 * 60_000;

export interface SweepResult {
  ran: boolean;
  shops: { shopId: string; jobs: number; captures: number; drafts: number }[];
  objectsLeft: number;
}

/** Runs the sweep if no instance has in the last day (or always, with `force`); `now` for tests. */
export async function sweepRetention(now = new Date(), force = false): Promise<SweepResult> {
  const db = await getDb();
  const done = await db.transaction(async (tx) => {
    const [{ locked }] = (await tx.execute(sql`select pg_try_advisory_xact_lock(hashtext(${`crankprint:${RUN}`})) as locked`)).rows as { locked: boolean }[];
    if (!locked) return null;
    const [last] = await tx.select().from(maintenanceRuns).where(eq(maintenanceRuns.name, RUN));
    if (!force && last && now.getTime() - last.lastRunAt.getTime() < SWEEP_EVERY_MS) return null;
    const shops: SweepResult['shops'] = [];
    const urls: string[] = [];
    const policies = await tx.select({ shopId: shopSettings.shopId, days: shopSettings.retentionDays }).from(shopSettings).where(isNotNull(shopSettings.retentionDays));
    for (const p of policies) {
      const before = new Date(now.getTime() - p.days! * 86_400_000);
      const expired = await tx
        .select({ id: jobs.id })
        .from(jobs)
        .where(and(eq(jobs.shopId, p.shopId), eq(jobs.status, 'done'), lt(jobs.doneAt, before)));
      if (!expired.length) continue;
      const jobIds = expired.map((j) => j.id);
      const gone = await tx
        .delete(captures)
        .where(and(eq(captures.shopId, p.shopId), inArray(captures.jobId, jobIds)))
        .returning({ id: captures.id, jobId: captures.jobId, storageUrl: captures.storageUrl });
      const drafts = await tx
        .delete(reports)
        .where(and(eq(reports.shopId, p.shopId), inArray(reports.jobId, jobIds), eq(reports.status, 'draft')))
        .returning({ id: reports.id });
      if (!gone.length && !drafts.length) continue;
      urls.push(...gone.flatMap((c) => (c.storageUrl ? [c.storageUrl] : [])));
      const touched = new Set(gone.map((c) => c.jobId));
      shops.push({ shopId: p.shopId, jobs: touched.size, captures: gone.length, drafts: drafts.length });
      await tx.insert(auditEvents).values({
        shopId: p.shopId,
        actorId: null,
        action: 'shop.retention-sweep',
        detail: { days: p.days, jobs: touched.size, captures: gone.length, drafts: drafts.length, jobIds: [...touched].slice(0, 200) },
      });
    }
    await queueObjectDeletes(tx, urls);
    const detail = { shops: shops.length, captures: shops.reduce((n, s) => n + s.captures, 0) };
    await tx.insert(maintenanceRuns).values({ name: RUN, lastRunAt: now, detail }).onConflictDoUpdate({ target: maintenanceRuns.name, set: { lastRunAt: now, detail } });
    return { shops, urls };
  });
  if (!done) return { ran: false, shops: [], objectsLeft: 0 };
  const { left } = await flushObjectDeletes(done.urls);
  return { ran: true, shops: done.shops, objectsLeft: left };
}

/** When the sweep last ran, for the shop page. */
export async function lastRetentionSweep(): Promise<Date | null> {
  const db = await getDb();
  const [row] = await db.select({ at: maintenanceRuns.lastRunAt }).from(maintenanceRuns).where(eq(maintenanceRuns.name, RUN));
  return row?.at ?? null;
}

/** Sets a shop's retention (null keeps everything), creating its settings row if it has none. */
export async function setRetention(shopId: string, days: number | null): Promise<void> {
  const db = await getDb();
  await db.insert(shopSettings).values({ shopId, retentionDays: days }).onConflictDoUpdate({ target: shopSettings.shopId, set: { retentionDays: days, updatedAt: new Date() } });
}

export async function getRetention(shopId: string): Promise<number | null> {
  const db = await getDb();
  const [row] = await db.select({ days: shopSettings.retentionDays }).from(shopSettings).where(eq(shopSettings.shopId, shopId));
  return row?.days ?? null;
}
