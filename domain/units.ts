/** Temperatures are stored in °C and shown in the shop's unit. */
import type { PressureUnit, TemperatureUnit } from './shop-settings';

/** °F from °C (the definition: t/°F = 1.8 · t/°C + 32). */
export const toFahrenheit = (celsius: number): number => celsius * 1.8 + 32;
/** °C from °F. */
export const toCelsius = (fahrenheit: number): number => (fahrenheit - 32) / 1.8;

/** A stored °C value in the shop's unit, rounded to one decimal. */
export function temperatureIn(celsius: number, unit: TemperatureUnit): number {
  return Math.round((unit === 'F' ? toFahrenheit(celsius) : celsius) * 10) / 10;
}

/** A value typed in the shop's unit, as stored (°C, one decimal). */
export function temperatureFrom(value: number, unit: TemperatureUnit): number {
  return Math.round((unit === 'F' ? toCelsius(value) : value) * 10) / 10;
}

export function temperatureText(celsius: number, unit: TemperatureUnit): string {
  return `${temperatureIn(celsius, unit)} °${unit}`;
}

/** Gauge pressures are stored in kPa; 1 psi = 6.894757 kPa (NIST SP 811, appendix B) and 1 bar = 100 kPa (by definition). */
const KPA_PER: Record<PressureUnit, number> = { kPa: 1, psi: 6.894757, bar: 100 };

/** A stored kPa value in the shop's unit (whole kPa or psi, two decimals of a bar). */
export function pressureIn(kpa: number, unit: PressureUnit): number {
  const v = kpa / KPA_PER[unit];
  return unit === 'bar' ? Math.round(v * 100) / 100 : Math.round(v);
}

/** A value typed in the shop's unit, in kPa. */
export function pressureFrom(value: number, unit: PressureUnit): number {
  return value * KPA_PER[unit];
}

export function pressureText(kpa: number, unit: PressureUnit): string {
  return `${pressureIn(kpa, unit)} ${unit}`;
}
