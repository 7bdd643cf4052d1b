'use client';
/**
 * The trace (uPlot): every view is a min/max decimation from the worker, re-asked on each zoom or pan;
 * compression events marked and labelled by cylinder; the cranking window shaded with draggable edges; a
 * cursor readout with units.
 */
import { forwardRef, useEffect, useImperativeHandle, useRef } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import type { EventMark } from '@/signal';
import { TRACE_REDRAW_MEASURE, TRACE_ZOOM_MARK } from './trace-timing';

export interface TraceSeries {
  label: string;
  unit: string;
  min: Float64Array;
  max: Float64Array;
  /** CSS variable name of the colour token. */
  token: string;
  /** Draw on the right-hand axis (sync). */
  right?: boolean;
}

export interface TraceData {
  x: Float64Array;
  series: TraceSeries[];
}

export interface TraceHandle {
  resetZoom(): void;
  zoom(factor: number): void;
  centreOn(timeS: number): void;
}

interface Props {
  range: [number, number];
  fetchView: (fromS: number, toS: number, columns: number) => Promise<TraceData | null>;
  events: EventMark[];
  window?: { startS: number; endS: number };
  onWindowChange?: (w: { startS: number; endS: number }) => void;
  highlighted?: number | null;
  /** Called each time a new decimated view is asked for (the tests count them). */
  onView?: () => void;
}

const rgb = (token: string, alpha = 1) => {
  const v = typeof document !== 'undefined' ? getComputedStyle(document.documentElement).getPropertyValue(`--${token}`).trim() : '0 0 0';
  return `rgb(${v} / ${alpha})`;
};

export const TraceChart = forwardRef<TraceHandle, Props>(function TraceChart(props, ref) {
  const host = useRef<HTMLDivElement>(null);
  const plot = useRef<uPlot | null>(null);
  const live = useRef(props);
  live.current = props;
  const win = useRef(props.window);
  win.current = props.window;
  const labels = useRef<string[]>([]);

  useImperativeHandle(ref, () => ({
    resetZoom: () => plot.current?.setScale('x', { min: live.current.range[0], max: live.current.range[1] }),
    zoom: (factor) => {
      const u = plot.current;
      if (!u) return;
      const { min = 0, max = 1 } = u.scales.x;
      const mid = (min + max) / 2;
      const half = ((max - min) / 2) * factor;
      u.setScale('x', { min: Math.max(live.current.range[0], mid - half), max: Math.min(live.current.range[1], mid + half) });
    },
    centreOn: (t) => {
      const u = plot.current;
      if (!u) return;
      const { min = 0, max = 1 } = u.scales.x;
      const half = (max - min) / 2;
      u.setScale('x', { min: t - half, max: t + half });
    },
  }));

  useEffect(() => {
    const el = host.current;
    if (!el) return;
    let disposed = false;
    let pending: ReturnType<typeof setTimeout> | null = null;
    let drag: 'start' | 'end' | null = null;
    // Set when the worker's view for the latest zoom is handed to the chart; its draw ends the redraw measure.
    let fresh = false;

    const toData = (d: TraceData): uPlot.AlignedData => [d.x as unknown as number[], ...d.series.flatMap((s) => [s.min as unknown as number[], s.max as unknown as number[]])];

    const request = (u: uPlot, min: number, max: number) => {
      if (pending) clearTimeout(pending);
      pending = setTimeout(async () => {
        live.current.onView?.();
        const d = await live.current.fetchView(min, max, Math.max(200, Math.round(u.bbox.width / devicePixelRatio)));
        if (!disposed && d) {
          fresh = true;
          // setData without resetting the scales does not draw (uPlot 1.6): draw the new view now, the zoom kept.
          u.setData(toData(d), false);
          u.redraw(true, false);
        }
      }, 40);
    };

    const drawOverlay = (u: uPlot) => {
      const { ctx } = u;
      const { top, height, left, width } = u.bbox;
      ctx.save();
      ctx.beginPath();
      ctx.rect(left, top, width, height);
      ctx.clip();
      const w = win.current;
      if (w) {
        const a = u.valToPos(w.startS, 'x', true);
        const b = u.valToPos(w.endS, 'x', true);
        ctx.fillStyle = rgb('brand', 0.08);
        ctx.fillRect(a, top, b - a, height);
        ctx.fillStyle = rgb('brand', 0.9);
        ctx.fillRect(a - 2 * devicePixelRatio, top, 4 * devicePixelRatio, height);
        ctx.fillRect(b - 2 * devicePixelRatio, top, 4 * devicePixelRatio, height);
      }
      const hl = live.current.highlighted;
      ctx.font = `bold ${12 * devicePixelRatio}px ui-monospace, monospace`;
      ctx.textAlign = 'center';
      // Labels stay readable at every zoom: when events sit closer than a label is wide, only cylinder 1's are
      // labelled (the lines stay), and no label is drawn over the one before it.
      const xs = live.current.events.map((e) => u.valToPos(e.timeS, 'x', true));
      let closest = Infinity;
      for (let k = 1; k < xs.length; k++) if (xs[k] >= left && xs[k - 1] <= left + width) closest = Math.min(closest, xs[k] - xs[k - 1]);
      const labelW = ctx.measureText('16').width + 8 * devicePixelRatio;
      const crowded = closest < labelW;
      let lastRight = -Infinity;
      for (const [k, e] of live.current.events.entries()) {
        const x = xs[k];
        if (x < left || x > left + width) continue;
        const on = hl == null || hl === e.cylinder;
        ctx.strokeStyle = rgb('event', e.used ? (on ? 0.85 : 0.2) : 0.25);
        ctx.lineWidth = (hl === e.cylinder ? 3 : 1.2) * devicePixelRatio;
        ctx.setLineDash(e.used ? [] : [4 * devicePixelRatio, 4 * devicePixelRatio]);
        ctx.beginPath();
        ctx.moveTo(x, top + 16 * devicePixelRatio);
        ctx.lineTo(x, top + height);
        ctx.stroke();
        const text = String(e.cylinder);
        const w = ctx.measureText(text).width;
        if ((crowded && e.cylinder !== 1 && hl !== e.cylinder) || x - w / 2 < lastRight + 4 * devicePixelRatio) continue;
        ctx.fillStyle = rgb('event', on ? 1 : 0.35);
        ctx.fillText(text, x, top + 12 * devicePixelRatio);
        lastRight = x + w / 2;
      }
      ctx.restore();
    };

    (async () => {
      const [r0, r1] = live.current.range;
      const first = await live.current.fetchView(r0, r1, Math.max(400, el.clientWidth));
      if (disposed || !first) return;
      labels.current = first.series.map((s) => s.label);
      const series: uPlot.Series[] = [{ label: 'Time', value: (_u, v) => (v == null ? '—' : `${v.toFixed(4)} s`) }];
      const bands: uPlot.Band[] = [];
      // Each channel is drawn as the band between its lowest and highest sample under each pixel; the readout names
      // the channel once and gives that range in its unit (the band's upper edge has no readout of its own).
      first.series.forEach((s, i) => {
        const digits = s.unit === 'V' ? 2 : 1;
        const range = (u: uPlot, v: number | null, _series: number, idx: number | null) => {
          const hi = idx == null ? null : (u.data[2 + 2 * i]?.[idx] as number | null | undefined);
          if (v == null) return '—';
          return hi == null || Math.abs(hi - v) < 10 ** -digits ? `${v.toFixed(digits)} ${s.unit}` : `${v.toFixed(digits)} to ${hi.toFixed(digits)} ${s.unit}`;
        };
        series.push({ label: s.label, stroke: rgb(s.token, 0.9), width: 1, value: range, scale: s.right ? 'r' : 'y', points: { show: false } });
        series.push({ label: `${s.label}, top of the band`, stroke: rgb(s.token, 0.9), width: 1, scale: s.right ? 'r' : 'y', points: { show: false }, class: 'trace-band-top' });
        bands.push({ series: [2 + 2 * i, 1 + 2 * i], fill: rgb(s.token, 0.35) });
      });
      const axisColor = rgb('muted');
      const u = new uPlot(
        {
          width: el.clientWidth,
          height: 320,
          series,
          bands,
          scales: { x: { time: false }, r: { auto: true } },
          axes: [
            { stroke: axisColor, grid: { stroke: rgb('line', 0.6) }, values: (_u, v) => v.map((x) => `${x.toFixed(2)} s`) },
            { stroke: axisColor, grid: { stroke: rgb('line', 0.6) }, label: `${first.series[0].label} (${first.series[0].unit})`, size: 60 },
            ...(first.series.some((s) => s.right) ? [{ side: 1 as const, scale: 'r', stroke: axisColor, grid: { show: false }, label: 'Sync (V)' }] : []),
          ],
          cursor: { drag: { x: true, y: false, setScale: true }, points: { show: false } },
          legend: { live: true },
          hooks: {
            setScale: [
              (uu, key) => {
                if (key === 'x' && uu.scales.x.min != null && uu.scales.x.max != null) {
                  performance.clearMarks(TRACE_ZOOM_MARK);
                  performance.mark(TRACE_ZOOM_MARK);
                  request(uu, uu.scales.x.min, uu.scales.x.max);
                }
              },
            ],
            draw: [
              drawOverlay,
              () => {
                if (!fresh) return;
                fresh = false;
                if (performance.getEntriesByName(TRACE_ZOOM_MARK).length) performance.measure(TRACE_REDRAW_MEASURE, TRACE_ZOOM_MARK);
              },
            ],
          },
        },
        toData(first),
        el,
      );
      plot.current = u;

      // Dragging the cranking window's edges (within 8 px) moves them instead of zooming.
      const over = u.over;
      const edgeAt = (clientX: number) => {
        const w = win.current;
        if (!w) return null;
        const x = clientX - over.getBoundingClientRect().left;
        if (Math.abs(x - u.valToPos(w.startS, 'x')) < 8) return 'start';
        if (Math.abs(x - u.valToPos(w.endS, 'x')) < 8) return 'end';
        return null;
      };
      over.addEventListener(
        'mousedown',
        (e) => {
          drag = edgeAt(e.clientX);
          if (drag) {
            e.stopPropagation();
            e.preventDefault();
          }
        },
        true,
      );
      over.addEventListener('mousemove', (e) => {
        over.style.cursor = drag || edgeAt(e.clientX) ? 'ew-resize' : '';
      });
      window.addEventListener('mousemove', (e) => {
        if (!drag || !win.current) return;
        const t = u.posToVal(e.clientX - over.getBoundingClientRect().left, 'x');
        win.current = drag === 'start' ? { ...win.current, startS: Math.min(t, win.current.endS - 0.2) } : { ...win.current, endS: Math.max(t, win.current.startS + 0.2) };
        u.redraw(false, false);
      });
      window.addEventListener('mouseup', () => {
        if (drag && win.current) live.current.onWindowChange?.(win.current);
        drag = null;
      });
    })();

    const resize = new ResizeObserver(() => plot.current?.setSize({ width: el.clientWidth, height: 320 }));
    resize.observe(el);
    return () => {
      disposed = true;
      resize.disconnect();
      plot.current?.destroy();
      plot.current = null;
    };
    // The plot is built once per capture; later props are read through refs.
  }, [props.range[0], props.range[1]]);

  useEffect(() => {
    plot.current?.redraw(false, false);
  }, [props.events, props.window, props.highlighted]);

  // Focusable, with a visible ring: the workspace's keys (+ − 0, ← →, Ctrl+Z) work as soon as it has focus, and a
  // click on the trace gives it focus.
  return (
    <div
      ref={host}
      className="w-full rounded-lg outline-offset-4 focus-visible:outline-3 focus-visible:outline-brand [&:focus]:ring-2 [&:focus]:ring-brand"
      data-testid="trace"
      tabIndex={0}
      role="group"
      aria-label="Trace. Keys: plus and minus zoom, 0 resets the zoom, left and right arrows step through the compression events."
      onMouseDown={(e) => e.currentTarget.focus({ preventScroll: true })}
    />
  );
});
