'use client';
/**
 * The per-cylinder chart: bars in percent with their 90 % interval as whiskers, the low and upper limit lines;
 * status carried by a word and a fill pattern as well as colour; one dot per cycle for consistency. The axis
 * grows to show a figure above 100 %. Hovering a bar highlights that cylinder's events.
 */
import { type CylinderResult, percentText } from '@/signal';
import { STATUS_WORD } from './status-style';

const W = 640;
const H = 300;
const PAD = { l: 48, r: 16, t: 16, b: 64 };

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
  const n = cylinders.length;
  const plotW = W - PAD.l - PAD.r;
  const plotH = H - PAD.t - PAD.b;
  const slot = plotW / Math.max(1, n);
  const barW = Math.min(64, slot * 0.62);
  const tallest = Math.max(highLimit + 5, ...cylinders.map((c) => Math.max(c.interval?.[1] ?? 0, c.relativePercent ?? 0, ...c.perCycle)));
  const top = Math.ceil(tallest / 10) * 10;
  const y = (pct: number) => PAD.t + plotH * (1 - Math.max(0, Math.min(top, pct)) / top);
  const ticks = Array.from({ length: Math.floor(top / 25) + 1 }, (_, k) => k * 25);
  return (
    <svg viewBox={`0 0 ${W} ${H}`} role="img" aria-label={`Relative compression per cylinder: ${cylinders.map((c) => `cylinder ${c.cylinder} ${spoken(c)}`).join(', ')}`} className="h-auto w-full">
      <defs>
        <pattern id="fill-low" width="8" height="8" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
          <rect width="8" height="8" fill="rgb(var(--low) / 0.35)" />
          <rect width="4" height="8" fill="rgb(var(--low))" />
        </pattern>
        <pattern id="fill-high" width="8" height="8" patternUnits="userSpaceOnUse">
          <rect width="8" height="8" fill="rgb(var(--high) / 0.35)" />
          <rect width="8" height="4" fill="rgb(var(--high))" />
        </pattern>
        <pattern id="fill-uncertain" width="7" height="7" patternUnits="userSpaceOnUse">
          <rect width="7" height="7" fill="rgb(var(--uncertain) / 0.25)" />
          <circle cx="3.5" cy="3.5" r="1.6" fill="rgb(var(--uncertain))" />
        </pattern>
      </defs>
      {ticks.map((v) => (
        <g key={v}>
          <line x1={PAD.l} x2={W - PAD.r} y1={y(v)} y2={y(v)} stroke="rgb(var(--line))" strokeWidth="1" />
          <text x={PAD.l - 8} y={y(v) + 4} textAnchor="end" className="figures" fontSize="12" fill="rgb(var(--muted))">
            {v} %
          </text>
        </g>
      ))}
      {cylinders.map((c, i) => {
        const cx = PAD.l + slot * (i + 0.5);
        const barTop = y(c.relativePercent ?? 0);
        const fill = c.status === 'ok' ? 'rgb(var(--ok))' : `url(#fill-${c.status})`;
        const dim = highlighted != null && highlighted !== c.cylinder;
        return (
          <g
            key={c.cylinder}
            opacity={dim ? 0.45 : 1}
            onMouseEnter={() => onHover?.(c.cylinder)}
            onMouseLeave={() => onHover?.(null)}
            onFocus={() => onHover?.(c.cylinder)}
            onBlur={() => onHover?.(null)}
            tabIndex={0}
            role="listitem"
            aria-label={`Cylinder ${c.cylinder}: ${spoken(c)}`}
          >
            <rect x={cx - barW / 2} y={barTop} width={barW} height={Math.max(0, y(0) - barTop)} fill={fill} stroke={c.status === 'ok' ? 'none' : `rgb(var(--${c.status}))`} strokeWidth="2" rx="3" />
            {c.interval && (
              <g stroke="rgb(var(--ink))" strokeWidth="2" data-testid="whisker">
                <line x1={cx} x2={cx} y1={y(c.interval[0])} y2={y(c.interval[1])} />
                <line x1={cx - 8} x2={cx + 8} y1={y(c.interval[0])} y2={y(c.interval[0])} />
                <line x1={cx - 8} x2={cx + 8} y1={y(c.interval[1])} y2={y(c.interval[1])} />
              </g>
            )}
            {c.perCycle.map((v, k) => (
              <circle key={k} cx={cx + barW / 2 + 7} cy={y(v)} r="3" fill="rgb(var(--ink))" opacity="0.7" />
            ))}
            <text x={cx + barW / 2 + 4} y={barTop - 6} textAnchor="start" className="figures" fontSize="14" fontWeight="700" fill="rgb(var(--ink))">
              {percentText(c.relativePercent, 0)}
            </text>
            <text x={cx} y={H - PAD.b + 20} textAnchor="middle" fontSize="15" fontWeight="700" fill="rgb(var(--ink))">
              Cyl {c.cylinder}
            </text>
            <text x={cx} y={H - PAD.b + 40} textAnchor="middle" fontSize="13" fontWeight="700" fill={`rgb(var(--${c.status}))`}>
              {STATUS_WORD[c.status]}
            </text>
          </g>
        );
      })}
      <line x1={PAD.l} x2={W - PAD.r} y1={y(highLimit)} y2={y(highLimit)} stroke="rgb(var(--limit))" strokeWidth="1.5" strokeDasharray="3 5" />
      <text x={W - PAD.r - 4} y={y(highLimit) - 5} textAnchor="end" fontSize="12" fontWeight="700" fill="rgb(var(--limit))">
        upper limit {highLimit} %
      </text>
      <line x1={PAD.l} x2={W - PAD.r} y1={y(lowLimit)} y2={y(lowLimit)} stroke="rgb(var(--limit))" strokeWidth="2.5" strokeDasharray="8 5" />
      <rect x={PAD.l + 2} y={y(lowLimit) + 3} width="92" height="16" rx="3" fill="rgb(var(--surface))" opacity="0.9" />
      <text x={PAD.l + 6} y={y(lowLimit) + 15} fontSize="12" fontWeight="700" fill="rgb(var(--limit))">
        low limit {lowLimit} %
      </text>
    </svg>
  );
}

/** A cylinder's figure, interval and status in words, for screen readers. */
function spoken(c: CylinderResult): string {
  if (c.relativePercent === null) return `no figure, ${c.status}`;
  const range = c.interval ? `, 90 percent interval ${c.interval[0]} to ${c.interval[1]}` : '';
  return `${c.relativePercent} percent${range}, ${c.status}`;
}
