'use client';
/**
 * The per-cylinder chart: bars in percent with the low-limit line; status carried by a word and a fill pattern
 * as well as colour; one dot per cycle for consistency. Hovering a bar highlights that cylinder's events.
 */
import { type CylinderResult, percentText } from '@/signal';

const W = 640;
const H = 300;
const PAD = { l: 48, r: 16, t: 16, b: 64 };

export function CylinderBars({
  cylinders,
  lowLimit,
  onHover,
  highlighted,
}: {
  cylinders: CylinderResult[];
  lowLimit: number;
  onHover?: (cylinder: number | null) => void;
  highlighted?: number | null;
}) {
  const n = cylinders.length;
  const plotW = W - PAD.l - PAD.r;
  const plotH = H - PAD.t - PAD.b;
  const slot = plotW / Math.max(1, n);
  const barW = Math.min(64, slot * 0.62);
  const y = (pct: number) => PAD.t + plotH * (1 - Math.max(0, Math.min(110, pct)) / 110);
  return (
    <svg viewBox={`0 0 ${W} ${H}`} role="img" aria-label={`Relative compression per cylinder: ${cylinders.map((c) => `cylinder ${c.cylinder} ${c.relativePercent}% ${c.status}`).join(', ')}`} className="h-auto w-full">
      <defs>
        <pattern id="fill-low" width="8" height="8" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
          <rect width="8" height="8" fill="rgb(var(--low) / 0.35)" />
          <rect width="4" height="8" fill="rgb(var(--low))" />
        </pattern>
        <pattern id="fill-uncertain" width="7" height="7" patternUnits="userSpaceOnUse">
          <rect width="7" height="7" fill="rgb(var(--uncertain) / 0.25)" />
          <circle cx="3.5" cy="3.5" r="1.6" fill="rgb(var(--uncertain))" />
        </pattern>
      </defs>
      {[0, 25, 50, 75, 100].map((v) => (
        <g key={v}>
          <line x1={PAD.l} x2={W - PAD.r} y1={y(v)} y2={y(v)} stroke="rgb(var(--line))" strokeWidth="1" />
          <text x={PAD.l - 8} y={y(v) + 4} textAnchor="end" className="figures" fontSize="12" fill="rgb(var(--muted))">
            {v} %
          </text>
        </g>
      ))}
      {cylinders.map((c, i) => {
        const cx = PAD.l + slot * (i + 0.5);
        const top = y(c.relativePercent ?? 0);
        const fill = c.status === 'low' ? 'url(#fill-low)' : c.status === 'uncertain' ? 'url(#fill-uncertain)' : 'rgb(var(--ok))';
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
            aria-label={`Cylinder ${c.cylinder}: ${c.relativePercent === null ? 'no figure' : `${c.relativePercent} percent`}, ${c.status}`}
          >
            <rect x={cx - barW / 2} y={top} width={barW} height={Math.max(0, y(0) - top)} fill={fill} stroke={c.status === 'ok' ? 'none' : `rgb(var(--${c.status}))`} strokeWidth="2" rx="3" />
            {c.perCycle.map((v, k) => (
              <circle key={k} cx={cx + barW / 2 + 7} cy={y(v)} r="3" fill="rgb(var(--ink))" opacity="0.7" />
            ))}
            <text x={cx} y={top - 6} textAnchor="middle" className="figures" fontSize="14" fontWeight="700" fill="rgb(var(--ink))">
              {percentText(c.relativePercent, 0)}
            </text>
            <text x={cx} y={H - PAD.b + 20} textAnchor="middle" fontSize="15" fontWeight="700" fill="rgb(var(--ink))">
              Cyl {c.cylinder}
            </text>
            <text x={cx} y={H - PAD.b + 40} textAnchor="middle" fontSize="13" fontWeight="700" fill={`rgb(var(--${c.status}))`}>
              {c.status === 'low' ? '▼ low' : c.status === 'uncertain' ? '? uncertain' : '✓ ok'}
            </text>
          </g>
        );
      })}
      <line x1={PAD.l} x2={W - PAD.r} y1={y(lowLimit)} y2={y(lowLimit)} stroke="rgb(var(--limit))" strokeWidth="2.5" strokeDasharray="8 5" />
      <rect x={PAD.l + 2} y={y(lowLimit) + 3} width="92" height="16" rx="3" fill="rgb(var(--surface))" opacity="0.9" />
      <text x={PAD.l + 6} y={y(lowLimit) + 15} fontSize="12" fontWeight="700" fill="rgb(var(--limit))">
        low limit {lowLimit} %
      </text>
    </svg>
  );
}
