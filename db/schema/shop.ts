/** The shop's own records: vehicles, jobs, captures (raw bytes compressed in chunk rows, or in object storage), analyses, reports, audit. */
import { customType, index, integer, jsonb, pgTable, primaryKey, real, text, timestamp, uniqueIndex } from 'drizzle-orm/pg-core';
import type { AnalysisSettingsValues } from '@/domain/analysis-settings';
import type { EngineSpec } from '@/domain/engine';
import type { ReportContent } from '@/domain/report';
import type { AnalysisResult } from '@/signal';
import type { TraceExcerpt } from '@/domain/trace-excerpt';
import { organizations, users } from './auth';

const bytea = customType<{ data: Uint8Array; driverData: Uint8Array }>({
  dataType: () => 'bytea',
});

const id = () =>
  text()
    .primaryKey()
    .$defaultFn(() => crypto.randomUUID());
const shopId = () =>
  text()
    .notNull()
    .references(() => organizations.id, { onDelete: 'cascade' });
const created = () => timestamp({ withTimezone: true }).notNull().defaultNow();


export const vehicles = pgTable(
  'vehicles',
  {
    id: id(),
    shopId: shopId(),
    vin: text(),
    year: integer(),
    make: text().notNull(),
    model: text().notNull(),
    engine: jsonb().$type<EngineSpec>().notNull(),
    createdAt: created(),
    updatedAt: created(),
  },
  (t) => [index().on(t.shopId), index().on(t.shopId, t.vin)],
);

export const jobs = pgTable(
  'jobs',
  {
    id: id(),
    shopId: shopId(),
    vehicleId: text()
      .notNull()
      .references(() => vehicles.id, { onDelete: 'restrict' }),
    repairOrder: text().notNull(),
    odometer: integer(),
    odometerUnit: text().notNull().default('km'),
    concern: text().notNull(),
    status: text().notNull().default('open'),
    createdBy: text().references(() => users.id, { onDelete: 'set null' }),
    createdAt: created(),
    updatedAt: created(),
    /** When the job was last moved to done (null while it is not): the shop's retention counts from here. */
    doneAt: timestamp({ withTimezone: true }),
  },
  (t) => [uniqueIndex().on(t.shopId, t.repairOrder), index().on(t.shopId, t.updatedAt)],
);

export const captures = pgTable(
  'captures',
  {
    id: id(),
    shopId: shopId(),
    jobId: text()
      .notNull()
      .references(() => jobs.id, { onDelete: 'cascade' }),
    fileName: text().notNull(),
    contentType: text().notNull(),
    sizeBytes: integer().notNull(),
    sha256: text().notNull(),
    compression: text().notNull().default('gzip'),
    chunkCount: integer().notNull(),
    /** s3://bucket/key when the raw bytes live in object storage (CAPTURE_STORE); null when they are chunk rows here. */
    storageUrl: text(),
    uploadedBy: text().references(() => users.id, { onDelete: 'set null' }),
    createdAt: created(),
  },
  (t) => [uniqueIndex().on(t.jobId, t.sha256), index().on(t.shopId)],
);

export const captureChunks = pgTable(
  'capture_chunks',
  {
    captureId: text()
      .notNull()
      .references(() => captures.id, { onDelete: 'cascade' }),
    seq: integer().notNull(),
    data: bytea().notNull(),
  },
  (t) => [primaryKey({ columns: [t.captureId, t.seq] })],
);

export const analyses = pgTable(
  'analyses',
  {
    id: id(),
    shopId: shopId(),
    captureId: text()
      .notNull()
      .references(() => captures.id, { onDelete: 'cascade' }),
    settings: jsonb().$type<AnalysisSettingsValues>().notNull(),
    engineVersion: text().notNull(),
    fileSha256: text().notNull(),
    result: jsonb().$type<AnalysisResult>().notNull(),
    /** The report's trace excerpt, drawn when the analysis was saved (null for analyses saved before it was kept). */
    trace: jsonb().$type<TraceExcerpt>(),
    verdict: text().notNull(),
    crankingRpm: real(),
    createdBy: text().references(() => users.id, { onDelete: 'set null' }),
    createdAt: created(),
  },
  (t) => [index().on(t.shopId, t.captureId)],
);

export const reports = pgTable(
  'reports',
  {
    id: id(),
    shopId: shopId(),
    jobId: text()
      .notNull()
      .references(() => jobs.id, { onDelete: 'cascade' }),
    revision: integer().notNull().default(1),
    status: text().notNull().default('draft'),
    /** Counts the saves of this revision, and its signing: a save or a signing names the version it was made on. */
    version: integer().notNull().default(1),
    content: jsonb().$type<ReportContent>().notNull(),
    signedBy: text().references(() => users.id, { onDelete: 'set null' }),
    signedAt: timestamp({ withTimezone: true }),
    /** Everything a signed revision shows, copied at signing (db/queries/report-snapshot.ts); null on a draft. */
    snapshot: text(),
    /** SHA-256 of `snapshot`, hex. */
    snapshotSha256: text(),
    createdAt: created(),
  },
  (t) => [uniqueIndex().on(t.jobId, t.revision), index().on(t.shopId)],
);

export const engineProfiles = pgTable(
  'engine_profiles',
  {
    id: id(),
    shopId: shopId(),
    label: text().notNull(),
    engine: jsonb().$type<EngineSpec>().notNull(),
    createdAt: created(),
  },
  (t) => [index().on(t.shopId)],
);

export const auditEvents = pgTable(
  'audit_events',
  {
    id: id(),
    shopId: text().references(() => organizations.id, { onDelete: 'cascade' }),
    actorId: text().references(() => users.id, { onDelete: 'set null' }),
    action: text().notNull(),
    subjectType: text(),
    subjectId: text(),
    detail: jsonb(),
    createdAt: created(),
  },
  // The second index finds a record's own events (a job's cautions read, say) without reading the shop's whole trail.
  (t) => [index().on(t.shopId, t.createdAt), index().on(t.subjectId, t.action)],
);

export type Vehicle = typeof vehicles.$inferSelect;
export type NewVehicle = typeof vehicles.$inferInsert;
export type Job = typeof jobs.$inferSelect;
export type NewJob = typeof jobs.$inferInsert;
export type Capture = typeof captures.$inferSelect;
export type Analysis = typeof analyses.$inferSelect;
export type Report = typeof reports.$inferSelect;
export type AuditEvent = typeof auditEvents.$inferSelect;

/** A read-only customer link to one report: the token is stored hashed, expires and can be revoked. */
export const shareLinks = pgTable(
  'share_links',
  {
    id: id(),
    shopId: shopId(),
    reportId: text()
      .notNull()
      .references(() => reports.id, { onDelete: 'cascade' }),
    tokenHash: text().notNull().unique(),
    expiresAt: timestamp({ withTimezone: true }).notNull(),
    revokedAt: timestamp({ withTimezone: true }),
    createdBy: text().references(() => users.id, { onDelete: 'set null' }),
    createdAt: created(),
  },
  (t) => [index().on(t.shopId, t.reportId)],
);

/** The customer's answer to the recommended next step, against the revision they saw. */
export const approvals = pgTable(
  'approvals',
  {
    id: id(),
    shopId: shopId(),
    reportId: text()
      .notNull()
      .references(() => reports.id, { onDelete: 'cascade' }),
    revision: integer().notNull(),
    shareLinkId: text().references(() => shareLinks.id, { onDelete: 'set null' }),
    decision: text().notNull(),
    typedName: text().notNull(),
    createdAt: created(),
  },
  // One answer per revision per link: a later one is refused and the first stands.
  (t) => [index().on(t.shopId, t.reportId), uniqueIndex().on(t.shareLinkId, t.revision)],
);

export type ShareLink = typeof shareLinks.$inferSelect;
export type Approval = typeof approvals.$inferSelect;

/** The shop's conventions (domain/shop-settings.ts); a shop without a row uses the defaults. */
export const shopSettings = pgTable('shop_settings', {
  shopId: text()
    .primaryKey()
    .references(() => organizations.id, { onDelete: 'cascade' }),
  timeZone: text().notNull().default('UTC'),
  temperatureUnit: text().notNull().default('C'),
  distanceUnit: text().notNull().default('km'),
  /** How customers reach the shop, shown on their report page and in e-mail: free text, line breaks kept. */
  phone: text().notNull().default(''),
  address: text().notNull().default(''),
  /** Days a done job keeps its captures and analyses (domain/retention.ts); null keeps them for ever. */
  retentionDays: integer(),
  /** Gauge pressures in kPa, psi or bar (domain/shop-settings.ts). */
  pressureUnit: text().notNull().default('kPa'),
  /** The shop's starting-system limits (domain/starting-limits.ts); null uses the defaults. */
  startingLimits: jsonb(),
  updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
});
