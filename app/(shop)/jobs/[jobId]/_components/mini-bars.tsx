/** A small per-cylinder sparkline of a saved result: bar heights with the status shown by fill pattern. */
interface Mini {
  cylinder: number;
  relativePercent: number | null;
  status: 'ok' | 'low' | 'high' | 'uncertain';
}

export function MiniBars({ cylinders, label }: { cylinders: Mini[]; label: string }) {
  const w = 10;
  const gap = 3;
  const h = 32;
  const cls = { ok: 'pattern-ok', low: 'pattern-low', high: 'pattern-high', uncertain: 'pattern-uncertain' } as const;
  return (
    <div role="img" aria-label={label} className="flex items-end" style={{ height: h, gap }}>
      {cylinders.map((c) => (
        <span key={c.cylinder} className={`${cls[c.status]} inline-block rounded-sm`} style={{ width: w, height: Math.max(3, (h * (c.relativePercent ?? 0)) / 100) }} />
      ))}
    </div>
  );
}
