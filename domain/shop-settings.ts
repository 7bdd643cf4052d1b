/**
 * A shop's own conventions and how customers reach it: the time zone every date is shown in, the temperature and
 * distance units, and the phone number and address shown on a customer's report page.
 */
import { z } from 'zod';
import { DEFAULT_STARTING_LIMITS, type StartingLimits, startingLimitsSchema } from './starting-limits';

export const TEMPERATURE_UNITS = ['C', 'F'] as const;
export type TemperatureUnit = (typeof TEMPERATURE_UNITS)[number];
export const DISTANCE_UNITS = ['km', 'mi'] as const;
export type DistanceUnit = (typeof DISTANCE_UNITS)[number];
/** Gauge pressures: kilopascals, pounds per square inch or bar. */
export const PRESSURE_UNITS = ['kPa', 'psi', 'bar'] as const;
export type PressureUnit = (typeof PRESSURE_UNITS)[number];

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
  /** Left out: kept as it is. */
  pressureUnit: z.enum(PRESSURE_UNITS, { message: 'Choose kPa, psi or bar.' }).optional(),
  /** Left out: kept as they are. */
  startingLimits: startingLimitsSchema.optional(),
});
/** Settings as a form or the API sends them (the pressure unit and starting limits may be left out). */
export type ShopSettingsInput = z.output<typeof shopSettingsSchema>;
export type ShopSettings = Required<ShopSettingsInput>;

/** Until an owner chooses: coordinated universal time, degrees Celsius, kilometres, kPa, no contact details and the default starting limits. */
export const DEFAULT_SHOP_SETTINGS: ShopSettings = { timeZone: 'UTC', temperatureUnit: 'C', distanceUnit: 'km', phone: '', address: '', pressureUnit: 'kPa', startingLimits: DEFAULT_STARTING_LIMITS };

/** A shop's settings from its stored row (null columns or no row: the defaults). */
export function shopSettingsFrom(
  row:
    | { timeZone: string | null; temperatureUnit: string | null; distanceUnit?: string | null; phone?: string | null; address?: string | null; pressureUnit?: string | null; startingLimits?: unknown }
    | undefined,
): ShopSettings {
  const limits = startingLimitsSchema.safeParse({ ...DEFAULT_STARTING_LIMITS, ...(row?.startingLimits as Partial<StartingLimits> | null | undefined) });
  return {
    timeZone: row?.timeZone ?? DEFAULT_SHOP_SETTINGS.timeZone,
    temperatureUnit: (row?.temperatureUnit as TemperatureUnit | null | undefined) ?? DEFAULT_SHOP_SETTINGS.temperatureUnit,
    distanceUnit: (row?.distanceUnit as DistanceUnit | null | undefined) ?? DEFAULT_SHOP_SETTINGS.distanceUnit,
    phone: row?.phone ?? '',
    address: row?.address ?? '',
    pressureUnit: (row?.pressureUnit as PressureUnit | null | undefined) ?? DEFAULT_SHOP_SETTINGS.pressureUnit,
    startingLimits: limits.success ? limits.data : DEFAULT_STARTING_LIMITS,
  };
}

/** Text whose lines are kept, without blank lines or spaces at either end (CR/LF and CR become LF). */
function trimLines(text: string): string {
  return text.replace(/\r\n?/g, '\n').replace(/[ \t]+$/gm, '').trim();
}

/** Removing a shop: its name typed by the owner (compared with the name, spaces at either end aside). */
export const removeShopInput = z.object({ confirmName: z.string().max(200, 'Type the shop’s name.').default('') });
