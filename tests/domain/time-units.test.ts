/**
 * Dates in the shop's zone and temperatures in its unit. References: the IANA time-zone database's rules
 * (US daylight time from the second Sunday of March to the first Sunday of November; EU summer time from the last
 * Sunday of March to the last Sunday of October; India no daylight time, UTC+5:30), and the definition of the
 * Fahrenheit scale (NIST SP 811, B.8: t/°F = 1.8 t/°C + 32; water freezes at 32 °F and boils at 212 °F).
 */
import { describe, expect, it } from 'vitest';
import { isTimeZone, shopSettingsSchema } from '@/domain/shop-settings';
import { formatDay, formatWhen } from '@/domain/time';
import { temperatureFrom, temperatureIn, temperatureText, toCelsius, toFahrenheit } from '@/domain/units';

describe('dates in the shop’s zone, with the zone named', () => {
  const summer = '2026-07-01T12:00:00Z';
  const winter = '2026-12-02T12:00:00Z';
  it('follows daylight time where the zone has it', () => {
    expect(formatWhen(summer, 'America/Chicago')).toBe('Jul 1, 2026, 07:00 CDT');
    expect(formatWhen(winter, 'America/Chicago')).toBe('Dec 2, 2026, 06:00 CST');
    expect(formatWhen(summer, 'UTC')).toBe('Jul 1, 2026, 12:00 UTC');
  });
  it('handles half-hour offsets and a date that is another day in the zone', () => {
    expect(formatWhen('2026-12-02T20:00:00Z', 'Asia/Kolkata')).toBe('Dec 3, 2026, 01:30 GMT+5:30');
    expect(formatDay('2026-12-02T20:00:00Z', 'Asia/Kolkata')).toBe('Dec 3, 2026, GMT+5:30');
  });
  it('names the zone in a European summer', () => {
    expect(formatWhen(summer, 'Europe/Berlin')).toBe('Jul 1, 2026, 14:00 GMT+2');
  });
  it('accepts only zones the time-zone database knows', () => {
    expect(isTimeZone('Europe/Berlin')).toBe(true);
    expect(isTimeZone('Mars/Olympus')).toBe(false);
    expect(shopSettingsSchema.safeParse({ timeZone: 'Mars/Olympus', temperatureUnit: 'C' }).success).toBe(false);
    expect(shopSettingsSchema.safeParse({ timeZone: 'America/Chicago', temperatureUnit: 'K' }).success).toBe(false);
  });
});

describe('temperatures: stored in °C, shown in the shop’s unit', () => {
  it('uses the definition of the Fahrenheit scale', () => {
    expect(toFahrenheit(0)).toBe(32);
    expect(toFahrenheit(100)).toBe(212);
    expect(toFahrenheit(-40)).toBe(-40);
    expect(toCelsius(212)).toBe(100);
  });
  it('shows a typical warm engine either way and round-trips a typed °F value', () => {
    expect(temperatureText(90, 'C')).toBe('90 °C');
    expect(temperatureText(90, 'F')).toBe('194 °F');
    expect(temperatureFrom(185, 'F')).toBe(85);
    expect(temperatureIn(temperatureFrom(185, 'F'), 'F')).toBe(185);
  });
});
