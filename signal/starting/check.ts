/**
 * The starting-system check: each figure the capture holds against the shop's limits (signal/starting/limits.ts),
 * with a status and, where it matters, a plain sentence saying what to do before the compression figures are
 * trusted.
 */
import { coldAllowanceV, DEFAULT_STARTING_LIMITS, LIMIT_SOURCES, type StartingLimits } from './limits';
import type { StartingFigures } from './measure';

/** `no limit`: measured, but the limit needs what the capture cannot tell (the engine's displacement). */
export type StartingStatus = 'ok' | 'low' | 'high' | 'no limit' | 'not measured';
export type StartingCheckKey = 'resting' | 'cranking-voltage' | 'internal-resistance' | 'cranking-current' | 'cranking-speed';

export interface StartingCheck {
  key: StartingCheckKey;
  label: string;
  /** The figure, in `unit`; null where the capture does not hold it. */
  value: number | null;
  unit: 'V' | 'A' | 'mΩ' | 'rpm';
  /** The limit in words, e.g. "at least 9.6 V (at 21 °C)". */
  limit: string;
  /** The limit's figure, in `unit`; null where it cannot be set (no displacement). */
  threshold: number | null;
  status: StartingStatus;
  /** Where the limit comes from (the default's source), or "the shop's limit". */
  source: string;
}

export interface StartingOptions {
  limits?: Partial<StartingLimits>;
  /** Air temperature at the vehicle, °C: the cranking-voltage limit falls when colder. */
  temperatureC?: number;
  /** The engine's displacement, litres: needed for the cranking-current limit. */
  displacementL?: number;
  diesel?: boolean;
}

export interface StartingSystem extends StartingFigures {
  crankingRpm: number | null;
  checks: StartingCheck[];
  /** Sentences to act on, the battery first; empty when every measured figure is within its limit. */
  advice: string[];
  /** One plain line for the customer. */
  customerLine: string;
  /** The checks this capture holds nothing for, in one sentence (empty when it holds them all). */
  notInCapture: string;
  /** The battery is weak (its resistance, or a sag the draw does not explain): the figures deserve a second capture once it is put right. */
  weakBattery: boolean;
}

export function checkStartingSystem(f: StartingFigures, crankingRpm: number | null, o: StartingOptions = {}): StartingSystem {
  const l = { ...DEFAULT_STARTING_LIMITS, ...o.limits };
  const own = (k: keyof StartingLimits) => (o.limits?.[k] !== undefined && o.limits[k] !== DEFAULT_STARTING_LIMITS[k] ? 'the shop’s limit' : null);
  const volts = f.systemV / 12;
  const restMin = l.restingMinV * volts;
  const crankMin = (l.crankingMinV - coldAllowanceV(o.temperatureC)) * volts;
  const ohmMax = l.internalMaxMilliOhm * volts;
  const fuel = o.diesel ? 2 : 1;
  const ampMax = o.displacementL ? (fuel * (l.currentBaseA + l.currentPerLitreA * o.displacementL)) / volts : null;
  const rpm = crankingRpm && crankingRpm > 0 ? Math.round(crankingRpm) : null;
  const below = (v: number | null, min: number): StartingStatus => (v === null ? 'not measured' : v < min ? 'low' : 'ok');
  const above = (v: number | null, max: number | null): StartingStatus => (v === null ? 'not measured' : max === null ? 'no limit' : v > max ? 'high' : 'ok');
  const at = o.temperatureC === undefined ? 'at about 21 °C' : `at ${o.temperatureC.toFixed(0)} °C`;
  const checks: StartingCheck[] = [
    { key: 'resting', label: 'Resting battery voltage', value: f.restingV, unit: 'V', limit: `at least ${restMin.toFixed(1)} V`, threshold: restMin, status: below(f.restingV, restMin), source: own('restingMinV') ?? LIMIT_SOURCES.resting },
    { key: 'cranking-voltage', label: 'Lowest voltage while cranking', value: f.crankingMinV, unit: 'V', limit: `at least ${crankMin.toFixed(1)} V ${at}`, threshold: crankMin, status: below(f.crankingMinV, crankMin), source: own('crankingMinV') ?? LIMIT_SOURCES.crankingVoltage },
    { key: 'internal-resistance', label: 'Battery resistance from the inrush', value: f.internalMilliOhm, unit: 'mΩ', limit: `at most ${ohmMax.toFixed(0)} mΩ`, threshold: ohmMax, status: above(f.internalMilliOhm, ohmMax), source: own('internalMaxMilliOhm') ?? LIMIT_SOURCES.internalResistance },
    {
      key: 'cranking-current',
      label: 'Mean cranking current',
      value: f.crankingMeanA,
      unit: 'A',
      limit: ampMax === null ? 'needs the engine’s displacement' : `at most ${ampMax.toFixed(0)} A for ${o.displacementL!.toFixed(1)} L${o.diesel ? ' diesel' : ''}`,
      threshold: ampMax,
      status: above(f.crankingMeanA, ampMax),
      source: own('currentBaseA') ?? own('currentPerLitreA') ?? LIMIT_SOURCES.crankingCurrent,
    },
    { key: 'cranking-speed', label: 'Cranking speed', value: rpm, unit: 'rpm', limit: `at least ${l.crankingMinRpm.toFixed(0)} rpm`, threshold: l.crankingMinRpm, status: below(rpm, l.crankingMinRpm), source: own('crankingMinRpm') ?? LIMIT_SOURCES.crankingSpeed },
  ];
  const status = (k: StartingCheckKey) => checks.find((c) => c.key === k)!.status;
  const drawHigh = status('cranking-current') === 'high';
  // The trade's reading: a sagging voltage convicts the battery only when the draw behind it is not the cause. With
  // its resistance read from the inrush, the battery answers for itself.
  const resistanceRead = status('internal-resistance') !== 'not measured';
  const sagFromBattery = status('cranking-voltage') === 'low' && !drawHigh && !resistanceRead;
  const batteryDown = status('resting') === 'low' || status('internal-resistance') === 'high' || sagFromBattery;
  const advice: string[] = [];
  if (status('resting') === 'low') advice.push(`The battery rested at ${f.restingV!.toFixed(2)} V, below ${restMin.toFixed(1)} V: it is not fully charged; charge it and test it before judging the starter or compression.`);
  if (status('cranking-voltage') === 'low') {
    const sag = `Battery voltage fell to ${f.crankingMinV!.toFixed(2)} V while cranking (limit ${crankMin.toFixed(1)} V ${at})`;
    if (sagFromBattery || status('internal-resistance') === 'high') advice.push(`${sag}: test or charge the battery before judging compression.`);
    else if (drawHigh) advice.push(`${sag}, pulled down by the starter’s high draw below rather than by the battery.`);
    else advice.push(`${sag}, though the battery’s resistance reads well: check the cables and their joints for voltage drop.`);
  }
  if (status('internal-resistance') === 'high') advice.push(`The battery’s resistance read ${f.internalMilliOhm!.toFixed(0)} mΩ from the inrush (limit ${ohmMax.toFixed(0)} mΩ): clean and tighten its terminals, then load-test it.`);
  if (drawHigh) {
    advice.push(`The starter drew ${f.crankingMeanA!.toFixed(0)} A on average while cranking (limit ${ampMax!.toFixed(0)} A): a dragging starter, a poor cable or a tight engine; test the starter’s draw and the cables’ voltage drop as the service information directs.`);
  }
  if (status('cranking-speed') === 'low') {
    const why = batteryDown ? 'the battery above is the first suspect' : drawHigh ? 'the starter’s high draw above is the first suspect' : 'check the cables, their joints and the starter';
    advice.push(`The engine cranked at ${rpm} rpm, below ${l.crankingMinRpm.toFixed(0)} rpm: ${why}. Slow cranking lowers every cylinder’s compression, so record again once it is put right.`);
  }
  const measured = (k: StartingCheckKey) => status(k) !== 'not measured';
  // "Healthy" only where the battery was seen under load and at rest (or its resistance was read).
  const seenWhole = measured('cranking-voltage') && (measured('resting') || measured('internal-resistance'));
  const customerLine = batteryDown
    ? drawHigh
      ? 'The battery needs charging or testing, and the starter checking, before the engine test is repeated.'
      : 'The battery needs charging or testing before the engine test is repeated.'
    : advice.length > 0
      ? 'The starter or its cables need checking before the engine test is repeated.'
      : seenWhole
        ? 'The battery and starter are healthy on this test.'
        : checks.some((c) => c.status === 'ok')
          ? 'Nothing on this test points at the battery or the starter.'
          : '';
  const absent = checks.filter((c) => c.status === 'not measured').map((c) => c.label.toLowerCase());
  const notInCapture = absent.length ? `Not in this capture: ${absent.join(', ')}. Record the starter current, and the battery voltage from before the starter engages, to check them.` : '';
  return { ...f, crankingRpm: rpm, checks, advice, customerLine, notInCapture, weakBattery: status('internal-resistance') === 'high' || sagFromBattery };
}

/** A check's reading as the screens and the PDF print it: volts to two decimals, milliohms to one, else whole. */
export function readingText(c: Pick<StartingCheck, 'value' | 'unit'>): string {
  if (c.value === null) return '—';
  return `${c.value.toFixed(c.unit === 'V' ? 2 : c.unit === 'mΩ' ? 1 : 0)} ${c.unit}`;
}
