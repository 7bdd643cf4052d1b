/** A saved analysis's settings in words, where they differ from the job's engine and default limits. */
import type { AnalysisSettingsValues } from '@/domain/analysis-settings';
import { METHOD_NAMES } from '@/signal';

export function settingsDifferences(saved: AnalysisSettingsValues, base: AnalysisSettingsValues): string[] {
  const out: string[] = [];
  if (saved.engine.cylinders !== base.engine.cylinders) out.push(`${saved.engine.cylinders} cylinders`);
  if (saved.engine.firingOrder.join('-') !== base.engine.firingOrder.join('-')) out.push(`firing order ${saved.engine.firingOrder.join('-')}`);
  if (saved.method !== base.method) out.push(`method ${saved.method === 'auto' ? 'chosen automatically' : METHOD_NAMES[saved.method]}`);
  if (saved.teeth && saved.teeth !== base.teeth) out.push(`crank wheel ${saved.teeth}`);
  if (saved.lowLimitPercent !== base.lowLimitPercent) out.push(`low limit ${saved.lowLimitPercent} %`);
  if (saved.highLimitPercent !== base.highLimitPercent) out.push(`upper limit ${saved.highLimitPercent} %`);
  if (saved.spreadLimitPercent !== base.spreadLimitPercent) out.push(`spread limit ${saved.spreadLimitPercent} points`);
  if (saved.window) out.push(`cranking window ${saved.window.startS.toFixed(2)}–${saved.window.endS.toFixed(2)} s set by hand`);
  if (saved.rotation) out.push(`cylinder assignment stepped ${saved.rotation}`);
  if (saved.sensor !== base.sensor) out.push(`sensor read as ${saved.sensor}`);
  if (saved.mapping) out.push('columns named by hand');
  return out;
}

/** Whether two settings, or two parts of them (an engine setup), are the same choice (key order and absent keys aside). */
export function sameSettings<T extends AnalysisSettingsValues | AnalysisSettingsValues['engine']>(a: T, b: T): boolean {
  const canon = (v: unknown): unknown =>
    v && typeof v === 'object' && !Array.isArray(v) ? Object.fromEntries(Object.entries(v as Record<string, unknown>).filter(([, x]) => x !== undefined).sort(([p], [q]) => p.localeCompare(q)).map(([k, x]) => [k, canon(x)])) : Array.isArray(v) ? v.map(canon) : v;
  return JSON.stringify(canon(a)) === JSON.stringify(canon(b));
}
