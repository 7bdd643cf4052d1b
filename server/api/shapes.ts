/**
 * The shapes of what the routes answer, in zod, for their contracts (server/api/routes/): the OpenAPI document
 * publishes them and the role matrix validates every real answer against them. Loose objects: a record may
 * carry more than is described, never less.
 */
import { z } from 'zod';
import { analysisSettingsSchema } from '@/domain/analysis-settings';
import { engineRecordSchema } from '@/domain/engine';
import { reportContentSchema } from '@/domain/report';
import type { AnalysisResult } from '@/signal';
import { JOB_STATUSES } from '@/domain/job';
import { DISTANCE_UNITS } from '@/domain/shop-settings';
import { ROLE_NAMES } from '@/server/permissions';

export const when = z.iso.datetime().meta({ description: 'An instant, ISO 8601 in UTC; pages show it in the shop’s time zone.' });
export const id = z.string().meta({ description: 'A record id.' });
export const ok = z.object({ ok: z.literal(true) });

export const errorBody = z
  .object({
    error: z.object({
      code: z.string().meta({ description: 'A stable code, e.g. INVALID_INPUT, NOT_FOUND, RATE_LIMITED.' }),
      message: z.string().meta({ description: 'One sentence saying what to do.' }),
      fields: z.record(z.string(), z.string()).optional().meta({ description: 'A sentence per wrong field, keyed by its path.' }),
    }),
  })
  .meta({ id: 'Error' });

export const engine = engineRecordSchema.meta({ id: 'Engine' });
export const vehicle = z.looseObject({ id, vin: z.string().nullable(), year: z.number().int().nullable(), make: z.string(), model: z.string(), engine }).meta({ id: 'Vehicle' });
export const job = z
  .looseObject({ id, repairOrder: z.string(), odometer: z.number().nullable(), odometerUnit: z.enum(DISTANCE_UNITS), concern: z.string(), status: z.enum(JOB_STATUSES), createdAt: when, updatedAt: when })
  .meta({ id: 'Job' });
/** A job as the list shows it: with its vehicle, its captures without a saved analysis and whether a report is signed. */
export const jobRow = job.extend({ vehicle, unanalysed: z.number().int(), signedReport: z.boolean() }).meta({ id: 'JobRow' });
export const capture = z.looseObject({ id, jobId: id, fileName: z.string(), contentType: z.string(), sizeBytes: z.number().int(), sha256: z.string(), createdAt: when }).meta({ id: 'Capture' });
/** The engine's result: checked here by its main fields, typed as the engine declares it (signal/types.ts). */
export const analysisResult = z
  .looseObject({ engineVersion: z.string(), verdict: z.string(), crankingRpm: z.number(), cylinders: z.array(z.looseObject({ cylinder: z.number().int(), relativePercent: z.number().nullable(), status: z.string() })) })
  .meta({
    id: 'AnalysisResult',
    description: 'The engine’s result: per-cylinder relative compression with a 90 % interval and a status, warnings, capture quality.',
  }) as unknown as z.ZodType<AnalysisResult>;
export const analysis = z
  .looseObject({ id, captureId: id, settings: analysisSettingsSchema, engineVersion: z.string(), fileSha256: z.string(), result: analysisResult, verdict: z.string(), createdAt: when })
  .meta({ id: 'Analysis' });
export const report = z
  .looseObject({ id, jobId: id, revision: z.number().int(), version: z.number().int(), status: z.enum(['draft', 'signed']), content: reportContentSchema, signedAt: when.nullable() })
  .meta({ id: 'Report' });
/** An analysis the report may include, with where it came from. */
export const candidate = z.looseObject({ id, createdAt: when, verdict: z.string(), fileName: z.string(), repairOrder: z.string(), jobId: id, result: analysisResult }).meta({ id: 'ReportCandidate' });
export const approval = z.looseObject({ id, decision: z.enum(['approve', 'decline']), typedName: z.string(), revision: z.number().int(), createdAt: when }).meta({ id: 'Approval' });
export const shareLink = z.looseObject({ id, revision: z.number().int().optional(), expiresAt: when, revokedAt: when.nullable().optional() }).meta({ id: 'ShareLink' });
export const member = z.looseObject({ id, role: z.enum(ROLE_NAMES) }).meta({ id: 'Member' });
/** A member as the shop page lists them. */
export const memberRow = member.extend({ name: z.string(), email: z.string() });
export const invitation = z.looseObject({ id, email: z.string(), role: z.string(), expiresAt: when }).meta({ id: 'Invitation' });
export const shop = z.object({ id, name: z.string() });
