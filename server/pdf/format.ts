/** Pure formatting for the report PDF: condition rows ("not recorded", never invented). */
import type { Conditions } from '@/domain/report';
import type { TemperatureUnit } from '@/domain/shop-settings';
import { temperatureText } from '@/domain/units';
import { type AnalysisResult, identityWords } from '@/signal';

export const NR = 'not recorded';

/** The test conditions as report rows; the coolant temperature in the shop's unit (stored in °C). */
export function conditionRows(c: Conditions, r?: AnalysisResult, unit: TemperatureUnit = 'C'): [string, string][] {
  const v = (x: number | undefined, unit: string) => (x === undefined ? NR : `${x} ${unit}`);
  return [
    ['Coolant temperature', c.coolantTempC === undefined ? NR : temperatureText(c.coolantTempC, unit)],
    // Typed by the technician, else as the capture measured it (said so), else not recorded.
    ['Battery rest voltage', c.batteryRestV !== undefined ? v(c.batteryRestV, 'V') : measured(r?.startingSystem?.restingV)],
    ['Lowest cranking voltage', c.lowestCrankingV !== undefined ? v(c.lowestCrankingV, 'V') : measured(r?.startingSystem?.crankingMinV)],
    ['Mean cranking speed', r ? `${r.crankingRpm} rpm (measured)` : NR],
    ['Throttle position', c.throttle === 'wide-open' ? 'wide open' : c.throttle === 'closed' ? 'closed' : NR],
    ['Fuel disabled by', c.fuelDisabledBy ?? NR],
    ['Sync source', c.syncSource ?? (r ? (r.identity === 'assumed' ? 'none (numbers assumed)' : `capture: ${identityWords(r.identity)}`) : NR)],
    ['Firing order and numbering', r ? `${r.settings.firingOrder.join('-')}${c.numbering ? `, ${c.numbering}` : ''}` : (c.numbering ?? NR)],
  ];
}

function measured(volts: number | null | undefined): string {
  return volts === null || volts === undefined ? NR : `${volts.toFixed(2)} V (measured)`;
}
