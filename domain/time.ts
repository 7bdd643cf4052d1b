/** Dates as a shop reads them: in the shop's time zone, with the zone named, the same on pages, e-mail and PDF. */

const cache = new Map<string, Intl.DateTimeFormat>();
function formatter(timeZone: string, withTime: boolean): Intl.DateTimeFormat {
  const key = `${timeZone}|${withTime}`;
  let f = cache.get(key);
  if (!f) {
    f = new Intl.DateTimeFormat('en-US', {
      timeZone,
      year: 'numeric',
      month: 'short',
      day: 'numeric',
      ...(withTime ? { hour: '2-digit', minute: '2-digit', hourCycle: 'h23' } : {}),
      timeZoneName: 'short',
    });
    cache.set(key, f);
  }
  return f;
}

/** "Dec 2, 2026, 07:30 UTC": date and time in `timeZone`, with the zone's short name. */
export function formatWhen(at: Date | string | number, timeZone: string): string {
  return formatter(timeZone, true).format(new Date(at));
}

/** "Dec 2, 2026, UTC": the date in `timeZone` (the day can differ from UTC's), with the zone's short name. */
export function formatDay(at: Date | string | number, timeZone: string): string {
  return formatter(timeZone, false).format(new Date(at));
}

/** Every zone this runtime knows, for the owner's choice (UTC first). */
export function timeZoneNames(): string[] {
  const all = typeof Intl.supportedValuesOf === 'function' ? Intl.supportedValuesOf('timeZone') : [];
  return ['UTC', ...all.filter((z) => z !== 'UTC')];
}
