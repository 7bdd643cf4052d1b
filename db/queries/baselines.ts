/**
 * The shop's baseline for one engine (domain/baseline.ts): the analyses cited by the shop's signed report
 * revisions that read healthy, on vehicles with the same engine. Scoped to the shop like every query here.
 */
import 'server-only';
import { and, eq, inArray } from 'drizzle-orm';
import { type Baseline, baselineFigures, baselineKey, buildBaseline } from '@/domain/baseline';
import type { EngineSpec } from '@/domain/engine';
import { getDb } from '../client';
import { analyses, captures, jobs, reports, vehicles } from '../schema';

export async function shopBaseline(shopId: string, engine: EngineSpec): Promise<Baseline> {
  const db = await getDb();
  const signed = await db.select({ content: reports.content }).from(reports).where(and(eq(reports.shopId, shopId), eq(reports.status, 'signed')));
  const ids = [...new Set(signed.flatMap((r) => r.content.analysisIds))];
  if (ids.length === 0) return {};
  const rows = await db
    .select({ result: analyses.result, engine: vehicles.engine })
    .from(analyses)
    .innerJoin(captures, and(eq(captures.id, analyses.captureId), eq(captures.shopId, shopId)))
    .innerJoin(jobs, and(eq(jobs.id, captures.jobId), eq(jobs.shopId, shopId)))
    .innerJoin(vehicles, and(eq(vehicles.id, jobs.vehicleId), eq(vehicles.shopId, shopId)))
    .where(and(eq(analyses.shopId, shopId), eq(analyses.verdict, 'ok'), inArray(analyses.id, ids)));
  const key = baselineKey(engine);
  return buildBaseline(rows.filter((r) => baselineKey(r.engine) === key).map((r) => baselineFigures(r.result)));
}
