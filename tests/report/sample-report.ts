/** A report's PDF data built from a sample capture, for the PDF test and the benchmark (no database). */
import { readFileSync } from 'node:fs';
import { CAUTIONS } from '@/domain/cautions';
import { interpretationFor, nextStepsFor, TEST_LIMITS } from '@/domain/report-wording';
import { traceExcerpt } from '@/domain/trace-excerpt';
import { conditionRows } from '@/server/pdf/format';
import type { ReportPdfData } from '@/server/pdf/report-document';
import { analyzeBytes } from '@/signal';

export function sampleReportData(): ReportPdfData {
  const bytes = new Uint8Array(readFileSync('samples/i4-burnt-valve-current-sync.csv'));
  const after = new Uint8Array(readFileSync('samples/i4-healthy-current-sync.csv'));
  const engine = { cylinders: 4, firingOrder: [1, 3, 4, 2], layout: 'inline' as const };
  const { capture, result: r } = analyzeBytes(bytes, { engine });
  const r2 = analyzeBytes(after, { engine }).result;
  return {
    shopName: 'Demo Engine Clinic',
    title: 'RO-24101 relative compression report',
    repairOrder: 'RO-24101',
    revision: 2,
    status: 'signed',
    signedBy: 'Demo Technician',
    signedAt: '2026-12-01',
    generatedAt: '2026-12-01 20:00 UTC',
    vehicle: { description: '2014 Demo Motors Compact sedan 2.0', vin: '1CPDEM0V2ZR000101', engine: '4 cylinders, inline, 2 L, firing order 1-3-4-2', odometer: '148,220 km' },
    concern: 'Runs rough at idle, check-engine light flashing on cold start.',
    conditions: conditionRows({ coolantTempC: 82, batteryRestV: 12.6 }, r),
    interpretation: interpretationFor(r),
    nextSteps: nextStepsFor(r),
    analyses: [
      { label: 'RO-24101 · before', result: r, fileSha256: 'a'.repeat(64), trace: traceExcerpt(capture.columns, r) },
      { label: 'RO-24101 · after', result: r2, fileSha256: 'b'.repeat(64) },
    ],
    cautions: CAUTIONS,
    limits: TEST_LIMITS,
  };
}
