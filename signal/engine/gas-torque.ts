/**
 * The torque shape of one nominal cylinder through its 720° cycle: (p/p0 − 1)·d(V/Vc)/dθ, with the
 * slider-crank volume and polytropic compression of the trapped charge between intake closing and exhaust opening.
 */
import { volumeRatio, volumeRatioSlope } from './geometry';

export interface GasModel {
  /** @default 10 */
  compressionRatio: number;
  /** Connecting rod / crank radius. @default 3.3 */
  rodRatio: number;
  /** Intake valve closing, degrees after bottom dead centre. @default 45 */
  ivcAbdcDeg: number;
  /** Exhaust valve opening, degrees before bottom dead centre. @default 45 */
  evoBbdcDeg: number;
  /** Polytropic exponent. @default 1.3 */
  n: number;
}

export const GENERIC_GAS: GasModel = { compressionRatio: 10, rodRatio: 3.3, ivcAbdcDeg: 45, evoBbdcDeg: 45, n: 1.3 };

/** Samples per degree in the tabulated shape. */
export const TORQUE_TABLE_STEPS_PER_DEG = 2;

/** Looks up the table at ψ degrees (any value; wrapped into the 720° cycle), linearly interpolated. */
export function torqueAt(table: Float64Array, psiDeg: number): number {
  let x = (psiDeg + 360) % 720;
  if (x < 0) x += 720;
  const f = x * TORQUE_TABLE_STEPS_PER_DEG;
  const i = Math.floor(f);
  const j = i + 1 === table.length ? 0 : i + 1;
  const w = f - i;
  return table[i] * (1 - w) + table[j] * w;
}

/** Leak rates (1/s) of the shape family the fit chooses from: sealed to nearly open. */
export const LEAK_FAMILY_PER_S = [0, 0.15, 0.3, 0.6, 1, 1.6, 2.5, 4, 6.5, 10, 16, 30, 80];
/** Leak rates (1/s) of the family's late leaks: a path that opens only near top dead centre. */
export const LATE_LEAK_FAMILY_PER_S = [0.6, 1.6, 4, 10, 30];
/** Crank degrees before TDC at which the family's late leaks open. */
export const LATE_LEAK_FROM_DEG = -40;

/** Leak rates (1/s) of the family's orifice leaks: flow with the square root of the pressure difference. */
export const ORIFICE_LEAK_FAMILY_PER_S = [0.3, 0.8, 2, 5, 12];

/**
 * Where in the stroke a cylinder loses its charge: from early in the stroke (an orifice, its flow growing with the
 * square root of the pressure), through the stroke in proportion to pressure, or only near TDC.
 */
export type LeakDepth = 'early' | 'whole stroke' | 'near TDC';

export interface LeakyShape {
  leakPerS: number;
  table: Float64Array;
  /** Peak gauge pressure relative to the sealed cylinder's. */
  peakRatio: number;
}

/**
 * The torque shape of a cylinder that loses charge while turning at a steady `rpm`: the leak's flow grows with
 * the pressure difference (dm/dt = −λ·m·(p − p0)/p0), so its loss is concentrated near TDC and the expansion
 * returns less than the compression took. A leak `near TDC` flows only from 40° before it (a path that opens
 * under pressure), so the compression stroke looks sealed and only the peak and the expansion show it. Also
 * gives the peak pressure relative to a sealed cylinder.
 *
 * A leak loses charge per second, not per degree. With `degPerS` (the crank's measured speed at each of the
 * table's steps, deg/s) the time spent at each angle is the measured one: a crank that slows into TDC to a
 * third of its mean speed loses three times as much there as a steady one would.
 */
export function leakyTorqueShape(model: GasModel, leakPerS: number, rpm: number, depth: LeakDepth = 'whole stroke', degPerS?: Float64Array): LeakyShape {
  const from = depth === 'near TDC' ? LATE_LEAK_FROM_DEG : -Infinity;
  const size = 720 * TORQUE_TABLE_STEPS_PER_DEG;
  const table = new Float64Array(size);
  const rad = Math.PI / 180;
  const ivc = -180 + model.ivcAbdcDeg;
  const evo = 180 - model.evoBbdcDeg;
  const vIvc = volumeRatio(model.compressionRatio, model.rodRatio, ivc * rad);
  const dtPerStep = 1 / TORQUE_TABLE_STEPS_PER_DEG / (6 * Math.max(30, rpm));
  let mass = 1;
  let peak = 0;
  let sealedPeak = 0;
  for (let i = 0; i < size; i++) {
    const psi = -360 + i / TORQUE_TABLE_STEPS_PER_DEG;
    if (psi < ivc || psi > evo) continue;
    const v = volumeRatio(model.compressionRatio, model.rodRatio, psi * rad);
    const sealed = Math.pow(vIvc / v, model.n) - 1;
    const gauge = Math.pow((mass * vIvc) / v, model.n) - 1;
    if (gauge > peak) peak = gauge;
    if (sealed > sealedPeak) sealedPeak = sealed;
    table[i] = gauge * volumeRatioSlope(model.compressionRatio, model.rodRatio, psi * rad);
    const dt = degPerS && degPerS[i] > 0 ? 1 / TORQUE_TABLE_STEPS_PER_DEG / degPerS[i] : dtPerStep;
    if (gauge > 0 && psi >= from) mass *= Math.exp(-leakPerS * (depth === 'early' ? Math.sqrt(gauge) : gauge) * dt);
  }
  return { leakPerS, table, peakRatio: sealedPeak > 0 ? peak / sealedPeak : 1 };
}
