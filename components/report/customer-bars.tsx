/**
 * The customer's chart: one plain bar per cylinder, drawn in HTML so it reflows at any width (390 px phones
 * included), with the weak line dashed across and a one-line legend. No intervals or status words: those are for
 * the shop.
 */
import type { CylinderResult } from '@/signal';
import { CUSTOMER_LEGEND } from '@/domain/customer-words';

/** The scale's top: 120 %, or the tallest bar rounded up. */
function topOf(cylinders: CylinderResult[]): number {
  return Math.max(120, Math.ceil(Math.max(...cylinders.map((c) => c.relativePercent ?? 0)) / 10) * 10);
}

export function CustomerBars({ cylinders, lowLimit }: { cylinders: CylinderResult[]; lowLimit: number }) {
  const top = topOf(cylinders);
  const at = (v: number) => `${(100 * Math.max(0, v)) / top}%`;
  return (
    <figure className="flex flex-col gap-2" data-testid="customer-bars">
      <ol className="flex flex-col gap-2">
        {cylinders.map((c) => {
          const look = c.status === 'low' ? 'pattern-low' : c.status === 'uncertain' ? 'pattern-uncertain' : 'pattern-ok';
          return (
            <li key={c.cylinder} className="grid grid-cols-[6.5rem_1fr] items-center gap-2">
              <span className="font-bold">Cylinder {c.cylinder}</span>
              <span className="relative h-7 rounded bg-raised" aria-hidden="true">
                {c.relativePercent !== null && <span className={`absolute inset-y-0 left-0 rounded ${look}`} style={{ width: at(c.relativePercent) }} />}
                <span className="absolute inset-y-[-4px] border-l-2 border-dashed border-limit" style={{ left: at(lowLimit) }} />
              </span>
            </li>
          );
        })}
      </ol>
      <figcaption className="text-base text-muted">{CUSTOMER_LEGEND}</figcaption>
    </figure>
  );
}
