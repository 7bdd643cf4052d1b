/**
 * The report as a PDF (React PDF): shop header, job and vehicle, concern, conditions, the per-cylinder chart
 * and a trace excerpt drawn as vectors, figures, verdict, interpretation, next steps, cautions and limits,
 * engine version and SHA-256, page numbers. Built from plain data so it renders without a database.
 */
import { Document, Page, Text, View } from '@react-pdf/renderer';
import { type AnalysisResult, compareResults, identityWords, METHOD_NAMES, percentText, readingText, VERDICT_WORDS } from '@/signal';
import type { TraceExcerpt } from '@/domain/trace-excerpt';
import { gaugeToConfirm } from '@/domain/report-wording';
import { C, ChartSvg, Figures, s, STATUS_COLOR, TraceSvg } from './report-parts';

/** The stored trace excerpt (domain/trace-excerpt.ts). */
export type PdfTrace = TraceExcerpt;

export interface PdfAnalysis {
  label: string;
  result: AnalysisResult;
  fileSha256: string;
  /** When the analysis was saved, ms since 1970: orders before and after. */
  savedAtMs?: number;
  trace?: PdfTrace;
}

export interface ReportPdfData {
  shopName: string;
  title: string;
  repairOrder: string;
  revision: number;
  status: 'draft' | 'signed';
  signedBy?: string | null;
  signedAt?: string | null;
  /** The technician's name as typed on the draft, shown apart from the signature. */
  preparedBy?: string | null;
  generatedAt: string;
  vehicle: { description: string; vin: string; engine: string; odometer: string };
  concern: string;
  conditions: [string, string][];
  interpretation: string;
  nextSteps: string[];
  analyses: PdfAnalysis[];
  /** Estimated gauge pressures from one gauge reading, where one was entered. */
  pressures?: { heading: string; rows: { cylinder: number; estimate: string; range: string; status: string }[]; sentence: string; caution: string };
  cautions: readonly string[];
  limits: string;
}


export function ReportDocument({ d }: { d: ReportPdfData }) {
  const main = d.analyses[0];
  const r = main?.result;
  return (
    <Document title={d.title} author={d.shopName} creator="Crankprint" producer="Crankprint">
      <Page size="A4" style={s.page}>
        <Text style={s.footerLeft} fixed>{`${d.shopName} · ${d.repairOrder} · revision ${d.revision}`}</Text>
        <Text style={s.footerRight} fixed render={({ pageNumber, totalPages }) => `Page ${pageNumber} of ${totalPages}`} />
        <View style={s.body}>
        <View style={s.header} fixed>
          <View>
            <Text style={s.shop}>{d.shopName}</Text>
            <Text style={s.h1}>Relative compression report</Text>
          </View>
          <View style={{ alignItems: 'flex-end' }}>
            <Text style={s.mono}>{`${d.repairOrder} · revision ${d.revision}`}</Text>
            <Text style={s.small}>{d.status === 'signed' ? `Signed by ${d.signedBy ?? 'a former member'} on ${d.signedAt}` : 'DRAFT — not signed'}</Text>
            {d.preparedBy ? <Text style={s.small}>{`Prepared by ${d.preparedBy}`}</Text> : null}
          </View>
        </View>

        <Text style={s.h2}>Vehicle</Text>
        {(
          [
            ['Vehicle', d.vehicle.description],
            ['VIN', d.vehicle.vin],
            ['Engine', d.vehicle.engine],
            ['Odometer', d.vehicle.odometer],
          ] as const
        ).map(([k, v]) => (
          <View key={k} style={s.row}>
            <Text style={s.cellLabel}>{k}</Text>
            <Text style={k === 'VIN' ? s.mono : {}}>{v}</Text>
          </View>
        ))}
        <Text style={s.h2}>Customer concern</Text>
        <Text>{d.concern}</Text>

        <Text style={s.h2}>Test conditions</Text>
        {d.conditions.map(([k, v]) => (
          <View key={k} style={s.row}>
            <Text style={s.cellLabel}>{k}</Text>
            <Text style={v === 'not recorded' ? { color: C.muted } : {}}>{v}</Text>
          </View>
        ))}

        {r ? (
          <>
            <Text style={s.h2}>Per-cylinder result</Text>
            <View style={[s.row, { gap: 14 }]}>
              <ChartSvg r={r} />
              <View style={{ flex: 1, gap: 3 }}>
                <Text style={[s.verdict, { color: STATUS_COLOR[r.verdict] }]}>{`Verdict: ${VERDICT_WORDS[r.verdict]}`}</Text>
                <Text>{`Method: ${METHOD_NAMES[r.method]}; mean cranking ${r.crankingRpm} rpm; spread ${r.spreadPercent} points.`}</Text>
                {r.quality && <Text>{`Capture quality: ${r.quality.grade}${r.quality.limitedBy !== 'none' ? `, limited by ${r.quality.limitedBy}` : ''}. ${r.quality.note}`}</Text>}
                <Text>{'Whiskers show each figure\'s 90 % interval; a cylinder is low or high only when its whole interval is past the limit.'}</Text>
                <Text>{`Cylinder numbers: ${identityWords(r.identity)}; firing order ${r.settings.firingOrder.join('-')}.`}</Text>
                <Text>{`Limits applied: low below ${r.settings.lowLimitPercent} %, high above ${r.settings.highLimitPercent ?? 110} %, spread above ${r.settings.spreadLimitPercent} points.`}</Text>
                <Text>{r.pattern.hint}</Text>
                {gaugeToConfirm(r) && <Text style={{ fontWeight: 700 }}>{gaugeToConfirm(r)}</Text>}
                <Text style={s.small}>{main.label}</Text>
              </View>
            </View>
            {main.trace && (
              <>
                <Text style={s.h2}>Trace excerpt</Text>
                <TraceSvg trace={main.trace} />
                <Text style={s.small}>{`${main.trace.label}; vertical lines mark compression events, numbered by cylinder.`}</Text>
              </>
            )}
            <Text style={s.h2}>Figures</Text>
            <Figures r={r} />
            {d.pressures && <PressureSection p={d.pressures} />}
            {r.startingSystem && <StartingSection system={r.startingSystem} />}
            {r.warnings.length > 0 && (
              <>
                <Text style={s.h2}>Warnings</Text>
                {r.warnings.map((w, i) => (
                  <Text key={i}>{`${w.code}: ${w.message}`}</Text>
                ))}
              </>
            )}
          </>
        ) : (
          <Text style={[s.h2, { color: C.low }]}>No saved analysis is included in this report.</Text>
        )}

        {d.analyses.length > 1 && (
          <View wrap={false}>
            <Text style={s.h2}>Before and after</Text>
            <View style={[s.row, { gap: 10 }]}>
              {d.analyses.slice(0, 2).map((a) => (
                <View key={a.label} style={{ width: 255 }}>
                  <ChartSvg r={a.result} width={250} height={130} />
                  <Text style={s.small}>{a.label}</Text>
                  <Text style={s.mono}>{a.result.cylinders.map((c) => `${c.cylinder}:${percentText(c.relativePercent, 0)}%`).join('  ')}</Text>
                </View>
              ))}
            </View>
            {beforeAfter(d.analyses)
              .filter((c) => c.change === 'up' || c.change === 'down')
              .map((c) => (
                <Text key={c.cylinder} style={s.small}>
                  {c.sentence}
                </Text>
              ))}
            <Text style={s.small}>A change counts only where the two 90 % intervals do not overlap.</Text>
          </View>
        )}

        <Text style={s.h2}>Interpretation</Text>
        <Text>{d.interpretation || 'not recorded'}</Text>
        <Text style={s.h2}>Recommended next steps</Text>
        {d.nextSteps.length ? d.nextSteps.map((n, i) => <Text key={i}>{`${i + 1}. ${n}`}</Text>) : <Text>not recorded</Text>}

        <View wrap={false}>
          <Text style={s.h2}>Cautions and limits of this test</Text>
          {d.cautions.map((c, i) => (
            <Text key={i}>{`• ${c}`}</Text>
          ))}
          <Text style={{ marginTop: 3 }}>{d.limits}</Text>
        </View>

        <View wrap={false}>
          <Text style={s.h2}>Traceability</Text>
          {d.analyses.map((a) => (
            <Text key={a.label} style={s.mono}>{`${a.label} · engine ${a.result.engineVersion} · SHA-256 ${a.fileSha256}`}</Text>
          ))}
          <Text style={s.small}>{`Generated ${d.generatedAt} by Crankprint.`}</Text>
        </View>
        </View>

      </Page>
    </Document>
  );
}

/** Estimated gauge pressures: a column per cylinder's estimate and its 90 % range, then the sentence and the caution. */
function PressureSection({ p }: { p: NonNullable<ReportPdfData['pressures']> }) {
  return (
    <View wrap={false}>
      <Text style={s.h2}>Estimated gauge pressures</Text>
      <Text>{p.heading}</Text>
      {p.rows.map((row) => (
        <View key={row.cylinder} style={s.row}>
          <Text style={s.cellLabel}>{`Cylinder ${row.cylinder}`}</Text>
          <Text style={{ width: 130 }}>{row.estimate}</Text>
          <Text style={{ width: 130 }}>{`90 %: ${row.range}`}</Text>
          <Text style={{ color: row.status === 'below minimum' ? C.low : row.status === 'ok' ? C.ok : C.muted }}>{row.status}</Text>
        </View>
      ))}
      <Text style={{ fontWeight: 700 }}>{p.sentence}</Text>
      <Text style={s.small}>{p.caution}</Text>
    </View>
  );
}

const STARTING_WORD = { ok: 'within limit', low: 'below limit', high: 'above limit', 'no limit': 'no limit set', 'not measured': 'not in this capture' } as const;
/** The PDF's fonts draw Ω narrower than it advances: milliohms are written out. */
const pdfUnits = (text: string) => text.replace(/mΩ/g, 'milliohms');

/** The battery and starter: each check, its limit and the limit's source, then what to do. */
function StartingSection({ system }: { system: NonNullable<AnalysisResult['startingSystem']> }) {
  return (
    <View wrap={false}>
      <Text style={s.h2}>{`Battery and starter (${system.systemV} V system)`}</Text>
      {system.checks.filter((c) => c.status !== 'not measured').map((c) => (
        <View key={c.key} style={s.row}>
          <Text style={s.cellLabel}>{c.label}</Text>
          <Text style={{ width: 70 }}>{pdfUnits(readingText(c))}</Text>
          <Text style={{ width: 80, color: c.status === 'ok' ? C.ok : c.status === 'not measured' || c.status === 'no limit' ? C.muted : C.low }}>{STARTING_WORD[c.status]}</Text>
          <Text style={[s.small, { flex: 1 }]}>{pdfUnits(`${c.limit}; ${c.source}`)}</Text>
        </View>
      ))}
      {system.notInCapture ? <Text style={s.small}>{system.notInCapture}</Text> : null}
      {system.advice.map((a, i) => (
        <Text key={i} style={{ fontWeight: 700 }}>{pdfUnits(a)}</Text>
      ))}
      {system.advice.length === 0 && system.customerLine ? <Text>{system.customerLine}</Text> : null}
    </View>
  );
}

/** The two analyses compared, older first, as cylinder changes that clear their intervals. */
function beforeAfter(a: PdfAnalysis[]) {
  const [x, y] = a;
  const [before, after] = (x.savedAtMs ?? 0) <= (y.savedAtMs ?? 0) ? [x, y] : [y, x];
  return compareResults(before.result, after.result);
}
