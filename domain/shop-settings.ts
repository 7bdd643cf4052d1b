/**
 * A shop's own conventions and how customers reach it: the time zone every date is shown in, the temperature and
 * distance units, and the phone number and address shown on a customer's report page.
 */
import { z } from 'zod';

export const TEMPERATURE_UNITS = ['C', 'F'] as const;
export type TemperatureUnit = (typeof TEMPERATURE_UNITS)[number];
export const DISTANCE_UNITS = ['km', 'mi'] as const;
export type DistanceUnit = (typeof DISTANCE_UNITS)[number];

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
  distanceUnit: z.enum(DISTANCE_UNITS, { message: 'Choose km or mi.' }).default('km'),
  phone: z.string().trim().max(40, 'Keep the phone number under 40 characters.').default(''),
  address: z.string().max(300, 'Keep the address under 300 characters.').overwrite(trimLines).default(''),
});
export type ShopSettings = z.output<typeof shopSettingsSchema>;

/** Until an owner chooses: coordinated universal time, degrees Celsius, kilometres, and no contact details. */
export const DEFAULT_SHOP_SETTINGS: ShopSettings = { timeZone: 'UTC', temperatureUnit: 'C', distanceUnit: 'km', phone: '', address: '' };

/** A shop's settings from its stored row (null columns or no row: the defaults). */
export function shopSettingsFrom(
  row: { timeZone: string | null; temperatureUnit: string | null; distanceUnit?: string | null; phone?: string | null; address?: string | null } | undefined,
): ShopSettings {
  return {
    timeZone: row?.timeZone ?? DEFAULT_SHOP_SETTINGS.timeZone,
    temperatureUnit: (row?.temperatureUnit as TemperatureUnit | null | undefined) ?? DEFAULT_SHOP_SETTINGS.temperatureUnit,
    distanceUnit: (row?.distanceUnit as DistanceUnit | null | undefined) ?? DEFAULT_SHOP_SETTINGS.distanceUnit,
    phone: row?.phone ?? '',
    address: row?.address ?? '',
  };
}

/** Text whose lines are kept, without blank lines or spaces at either end (CR/LF and CR become LF). */
function trimLines(text: string): string {
  return text.replace(/\r\n?/g, '\n').replace(/[ \t]+$/gm, '').trim();
}

/** Removing a shop: its name typed by the owner (compared with the name, spaces at either end aside). */
export const removeShopInput = z.object({ confirmName: z.string().max(200, 'Type the shop’s name.').default('') });
