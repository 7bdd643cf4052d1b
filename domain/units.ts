/** Temperatures are stored in °C and shown in the shop's unit. */
import type { TemperatureUnit } from './shop-settings';

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
