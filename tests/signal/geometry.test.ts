// Slider-crank geometry and polytropic compression against published equations and worked values.
import { describe, expect, it } from 'vitest';
import {
  clearanceVolume,
  cylinderVolume,
  displacedVolume,
  meanPistonSpeed,
  pistonPinDistance,
  polytropicPressure,
  rodRatio,
  volumeRatio,
} from '@/signal/engine/geometry';

const g = { boreM: 0.086, strokeM: 0.086, rodM: 0.143, compressionRatio: 10 };
const cm3 = (m3: number) => m3 * 1e6;
const deg = (d: number) => (d * Math.PI) / 180;

describe('Heywood, Internal Combustion Engine Fundamentals (1988) §2.2 — worked values in TRADE.md (derived)', () => {
  it('displacement, clearance volume and rod ratio', () => {
    expect(cm3(displacedVolume(g))).toBeCloseTo(499.557, 3);
    expect(cm3(clearanceVolume(g))).toBeCloseTo(55.506, 3);
    expect(rodRatio(g)).toBeCloseTo(3.3256, 4);
  });

  it.each([
    [30, 98.413],
    [60, 209.056],
    [90, 343.729],
    [120, 458.834],
    [150, 531.042],
    [180, 555.064],
  ])('V(%i°) = %f cm³', (theta, expected) => {
    expect(cm3(cylinderVolume(g, deg(theta)))).toBeCloseTo(expected, 3);
    // The dimensionless form gives the same volume.
    expect(cm3(clearanceVolume(g) * volumeRatio(10, rodRatio(g), deg(theta)))).toBeCloseTo(expected, 3);
  });

  it('piston travel at 90° is 49.618 mm; mean piston speed at 250 rpm is 0.717 m/s', () => {
    const a = g.strokeM / 2;
    const travel = g.rodM + a - pistonPinDistance(g, deg(90));
    expect(travel * 1000).toBeCloseTo(49.618, 3);
    expect(meanPistonSpeed(g.strokeM, 250)).toBeCloseTo(0.717, 3);
  });

  it.each([
    [30, 9.567],
    [40, 9.229],
    [50, 8.795],
    [60, 8.266],
  ])('dynamic compression ratio with IVC %i° ABDC = %f (Wikipedia, "Compression ratio", derived)', (ivc, expected) => {
    expect(volumeRatio(10, rodRatio(g), deg(180 + ivc))).toBeCloseTo(expected, 3);
  });
});

describe('polytropic compression p = p1·(V1/V)ⁿ (Wikipedia, "Compression ratio", worked example)', () => {
  it('rc 7.5, n 1.3 from 14.7 psia gives 201.8 psia = 187.1 psig', () => {
    const psia = polytropicPressure(14.7, 7.5, 1, 1.3);
    expect(psia).toBeCloseTo(201.8, 1);
    expect(psia - 14.7).toBeCloseTo(187.1, 1);
  });
});
