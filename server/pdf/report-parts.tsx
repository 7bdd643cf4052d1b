/**
 * The report PDF's parts (React PDF): colours and styles, the per-cylinder chart and the trace excerpt drawn as
 * vectors, and the figures table. report-document.tsx lays them out.
 */
import { G, Line, Polyline, Rect, StyleSheet, Svg, Text, View } from '@react-pdf/renderer';
import { type AnalysisResult, intervalText, percentText, RAW_LABELS } from '@/signal';
import type { TraceExcerpt } from '@/domain/trace-excerpt';
import { MONO_FONTS, TEXT_FONTS } from './fonts';
import { LIGHT_HEX } from '@/tailwind.config';
import { STATUS_WORDS } from '@/signal';

/** The light theme's colours (tailwind.config.ts), as the PDF takes them. */
export const C = LIGHT_HEX;

export const s = StyleSheet.create({
  page: { fontFamily: TEXT_FONTS, fontSize: 9.5, color: C.ink, paddingTop: 36, paddingBottom: 48, paddingHorizontal: 40 },
  // Line height sits on the body, not the page: inherited from the page it hides render-prop text (react-pdf 4.9).
  body: { lineHeight: 1.35 },
  header: { flexDirection: 'row', justifyContent: 'space-between', alignItems: 'flex-end', borderBottomWidth: 2, borderBottomColor: C.brand, paddingBottom: 6, marginBottom: 10 },
  shop: { fontSize: 15, fontWeight: 700 },
  h1: { fontSize: 12.5, fontWeight: 700, color: C.brand },
  h2: { fontSize: 11, fontWeight: 700, marginTop: 10, marginBottom: 4 },
  mono: { fontFamily: MONO_FONTS, fontSize: 8.5 },
  row: { flexDirection: 'row' },
  cellLabel: { width: 130, color: C.muted },
  table: { borderWidth: 1, borderColor: C.line, marginTop: 4 },
  th: { flexDirection: 'row', backgroundColor: C.raised, fontWeight: 700, fontSize: 8.5 },
  tr: { flexDirection: 'row', borderTopWidth: 1, borderTopColor: C.line, fontSize: 8.5 },
  td: { paddingVertical: 2.5, paddingHorizontal: 4 },
  footerLeft: { position: 'absolute', bottom: 20, left: 40, fontSize: 7.5, color: C.muted },
  footerRight: { position: 'absolute', bottom: 20, right: 40, fontSize: 7.5, color: C.muted },
  small: { fontSize: 8, color: C.muted },
  verdict: { fontSize: 11, fontWeight: 700 },
});

export const STATUS_COLOR = { ok: C.ok, low: C.low, high: C.high, uncertain: C.uncertain } as const;

/** Bars in percent with the low-limit line; low is hatched, uncertain dotted, ok solid; a word under each. */
export function ChartSvg({ r, width = 250, height = 150 }: { r: AnalysisResult; width?: number; height?: number }) {
  const padL = 26;
  const padB = 30;
  const plotW = width - padL - 6;
  const plotH = height - padB - 8;
  const n = r.cylinders.length;
  const slot = plotW / n;
  const bw = Math.min(26, slot * 0.6);
  const high = r.settings.highLimitPercent ?? 110;
  const ceiling = Math.ceil(Math.max(high + 5, ...r.cylinders.map((c) => Math.max(c.interval?.[1] ?? 0, c.relativePercent ?? 0))) / 10) * 10;
  const y = (p: number) => 8 + plotH * (1 - Math.min(ceiling, Math.max(0, p)) / ceiling);
  const limit = r.settings.lowLimitPercent;
  return (
    <Svg width={width} height={height}>
      {[0, 50, 100].map((v) => (
        <G key={v}>
          <Line x1={padL} x2={width - 6} y1={y(v)} y2={y(v)} stroke={C.line} strokeWidth={0.5} />
          <Text x={padL - 3} y={y(v) + 2.5} style={{ fontSize: 6.5, fontFamily: 'AtkinsonMono' }} fill={C.muted} textAnchor="end">
            {`${v}%`}
          </Text>
        </G>
      ))}
      {r.cylinders.map((c, i) => {
        const x = padL + slot * i + (slot - bw) / 2;
        const top = y(c.relativePercent ?? 0);
        const h = Math.max(0, y(0) - top);
        const color = STATUS_COLOR[c.status];
        const hatch: number[] = [];
        if (c.status === 'low' || c.status === 'high') for (let k = -h; k < bw; k += 4) hatch.push(k);
        return (
          <G key={c.cylinder}>
            <Rect x={x} y={top} width={bw} height={h} fill={c.status === 'ok' ? color : '#FFFFFF'} stroke={color} strokeWidth={1} />
            {hatch.map((k) => {
              const x1 = x + Math.max(0, k);
              const y1 = top + h - Math.max(0, -k);
              const len = Math.min(bw - Math.max(0, k), h - Math.max(0, -k));
              return <Line key={k} x1={x1} y1={y1} x2={x1 + len} y2={y1 - len} stroke={color} strokeWidth={1.2} />;
            })}
            {c.interval && (
              <G>
                <Line x1={x + bw / 2} x2={x + bw / 2} y1={y(c.interval[0])} y2={y(c.interval[1])} stroke={C.ink} strokeWidth={1} />
                <Line x1={x + bw / 2 - 4} x2={x + bw / 2 + 4} y1={y(c.interval[0])} y2={y(c.interval[0])} stroke={C.ink} strokeWidth={1} />
                <Line x1={x + bw / 2 - 4} x2={x + bw / 2 + 4} y1={y(c.interval[1])} y2={y(c.interval[1])} stroke={C.ink} strokeWidth={1} />
              </G>
            )}
            {c.status === 'uncertain' &&
              Array.from({ length: Math.floor(h / 5) }, (_, k) => <Rect key={k} x={x + bw / 2 - 1} y={top + 3 + k * 5} width={2} height={2} fill={color} />)}
            <Text x={x + bw / 2} y={Math.min(top, c.interval ? y(c.interval[1]) : top) - 2.5} style={{ fontSize: 7, fontFamily: 'AtkinsonMono' }} fill={C.ink} textAnchor="middle">
              {percentText(c.relativePercent, 0)}
            </Text>
            <Text x={x + bw / 2} y={height - padB + 11} style={{ fontSize: 7.5, fontWeight: 700 }} fill={C.ink} textAnchor="middle">
              {`Cyl ${c.cylinder}`}
            </Text>
            <Text x={x + bw / 2} y={height - padB + 21} style={{ fontSize: 7, fontWeight: 700 }} fill={color} textAnchor="middle">
              {STATUS_WORDS[c.status]}
            </Text>
          </G>
        );
      })}
      <Line x1={padL} x2={width - 6} y1={y(limit)} y2={y(limit)} stroke={C.limit} strokeWidth={1.2} strokeDasharray="4 2" />
      <Text x={padL + 2} y={y(limit) - 2} style={{ fontSize: 6.5 }} fill={C.limit}>
        {`low limit ${limit}%`}
      </Text>
    </Svg>
  );
}

export function TraceSvg({ trace, width = 515, height = 110 }: { trace: TraceExcerpt; width?: number; height?: number }) {
  const t0 = trace.t[0];
  const t1 = trace.t[trace.t.length - 1];
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of trace.v) {
    lo = Math.min(lo, v);
    hi = Math.max(hi, v);
  }
  const pad = (hi - lo) * 0.08 || 1;
  const X = (t: number) => 30 + ((t - t0) / (t1 - t0 || 1)) * (width - 36);
  const Y = (v: number) => 12 + (height - 26) * (1 - (v - lo + pad) / (hi - lo + 2 * pad));
  const points = trace.t.map((t, i) => `${X(t).toFixed(1)},${Y(trace.v[i]).toFixed(1)}`).join(' ');
  return (
    <Svg width={width} height={height}>
      <Rect x={30} y={12} width={width - 36} height={height - 26} fill="#FFFFFF" stroke={C.line} strokeWidth={0.5} />
      {trace.events
        .filter((e) => e.timeS >= t0 && e.timeS <= t1)
        .map((e, i) => (
          <G key={i}>
            <Line x1={X(e.timeS)} x2={X(e.timeS)} y1={12} y2={height - 14} stroke={C.event} strokeWidth={0.6} />
            <Text x={X(e.timeS)} y={9} style={{ fontSize: 6.5, fontFamily: 'AtkinsonMono' }} fill={C.event} textAnchor="middle">
              {String(e.cylinder)}
            </Text>
          </G>
        ))}
      <Polyline points={points} fill="none" stroke={C.brand} strokeWidth={0.8} />
      <Text x={2} y={16} style={{ fontSize: 6.5 }} fill={C.muted}>
        {trace.unit}
      </Text>
      <Text x={30} y={height - 3} style={{ fontSize: 6.5, fontFamily: 'AtkinsonMono' }} fill={C.muted}>
        {`${t0.toFixed(2)} s`}
      </Text>
      <Text x={width - 6} y={height - 3} style={{ fontSize: 6.5, fontFamily: 'AtkinsonMono' }} fill={C.muted} textAnchor="end">
        {`${t1.toFixed(2)} s`}
      </Text>
    </Svg>
  );
}

export function Figures({ r }: { r: AnalysisResult }) {
  const cols = [
    ['Cylinder', 50],
    ['Relative', 55],
    ['90 % interval', 75],
    ['Status', 60],
    [RAW_LABELS[r.rawUnit], 75],
    ['Plain index', 70],
    ['Cycle spread', 70],
    ['Events used / rejected', 60],
  ] as const;
  return (
    <View style={s.table}>
      <View style={s.th}>
        {cols.map(([l, w]) => (
          <Text key={l} style={[s.td, { width: w }]}>
            {l}
          </Text>
        ))}
      </View>
      {r.cylinders.map((c) => (
        <View key={c.cylinder} style={s.tr}>
          <Text style={[s.td, { width: 50 }]}>{c.cylinder}</Text>
          <Text style={[s.td, s.mono, { width: 55 }]}>{`${percentText(c.relativePercent)} %`}</Text>
          <Text style={[s.td, s.mono, { width: 75 }]}>{`${intervalText(c.interval)} %`}</Text>
          <Text style={[s.td, { width: 60, color: STATUS_COLOR[c.status], fontWeight: 700 }]}>{c.status}</Text>
          <Text style={[s.td, s.mono, { width: 75 }]}>{`${c.raw.toFixed(1)} ${r.rawUnit}`}</Text>
          <Text style={[s.td, s.mono, { width: 70 }]}>{`${percentText(c.plainPercent)} %`}</Text>
          <Text style={[s.td, s.mono, { width: 70 }]}>{`± ${c.spreadPercent.toFixed(1)}`}</Text>
          <Text style={[s.td, s.mono, { width: 60 }]}>{`${c.events} / ${c.rejected}`}</Text>
        </View>
      ))}
    </View>
  );
}
