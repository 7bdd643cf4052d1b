/**
 * Demo data for an empty database: an invented shop with one user per role and a handful of vehicles and
 * jobs. Nothing here describes a real shop, person or vehicle.
 */
import { createHash } from 'node:crypto';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { hashPassword } from 'better-auth/crypto';
import { eq, sql } from 'drizzle-orm';
import { analyzeBytes } from '../signal';
import { simToCsv, simulateCranking } from '../signal/sim';
import { reportContentSchema } from '../domain/report';
import { shopSettingsFrom } from '../domain/shop-settings';
import { signedSnapshot } from './queries/report-bundle';
import { traceExcerpt } from '../domain/trace-excerpt';
import { compressPiece, insertChunks } from './chunks';
import { engineSettings, settingsForEngine } from '@/domain/analysis-settings';
import type { Db } from './db-type';
import type { EngineSpec } from '../domain/engine';
import { accounts, analyses, captures, jobs, members, organizations, reports, shopSettings, users, vehicles } from './schema';
import { vinCheckDigit } from '@/domain/vin';

export const DEMO_PASSWORD = 'crank-demo-2026';
export const DEMO_ACCOUNTS = [
  { role: 'owner', name: 'Demo Owner', email: 'owner@demo.crankprint.test' },
  { role: 'technician', name: 'Demo Technician', email: 'tech@demo.crankprint.test' },
  { role: 'advisor', name: 'Demo Advisor', email: 'advisor@demo.crankprint.test' },
] as const;

const I4: EngineSpec = { cylinders: 4, layout: 'inline', firingOrder: [1, 3, 4, 2], displacementL: 2.0 };
const I6: EngineSpec = { cylinders: 6, layout: 'inline', firingOrder: [1, 5, 3, 6, 2, 4], displacementL: 3.0 };
const V6: EngineSpec = { cylinders: 6, layout: 'v', numbering: 'along-crank', firingOrder: [1, 6, 5, 4, 3, 2], intervalsDeg: [90, 150, 90, 150, 90, 150], displacementL: 3.8 };
const V8: EngineSpec = { cylinders: 8, layout: 'v', numbering: 'along-crank', firingOrder: [1, 8, 4, 3, 6, 5, 7, 2], displacementL: 5.3 };

/** A made-up North American VIN with a correct check digit. */
function demoVin(serial: number): string {
  const draft = `1CPDEM0V0ZR${String(serial).padStart(6, '0')}`;
  const chars = draft.split('');
  chars[8] = vinCheckDigit(draft);
  return chars.join('');
}

const DEMO_VEHICLES = [
  { year: 2014, make: 'Demo Motors', model: 'Compact sedan 2.0', engine: I4, vin: demoVin(101) },
  { year: 2011, make: 'Demo Motors', model: 'Wagon 3.0', engine: I6, vin: demoVin(102) },
  { year: 2006, make: 'Demo Motors', model: 'Minivan 3.8', engine: V6, vin: demoVin(103) },
  { year: 2017, make: 'Demo Motors', model: 'Pickup 5.3', engine: V8, vin: demoVin(104) },
  { year: 2019, make: 'Demo Motors', model: 'Hatchback 2.0', engine: I4, vin: demoVin(105) },
];

const DEMO_JOBS = [
  { ro: 'RO-24101', vehicle: 0, odometer: 148_220, concern: 'Runs rough at idle, check-engine light flashing on cold start.', status: 'open', sample: 'i4-burnt-valve-current-sync.csv' },
  { ro: 'RO-24102', vehicle: 1, odometer: 201_450, concern: 'Lacks power climbing hills; white smoke after start-up.', status: 'open', sample: 'i6-one-low-current.csv' },
  { ro: 'RO-24103', vehicle: 2, odometer: 176_300, concern: 'Misfire on the rear bank under load.', status: 'waiting', sample: 'v6-odd-fire-current-sync.csv' },
  { ro: 'RO-24104', vehicle: 3, odometer: 92_800, concern: 'Cranks long before it starts; uses oil between changes.', status: 'open', sample: 'v8-sync-current.csv' },
  { ro: 'RO-24099', vehicle: 4, odometer: 61_020, concern: 'Ticking noise and a shake at idle after a timing belt job elsewhere.', status: 'done', sample: 'i4-healthy-current-sync.csv' },
];



/** Seeds the demo shop when the database has no shop yet. */
export async function seedDemoIfEmpty(db: Db): Promise<boolean> {
  const [{ count }] = await db.select({ count: sql<number>`count(*)::int` }).from(organizations);
  if (count > 0) return false;
  const hash = await hashPassword(DEMO_PASSWORD);
  await db.transaction(async (tx) => {
    const shopId = crypto.randomUUID();
    await tx.insert(organizations).values({ id: shopId, name: 'Demo Engine Clinic', slug: 'demo-engine-clinic' });
    // The demo shop keeps its dates in a US zone, its temperatures in °F and distances in miles, to show the
    // conversions; its phone number is in the range kept for fiction, its address invented.
    await tx.insert(shopSettings).values({ shopId, timeZone: 'America/Chicago', temperatureUnit: 'F', distanceUnit: 'mi', pressureUnit: 'psi', phone: '(555) 010-4821', address: '48 Gearwheel Lane\nRivertown' });
    const ids: string[] = [];
    for (const a of DEMO_ACCOUNTS) {
      const userId = crypto.randomUUID();
      ids.push(userId);
      await tx.insert(users).values({ id: userId, name: a.name, email: a.email, emailVerified: true });
      await tx.insert(accounts).values({ id: crypto.randomUUID(), accountId: userId, providerId: 'credential', userId, password: hash });
      await tx.insert(members).values({ id: crypto.randomUUID(), organizationId: shopId, userId, role: a.role });
    }
    const vehicleIds: string[] = [];
    for (const v of DEMO_VEHICLES) {
      const [row] = await tx.insert(vehicles).values({ shopId, ...v }).returning({ id: vehicles.id });
      vehicleIds.push(row.id);
    }
    let minutes = 0;
    for (const j of DEMO_JOBS) {
      minutes += 95;
      const at = new Date(Date.now() - minutes * 60_000);
      const [job] = await tx
        .insert(jobs)
        .values({
        shopId,
        vehicleId: vehicleIds[j.vehicle],
        repairOrder: j.ro,
        odometer: j.odometer,
        odometerUnit: 'mi',
        concern: j.concern,
        status: j.status,
        createdBy: ids[1],
        createdAt: at,
        updatedAt: at,
        doneAt: j.status === 'done' ? at : null,
      })
        .returning({ id: jobs.id });
      // A capture from samples/ with a saved analysis, so the first screen shows real traces and charts.
      const file = join(/*turbopackIgnore: true*/ process.cwd(), 'samples', j.sample);
      if (!existsSync(file)) continue;
      const bytes = new Uint8Array(readFileSync(file));
      await insertAnalysedCapture(tx, { shopId, jobId: job.id, fileName: j.sample, bytes, engine: DEMO_VEHICLES[j.vehicle].engine, by: ids[1], at });
    }
    // The hatchback's earlier visits: healthy captures in signed reports, the shop's baseline for its engine.
    await seedHealthyHistory(tx, { shopId, vehicleId: vehicleIds[4], engine: DEMO_VEHICLES[4].engine, technician: ids[1] });
  });
  return true;
}

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

/** One capture stored as uploaded, with its analysis saved as the server would; the analysis's id. */
async function insertAnalysedCapture(tx: Tx, c: { shopId: string; jobId: string; fileName: string; bytes: Uint8Array; engine: EngineSpec; by: string; at: Date }): Promise<string> {
  const sha256 = createHash('sha256').update(c.bytes).digest('hex');
  const chunks: Uint8Array[] = [];
  for (let o = 0; o < c.bytes.length; o += 1 << 20) chunks.push(compressPiece(c.bytes.subarray(o, o + (1 << 20))));
  const captureId = crypto.randomUUID();
  await tx.insert(captures).values({ id: captureId, shopId: c.shopId, jobId: c.jobId, fileName: c.fileName, contentType: 'text/csv', sizeBytes: c.bytes.length, sha256, chunkCount: chunks.length, uploadedBy: c.by, createdAt: c.at });
  await insertChunks(tx, captureId, chunks);
  const settings = settingsForEngine(c.engine);
  const { capture, result } = analyzeBytes(c.bytes, engineSettings(settings));
  const trace = traceExcerpt(capture.columns, result) ?? null;
  const [row] = await tx
    .insert(analyses)
    .values({ shopId: c.shopId, captureId, settings, engineVersion: result.engineVersion, fileSha256: sha256, result, trace, verdict: result.verdict, crankingRpm: result.crankingRpm, createdBy: c.by, createdAt: c.at })
    .returning({ id: analyses.id });
  return row.id;
}

/** Visits of one vehicle, a month or more apart: each a done job, a healthy simulated capture and a signed report. */
const HISTORY_VISITS = 6;

async function seedHealthyHistory(tx: Tx, h: { shopId: string; vehicleId: string; engine: EngineSpec; technician: string }): Promise<void> {
  const [settingsRow] = await tx.select().from(shopSettings).where(eq(shopSettings.shopId, h.shopId));
  const settings = shopSettingsFrom(settingsRow);
  for (let k = 0; k < HISTORY_VISITS; k++) {
    const at = new Date(Date.now() - (40 + 35 * k) * 86_400_000);
    const repairOrder = `RO-23${String(900 - 37 * k)}`;
    const [job] = await tx
      .insert(jobs)
      .values({ shopId: h.shopId, vehicleId: h.vehicleId, repairOrder, odometer: 60_500 - 900 * k, odometerUnit: 'mi', concern: 'Scheduled service; a compression screen before the timing-belt job.', status: 'done', createdBy: h.technician, createdAt: at, updatedAt: at, doneAt: at })
      .returning({ id: jobs.id });
    // A healthy engine on a slightly different day each visit: battery charge, oil temperature (friction), starter wear.
    const sim = simulateCranking({ engine: { cylinders: h.engine.cylinders, firingOrder: h.engine.firingOrder }, channels: ['current', 'sync', 'battery'], seed: 700 + k, targetRpm: 186 + 6 * k, batteryV: 12.45 + 0.04 * k, viscousScale: 0.8 + 0.12 * k });
    const bytes = new TextEncoder().encode(simToCsv(sim, { channels: ['current', 'sync', 'battery'] }));
    const analysisId = await insertAnalysedCapture(tx, { shopId: h.shopId, jobId: job.id, fileName: `visit-${k + 1}.csv`, bytes, engine: h.engine, by: h.technician, at });
    const content = reportContentSchema.parse({ analysisIds: [analysisId], interpretation: 'All cylinders measured alike; no mechanical fault found by this screen.', technicianName: 'Demo Technician' });
    const row = { id: crypto.randomUUID(), shopId: h.shopId, jobId: job.id, revision: 1, status: 'signed', version: 2, content, signedBy: h.technician, signedAt: at, snapshot: null, snapshotSha256: null, createdAt: at };
    const { text, sha256 } = await signedSnapshot(tx, h.shopId, row, settings);
    await tx.insert(reports).values({ ...row, snapshot: text, snapshotSha256: sha256 });
  }
}
