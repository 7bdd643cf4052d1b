'use client';
/**
 * The per-cylinder chart, drawn with uPlot like the trace: the bars are series (one per status, each with its
 * fill pattern so status never rests on colour alone), the 90 % interval is a whisker series, the low and upper
 * limits and the per-cycle dots are drawn on top, and the axis grows to show a figure above 100 %. Below it, a
 * focusable line per cylinder carries the figure, its interval and the status word; focusing or hovering one
 * highlights that cylinder's events in the trace.
 */
import { useEffect, useRef } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import { type CylinderResult, type CylinderStatus, intervalText, percentText } from '@/signal';
import { STATUS_TEXT, STATUS_WORD } from './status-style';

const HEIGHT = 300;
const STATUSES: CylinderStatus[] = ['ok', 'low', 'high', 'uncertain'];

const rgb = (token: string, alpha = 1) => {
  const v = typeof document !== 'undefined' ? getComputedStyle(document.documentElement).getPropertyValue(`--${token}`).trim() : '0 0 0';
  return `rgb(${v} / ${alpha})`;
};

/** A fill pattern per status: solid (ok), diagonal hatch (low), horizontal bands (high), dots (uncertain). */
function patternFor(ctx: CanvasRenderingContext2D, status: CylinderStatus): CanvasPattern | string {
  if (status === 'ok') return rgb('ok');
  const tile = document.createElement('canvas');
  const s = Math.round(8 * devicePixelRatio);
  tile.width = tile.height = s;
  const t = tile.getContext('2d')!;
  t.fillStyle = rgb(status, 0.3);
  t.fillRect(0, 0, s, s);
  t.fillStyle = rgb(status);
  t.strokeStyle = rgb(status);
  if (status === 'low') {
    t.lineWidth = s / 3;
    t.beginPath();
    t.moveTo(-s, s * 2);
    t.lineTo(s * 2, -s);
    t.moveTo(0, s);
    t.lineTo(s, 0);
    t.stroke();
  } else if (status === 'high') {
    t.fillRect(0, 0, s, s / 2);
  } else {
    t.beginPath();
    t.arc(s / 2, s / 2, s / 5, 0, 2 * Math.PI);
    t.fill();
  }
  return ctx.createPattern(tile, 'repeat') ?? rgb(status);
}

export function CylinderBars({
  cylinders,
  lowLimit,
  highLimit = 110,
  onHover,
  highlighted,
}: {
  cylinders: CylinderResult[];
  lowLimit: number;
  highLimit?: number;
  onHover?: (cylinder: number | null) => void;
  highlighted?: number | null;
}) {
  const host = useRef<HTMLDivElement>(null);
  const hl = useRef(highlighted);
  hl.current = highlighted;
  const plot = useRef<uPlot | null>(null);

  useEffect(() => {
    const el = host.current;
    if (!el) return;
    const n = cylinders.length;
    const tallest = Math.max(highLimit + 5, ...cylinders.map((c) => Math.max(c.interval?.[1] ?? 0, c.relativePercent ?? 0, ...c.perCycle)));
    const ceiling = Math.ceil(tallest / 10) * 10;
    const xs = cylinders.map((_, i) => i + 1);
    const byStatus = STATUSES.map((st) => cylinders.map((c) => (c.status === st ? c.relativePercent : null)));
    const data: uPlot.AlignedData = [xs, ...byStatus, cylinders.map((c) => c.interval?.[1] ?? null)];
    const bars = uPlot.paths.bars!({ size: [0.6, 64] });
    const whiskers: uPlot.Series.PathBuilder = (u, seriesIdx, idx0, idx1) => {
      const path = new Path2D();
      const cap = 8 * devicePixelRatio;
      for (let i = idx0; i <= idx1; i++) {
        const iv = cylinders[i]?.interval;
        if (!iv) continue;
        const x = u.valToPos(i + 1, 'x', true);
        const y0 = u.valToPos(iv[0], 'y', true);
        const y1 = u.valToPos(iv[1], 'y', true);
        path.moveTo(x, y0);
        path.lineTo(x, y1);
        path.moveTo(x - cap, y0);
        path.lineTo(x + cap, y0);
        path.moveTo(x - cap, y1);
        path.lineTo(x + cap, y1);
      }
      void seriesIdx;
      return { stroke: path, fill: undefined, clip: undefined, flags: 0 } as unknown as uPlot.Series.Paths;
    };
    const overlay = (u: uPlot) => {
      const ctx = u.ctx;
      const { left, width } = u.bbox;
      ctx.save();
      // Per-cycle dots beside each bar.
      ctx.fillStyle = rgb('ink', 0.7);
      cylinders.forEach((c, i) => {
        const x = u.valToPos(i + 1, 'x', true) + 0.32 * (u.valToPos(2, 'x', true) - u.valToPos(1, 'x', true));
        for (const v of c.perCycle) {
          ctx.beginPath();
          ctx.arc(x, u.valToPos(v, 'y', true), 3 * devicePixelRatio, 0, 2 * Math.PI);
          ctx.fill();
        }
      });
      // Figures above the bars (and above their whiskers), dimmed when another cylinder is highlighted.
      ctx.font = `bold ${13 * devicePixelRatio}px ui-monospace, monospace`;
      ctx.textAlign = 'center';
      cylinders.forEach((c, i) => {
        const x = u.valToPos(i + 1, 'x', true);
        const y = u.valToPos(Math.max(c.relativePercent ?? 0, c.interval?.[1] ?? 0), 'y', true) - 6 * devicePixelRatio;
        ctx.fillStyle = rgb('ink', hl.current == null || hl.current === c.cylinder ? 1 : 0.35);
        ctx.fillText(percentText(c.relativePercent, 0), x, y);
      });
      // The limits.
      ctx.strokeStyle = rgb('limit');
      ctx.fillStyle = rgb('limit');
      ctx.font = `bold ${12 * devicePixelRatio}px system-ui, sans-serif`;
      ctx.textAlign = 'left';
      for (const [value, dash, text] of [
        [lowLimit, [8, 5], `low limit ${lowLimit} %`],
        [highLimit, [3, 5], `upper limit ${highLimit} %`],
      ] as const) {
        const y = u.valToPos(value, 'y', true);
        ctx.setLineDash(dash.map((d) => d * devicePixelRatio));
        ctx.lineWidth = (value === lowLimit ? 2.5 : 1.5) * devicePixelRatio;
        ctx.beginPath();
        ctx.moveTo(left, y);
        ctx.lineTo(left + width, y);
        ctx.stroke();
        // The label on a backing of the page's surface, so a bar or whisker behind it never hides it.
        const tx = left + 6 * devicePixelRatio;
        const ty = y - 5 * devicePixelRatio;
        const pad = 3 * devicePixelRatio;
        ctx.fillStyle = rgb('surface', 0.9);
        ctx.fillRect(tx - pad, ty - 12 * devicePixelRatio, ctx.measureText(text).width + 2 * pad, 15 * devicePixelRatio);
        ctx.fillStyle = rgb('limit');
        ctx.fillText(text, tx, ty);
      }
      ctx.restore();
    };
    const u = new uPlot(
      {
        width: Math.max(280, el.clientWidth || 640),
        height: HEIGHT,
        legend: { show: false },
        cursor: { show: false },
        select: { show: false, left: 0, top: 0, width: 0, height: 0 },
        scales: { x: { time: false, range: [0.4, n + 0.6] }, y: { range: [0, ceiling] } },
        axes: [
          {
            stroke: rgb('ink'),
            grid: { show: false },
            ticks: { show: false },
            splits: () => xs,
            values: (_u, vals) => vals.map((v) => (Number.isInteger(v) && v >= 1 && v <= n ? `Cyl ${cylinders[v - 1].cylinder}` : '')),
            font: `bold ${14}px system-ui, sans-serif`,
          },
          { stroke: rgb('muted'), grid: { stroke: rgb('line') }, splits: () => Array.from({ length: Math.floor(ceiling / 25) + 1 }, (_, k) => k * 25), values: (_u, vals) => vals.map((v) => `${v} %`) },
        ],
        series: [
          {},
          ...STATUSES.map((st) => ({
            label: st,
            paths: bars,
            points: { show: false },
            fill: (self: uPlot) => patternFor(self.ctx, st),
            stroke: st === 'ok' ? rgb('ok') : rgb(st),
            width: 2,
          })),
          { label: '90 % interval', paths: whiskers, points: { show: false }, stroke: rgb('ink'), width: 2 },
        ],
        hooks: { draw: [overlay] },
      },
      data,
      el,
    );
    plot.current = u;
    const resize = new ResizeObserver(() => u.setSize({ width: Math.max(280, el.clientWidth), height: HEIGHT }));
    resize.observe(el);
    return () => {
      resize.disconnect();
      u.destroy();
      plot.current = null;
    };
  }, [cylinders, lowLimit, highLimit]);

  useEffect(() => {
    plot.current?.redraw(false);
  }, [highlighted]);

  return (
    <figure className="flex flex-col gap-2" aria-label="Relative compression per cylinder">
      <div ref={host} className="w-full" aria-hidden="true" data-testid="cylinder-plot" />
      <ol className="flex flex-wrap gap-2" aria-label="Per-cylinder figures">
        {cylinders.map((c) => (
          <li key={c.cylinder}>
            <button
              type="button"
              className={`figures rounded-lg border px-2 py-1 text-sm ${highlighted === c.cylinder ? 'border-brand' : 'border-line'}`}
              onMouseEnter={() => onHover?.(c.cylinder)}
              onMouseLeave={() => onHover?.(null)}
              onFocus={() => onHover?.(c.cylinder)}
              onBlur={() => onHover?.(null)}
              aria-label={`Cylinder ${c.cylinder}: ${spoken(c)}`}
              data-testid="whisker"
            >
              Cyl {c.cylinder}: {percentText(c.relativePercent)} % ({intervalText(c.interval)}) <strong className={STATUS_TEXT[c.status]}>{STATUS_WORD[c.status]}</strong>
            </button>
          </li>
        ))}
      </ol>
      <figcaption className="text-sm text-muted" data-testid="bars-legend">
        Bars: each cylinder’s compression relative to the healthy ones (%). Whiskers: its 90 % interval. Dots: each engine cycle’s figure. Dashed lines: the low and upper limits.
      </figcaption>
    </figure>
  );
}

/** A cylinder's figure, interval and status in words, for screen readers. */
function spoken(c: CylinderResult): string {
  if (c.relativePercent === null) return `no figure, ${c.status}`;
  const range = c.interval ? `, 90 percent interval ${c.interval[0]} to ${c.interval[1]}` : '';
  return `${c.relativePercent} percent${range}, ${c.status}`;
}
