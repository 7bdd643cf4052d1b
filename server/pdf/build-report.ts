/** From a stored report revision to the PDF: formats conditions ("not recorded", never invented) and a trace excerpt. */
import 'server-only';
import { renderToBuffer } from '@react-pdf/renderer';
import { createElement } from 'react';
import { CAUTIONS } from '@/components/analysis/cautions';
import { TEST_LIMITS } from '@/components/report/wording';
import { readCaptureBytes } from '@/db/queries/captures';
import type { ReportBundle } from '@/db/queries/reports';
import type { Conditions } from '@/db/validators/report';
import { type AnalysisResult, decimateMinMax, importCapture, indexAtTime } from '@/signal';
import { registerPdfFonts } from './fonts';
import { type PdfTrace, ReportDocument, type ReportPdfData } from './report-document';

const NR = 'not recorded';

export function conditionRows(c: Conditions, r?: AnalysisResult): [string, string][] {
  const v = (x: number | undefined, unit: string) => (x === undefined ? NR : `${x} ${unit}`);
  return [
    ['Coolant temperature', v(c.coolantTempC, '°C')],
    ['Battery rest voltage', v(c.batteryRestV, 'V')],
    ['Lowest cranking voltage', v(c.lowestCrankingV, 'V')],
    ['Mean cranking speed', r ? `${r.crankingRpm} rpm (measured)` : NR],
    ['Throttle position', c.throttle === 'wide-open' ? 'wide open' : c.throttle === 'closed' ? 'closed' : NR],
    ['Fuel disabled by', c.fuelDisabledBy ?? NR],
    ['Sync source', c.syncSource ?? (r ? (r.identity === 'sync' ? 'sync channel in the capture' : 'none (numbers assumed)') : NR)],
    ['Firing order and numbering', r ? `${r.settings.firingOrder.join('-')}${c.numbering ? `, ${c.numbering}` : ''}` : (c.numbering ?? NR)],
  ];
}

/** A decimated stretch of the capture's main channel from the start of the cranking window (about 1.5 s). */
export function traceExcerpt(bytes: Uint8Array, r: AnalysisResult, mapping?: Parameters<typeof importCapture>[1]): PdfTrace | undefined {
  const cap = importCapture(bytes, mapping);
  const c = cap.columns;
  let t: Float64Array | undefined;
  let y: Float64Array | undefined;
  let unit = '';
  let label = '';
  if (c.current && c.time) [t, y, unit, label] = [c.time, c.current, 'A', 'Starter current'];
  else if (c.rpm && c.time) [t, y, unit, label] = [c.time, c.rpm, 'rpm', 'Engine speed'];
  else if (c.crank && c.time) [t, y, unit, label] = [c.time, c.crank, 'V', 'Crank sensor'];
  else if (c.toothTimes) {
    const tt = c.toothTimes;
    t = tt.subarray(1);
    y = new Float64Array(tt.length - 1);
    for (let i = 1; i < tt.length; i++) y[i - 1] = (tt[i] - tt[i - 1]) * 1000;
    unit = 'ms';
    label = 'Tooth period';
  }
  if (!t || !y) return undefined;
  const from = r.window.endS > 0 ? r.window.startS : t[0];
  const to = Math.min(r.window.endS > 0 ? r.window.endS : t[t.length - 1], from + 1.5);
  const view = decimateMinMax(t, y, indexAtTime(t, from), indexAtTime(t, to), 300);
  const ts: number[] = [];
  const vs: number[] = [];
  for (let i = 0; i < view.x.length; i++) {
    ts.push(view.x[i], view.x[i]);
    vs.push(view.min[i], view.max[i]);
  }
  return { t: ts, v: vs, unit, label: `${label} (${unit}), ${from.toFixed(2)}–${to.toFixed(2)} s`, events: r.events.filter((e) => e.used).map((e) => ({ timeS: e.timeS, cylinder: e.cylinder })) };
}

export async function pdfDataFor(b: ReportBundle): Promise<ReportPdfData> {
  const v = b.vehicle;
  const e = v.engine;
  const analyses = [];
  for (const a of b.analyses) {
    const result = a.analysis.result as AnalysisResult;
    const bytes = a === b.analyses[0] ? await readCaptureBytes(b.shop.id, a.capture.id) : null;
    const settings = a.analysis.settings as { mapping?: never; sampleRateHz?: number };
    let trace: PdfTrace | undefined;
    try {
      trace = bytes ? traceExcerpt(bytes, result, { mapping: settings.mapping, sampleRateHz: settings.sampleRateHz }) : undefined;
    } catch {
      trace = undefined;
    }
    analyses.push({ label: `${a.jobRepairOrder} · ${a.capture.fileName} · saved ${a.analysis.createdAt.toISOString().slice(0, 16).replace('T', ' ')} UTC`, result, fileSha256: a.analysis.fileSha256, trace });
  }
  return {
    shopName: b.shop.name,
    title: `${b.job.repairOrder} relative compression report`,
    repairOrder: b.job.repairOrder,
    revision: b.report.revision,
    status: b.report.status === 'signed' ? 'signed' : 'draft',
    signedBy: b.content.technicianName ?? b.signerName,
    signedAt: b.report.signedAt ? b.report.signedAt.toISOString().slice(0, 10) : null,
    generatedAt: new Date().toISOString().slice(0, 16).replace('T', ' ') + ' UTC',
    vehicle: {
      description: [v.year, v.make, v.model].filter(Boolean).join(' '),
      vin: v.vin ?? NR,
      engine: `${e.cylinders} cylinders, ${e.layout === 'v' ? 'V' : e.layout}${e.displacementL ? `, ${e.displacementL} L` : ''}, firing order ${e.firingOrder.join('-')}`,
      odometer: b.job.odometer !== null ? `${b.job.odometer.toLocaleString('en-US')} ${b.job.odometerUnit}` : NR,
    },
    concern: b.job.concern,
    conditions: conditionRows(b.content.conditions, analyses[0]?.result),
    interpretation: b.content.interpretation,
    nextSteps: b.content.nextSteps,
    analyses,
    cautions: CAUTIONS,
    limits: TEST_LIMITS,
  };
}

export async function renderReportPdf(data: ReportPdfData): Promise<Buffer> {
  registerPdfFonts();
  return renderToBuffer(createElement(ReportDocument, { d: data }) as Parameters<typeof renderToBuffer>[0]);
}
