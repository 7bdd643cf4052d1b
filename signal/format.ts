/** Figures as text, one rule for the screen, the PDF and the command line. */

/** A relative figure in percent, or a dash when the capture gave none (no compression to compare). */
export function percentText(v: number | null, digits = 1): string {
  return v === null ? '—' : v.toFixed(digits);
}

/** The method choices a user can make, `auto` first. */
export const METHOD_CHOICES = ['auto', 'current', 'crank-speed', 'event-duration', 'battery'] as const;

/** The method in words. */
export const METHOD_NAMES = { current: 'starter current', 'crank-speed': 'crank speed', 'event-duration': 'event duration', battery: 'battery voltage' } as const;

/** The method's name before a noun: "the starter-current method". */
export function methodAdjective(method: keyof typeof METHOD_NAMES): string {
  return METHOD_NAMES[method].replace(/ /g, '-');
}

/** The method as a choice in a list: "Starter current"; event duration says it reads any wheel. */
export function methodLabel(method: keyof typeof METHOD_NAMES): string {
  const name = METHOD_NAMES[method];
  return `${name[0].toUpperCase()}${name.slice(1)}${method === 'event-duration' ? ' (any wheel)' : ''}`;
}

/** The verdict in a sentence (without its full stop), the same on the screen, in the PDF and on the command line. */
export const VERDICT_WORDS = {
  ok: 'No cylinder below the low limit',
  low: 'At least one cylinder is below the low limit',
  high: 'At least one cylinder reads above the upper limit',
  uncertain: 'Not enough good evidence to rank the cylinders',
} as const;

/** A cylinder's status as printed beside its figure: the two a reader must not miss in capitals. */
export const STATUS_WORDS = { ok: 'ok', low: 'LOW', high: 'HIGH', uncertain: 'uncertain' } as const;

/** What the raw figure of each unit measures, as a column heading. */
export const RAW_LABELS = { A: 'Current rise', V: 'Voltage swing', rpm: 'Speed dip', ms: 'Event time' } as const;

/** Where the cylinder numbers come from, in a short phrase. */
export function identityWords(identity: 'sync' | 'cam' | 'injector' | 'coil' | 'assumed'): string {
  return {
    sync: 'from the cylinder 1 sync signal',
    cam: 'from the cam channel',
    injector: 'from the cylinder 1 injector output',
    coil: 'from the cylinder 1 coil output',
    assumed: 'assumed from the firing order (no sync)',
  }[identity];
}
/** A 90 % interval as "86.0–93.0", or a dash. */
export function intervalText(iv: [number, number] | null): string {
  return iv ? `${iv[0].toFixed(1)}–${iv[1].toFixed(1)}` : '—';
}
