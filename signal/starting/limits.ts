/**
 * The starting-system check's limits, stated for a 12 V system; a 24 V system (two batteries in series) doubles
 * the voltages and the battery's resistance and halves the current for the same starter power. The shop may
 * change every limit; the defaults and their sources:
 *  - resting voltage: a flooded lead-acid battery reads about 12.6 V at full charge and about 12.4 V at three
 *    quarters (common practice; from memory);
 *  - cranking voltage: at or above 9.6 V (factory service information, several makes; common practice), lower
 *    when colder (the temperature table below is from memory);
 *  - battery resistance: a healthy car battery reads a few milliohms; above about 20 mΩ it is weak (from memory);
 *  - cranking current: about 80 A plus 50 A per litre of displacement for a petrol engine, twice that for a diesel
 *    (from memory, marked so on every screen that shows it);
 *  - cranking speed: typical cranking 150–300 rpm (common practice); the minimum starting speed is about 100 rpm
 *    (Denton, Automobile Electrical and Electronic Systems, starting systems).
 */
/** Limits for a 12 V system at about 21 °C (domain/starting-limits.ts checks a shop's own). */
export interface StartingLimits {
  /** Lowest resting voltage before the crank, V. */
  restingMinV: number;
  /** Lowest voltage while cranking at about 21 °C, V. */
  crankingMinV: number;
  /** Highest battery resistance from the inrush, mΩ. */
  internalMaxMilliOhm: number;
  /** Highest mean cranking current: this many amps… */
  currentBaseA: number;
  /** …plus this many per litre of displacement (twice both for a diesel). */
  currentPerLitreA: number;
  /** Slowest cranking speed, rpm. */
  crankingMinRpm: number;
}

export const DEFAULT_STARTING_LIMITS: StartingLimits = {
  restingMinV: 12.4,
  crankingMinV: 9.6,
  internalMaxMilliOhm: 20,
  currentBaseA: 80,
  currentPerLitreA: 50,
  crankingMinRpm: 150,
};

/** Where each default comes from, in the words the screens and the PDF print beside it. */
export const LIMIT_SOURCES = {
  resting: 'common practice: about 12.6 V at full charge, 12.4 V at three quarters (from memory)',
  crankingVoltage: 'factory service information, several makes: at or above 9.6 V (common practice); less when colder (from memory)',
  internalResistance: 'from memory: a healthy car battery reads a few milliohms',
  crankingCurrent: 'from memory: about 80 A plus 50 A per litre for petrol, twice for a diesel',
  crankingSpeed: 'common practice: typical cranking 150–300 rpm; about 100 rpm is the least that starts an engine (Denton)',
} as const;

/** Lowest cranking voltage of a 12 V battery by temperature, °C → V (common practice; from memory). */
const COLD_TABLE: [number, number][] = [
  [-18, 8.5],
  [-12, 8.7],
  [-7, 8.9],
  [-1, 9.1],
  [4, 9.3],
  [10, 9.4],
  [16, 9.5],
  [21, 9.6],
];

/** How far the cranking-voltage limit falls below its 21 °C value at this temperature, V (12 V system). */
export function coldAllowanceV(temperatureC: number | undefined): number {
  if (temperatureC === undefined || !Number.isFinite(temperatureC) || temperatureC >= 21) return 0;
  const t = Math.max(-18, temperatureC);
  for (let i = 1; i < COLD_TABLE.length; i++) {
    const [t1, v1] = COLD_TABLE[i];
    const [t0, v0] = COLD_TABLE[i - 1];
    if (t <= t1) return 9.6 - (v0 + ((v1 - v0) * (t - t0)) / (t1 - t0));
  }
  return 0;
}
