/** From a stored report revision to the PDF: formats conditions ("not recorded", never invented) and a trace excerpt. */
import 'server-only';
import { CAUTIONS } from '@/domain/cautions';
import { TEST_LIMITS } from '@/domain/report-wording';
import { readCapturePacked } from '@/db/queries/captures';
import { getShopSettings } from '@/db/queries/shops';
import { formatWhen } from '@/domain/time';
import { storedTraceExcerpt } from '../engine/pool';
import type { ReportBundle } from '@/db/queries/reports';
import { conditionRows, NR } from './format';
import type { PdfTrace, ReportPdfData } from './report-document';
import { engineLine, vehicleTitle } from '@/domain/vehicle';
import { ESTIMATE_CAUTION, type GaugeReading, gaugePressures, gaugeSummary } from '@/domain/gauge-pressures';
import { type PressureUnit, shopSettingsFrom } from '@/domain/shop-settings';
import { pressureIn, pressureText } from '@/domain/units';

export async function pdfDataFor(b: ReportBundle): Promise<ReportPdfData> {
  const v = b.vehicle;
  const e = v.engine;
  // A signed revision keeps the shop's settings as they were when it was signed.
  const { timeZone, temperatureUnit, pressureUnit } = shopSettingsFrom(b.shopSettings ?? (await getShopSettings(b.shop.id)));
  const analyses = [];
  for (const a of b.analyses) {
    const result = a.analysis.result;
    // The first analysis's trace excerpt, stored when it was saved; drawn from the capture only for an analysis
    // saved before excerpts were kept.
    let trace: PdfTrace | undefined = a === b.analyses[0] ? (a.analysis.trace ?? undefined) : undefined;
    if (a === b.analyses[0] && !a.analysis.trace) {
      const packed = await readCapturePacked(b.shop.id, a.capture.id);
      trace = packed ? ((await storedTraceExcerpt(packed, result, a.analysis.settings).catch(() => null)) ?? undefined) : undefined;
    }
    analyses.push({ label: `${a.jobRepairOrder} · ${a.capture.fileName} · saved ${formatWhen(a.analysis.createdAt, timeZone)}`, result, fileSha256: a.analysis.fileSha256, savedAtMs: a.analysis.createdAt.getTime(), trace });
  }
  return {
    shopName: b.shop.name,
    title: `${b.job.repairOrder} relative compression report`,
    repairOrder: b.job.repairOrder,
    revision: b.report.revision,
    status: b.report.status === 'signed' ? 'signed' : 'draft',
    // The signature is the signing member's, from the signing record; a typed name is only "prepared by".
    signedBy: b.signerName ? `${b.signerName}${b.signerEmail ? ` <${b.signerEmail}>` : ''}` : null,
    signedAt: b.report.signedAt ? formatWhen(b.report.signedAt, timeZone) : null,
    preparedBy: b.content.technicianName ?? null,
    generatedAt: formatWhen(new Date(), timeZone),
    vehicle: {
      description: vehicleTitle(v),
      vin: v.vin ?? NR,
      engine: engineLine(e),
      odometer: b.job.odometer !== null ? `${b.job.odometer.toLocaleString('en-US')} ${b.job.odometerUnit}` : NR,
    },
    concern: b.job.concern,
    conditions: conditionRows(b.content.conditions, analyses[0]?.result, temperatureUnit),
    interpretation: b.content.interpretation,
    nextSteps: b.content.nextSteps,
    analyses,
    pressures: b.content.gauge && analyses[0] ? pressureRows(gaugePressures(analyses[0].result, b.content.gauge), b.content.gauge, pressureUnit) : undefined,
    cautions: CAUTIONS,
    limits: TEST_LIMITS,
  };
}

/** The estimated gauge pressures as the PDF prints them, in the shop's unit. */
function pressureRows(p: ReturnType<typeof gaugePressures>, g: GaugeReading, unit: PressureUnit): NonNullable<ReportPdfData['pressures']> {
  const heading = `Gauge on cylinder ${g.cylinder}: ${pressureText(g.readingKpa, unit)} (± ${g.accuracyPercent} %)${g.minimumKpa !== undefined ? `; minimum ${pressureText(g.minimumKpa, unit)}` : ''}${g.maxDifferencePercent !== undefined ? `; largest difference ${g.maxDifferencePercent} % of the highest` : ''}.`;
  if ('problem' in p) return { heading, rows: [], sentence: p.problem, caution: ESTIMATE_CAUTION };
  return {
    heading,
    rows: p.cylinders.map((c) => ({
      cylinder: c.cylinder,
      estimate: c.kpa === null ? '—' : `${pressureIn(c.kpa, unit)} ${unit}${c.gauged ? ' (gauged)' : ''}`,
      range: c.interval ? `${pressureIn(c.interval[0], unit)}–${pressureIn(c.interval[1], unit)} ${unit}` : '—',
      status: g.minimumKpa === undefined ? '' : c.status,
    })),
    sentence: gaugeSummary(p),
    caution: ESTIMATE_CAUTION,
  };
}
