/** Which methods a capture's channels allow, and why not where they do not: a disabled choice says its reason. */
import type { Method } from '@/signal';
import type { TraceChannel } from '@/workers/analysis-api';

const NEEDS: Record<Method, { any: TraceChannel[]; missing: string }> = {
  current: { any: ['current'], missing: 'no starter-current channel in this capture' },
  'crank-speed': { any: ['crank', 'toothPeriod', 'rpm'], missing: 'no crank sensor, tooth or engine-speed channel in this capture' },
  'event-duration': { any: ['crank', 'toothPeriod'], missing: 'no crank sensor or tooth channel in this capture' },
  battery: { any: ['battery'], missing: 'no battery-voltage channel in this capture' },
};

/** The reason each method cannot run on these channels, or null where it can; all null while the channels are unknown. */
export function methodBlocks(traces: TraceChannel[] | undefined): Record<Method, string | null> {
  const out = {} as Record<Method, string | null>;
  for (const [m, need] of Object.entries(NEEDS) as [Method, (typeof NEEDS)[Method]][]) {
    out[m] = !traces || need.any.some((c) => traces.includes(c)) ? null : need.missing;
  }
  return out;
}
