/** A shop's own conventions: the time zone every date is shown in, and the temperature unit. */
import { z } from 'zod';

export const TEMPERATURE_UNITS = ['C', 'F'] as const;
export type TemperatureUnit = (typeof TEMPERATURE_UNITS)[number];

/** True for a zone name this runtime's time-zone database knows (IANA names such as Europe/Berlin, or UTC). */
export function isTimeZone(name: string): boolean {
  try {
    new Intl.DateTimeFormat('en', { timeZone: name });
    return true;
  } catch {
    return false;
  }
}

export const timeZoneSchema = z
  .string()
  .trim()
  .max(64)
  .refine(isTimeZone, 'Choose a time zone from the list (for example Europe/Berlin or America/Chicago).');

export const shopSettingsSchema = z.object({
  timeZone: timeZoneSchema,
  temperatureUnit: z.enum(TEMPERATURE_UNITS, { message: 'Choose °C or °F.' }),
});
export type ShopSettings = z.infer<typeof shopSettingsSchema>;

/** Until an owner chooses: coordinated universal time and degrees Celsius. */
export const DEFAULT_SHOP_SETTINGS: ShopSettings = { timeZone: 'UTC', temperatureUnit: 'C' };

/** A shop's settings from its stored row (null columns or no row: the defaults). */
export function shopSettingsFrom(row: { timeZone: string | null; temperatureUnit: string | null } | undefined): ShopSettings {
  return {
    timeZone: row?.timeZone ?? DEFAULT_SHOP_SETTINGS.timeZone,
    temperatureUnit: (row?.temperatureUnit as TemperatureUnit | null | undefined) ?? DEFAULT_SHOP_SETTINGS.temperatureUnit,
  };
}
