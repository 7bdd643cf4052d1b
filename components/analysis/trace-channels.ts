/** The trace's channels in the order they are drawn, with their units and colour tokens. */
import type { TraceChannel } from '@/workers/analysis-api';

export const CHANNELS: { channel: TraceChannel; label: string; unit: string; token: string; right?: boolean }[] = [
  { channel: 'current', label: 'Starter current', unit: 'A', token: 'brand' },
  { channel: 'crank', label: 'Crank sensor', unit: 'V', token: 'ink' },
  { channel: 'rpm', label: 'Engine speed', unit: 'rpm', token: 'brand' },
  { channel: 'toothPeriod', label: 'Tooth period', unit: 'ms', token: 'brand' },
  { channel: 'battery', label: 'Battery', unit: 'V', token: 'ink' },
  { channel: 'sync', label: 'Sync', unit: 'V', token: 'sync', right: true },
];
