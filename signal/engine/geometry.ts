/**
 * Slider-crank cylinder volume (Heywood, Internal Combustion Engine Fundamentals, 1988, §2.2).
 * Angles in radians from top dead centre; lengths in metres; volumes in m³.
 */

export interface CylinderGeometry {
  /** Bore, m. */
  boreM: number;
  /** Stroke, m. */
  strokeM: number;
  /** Connecting-rod length, m. */
  rodM: number;
  /** Compression ratio rc = (Vd + Vc) / Vc. */
  compressionRatio: number;
}

/** Generic passenger-car geometry used when the engine's own is unknown (rod/crank ≈ 3.3, rc ≈ 10). */
export const GENERIC_GEOMETRY: CylinderGeometry = { boreM: 0.086, strokeM: 0.086, rodM: 0.143, compressionRatio: 10 };

/** Displaced volume per cylinder Vd = πB²L/4, m³. */
export function displacedVolume(g: CylinderGeometry): number {
  return (Math.PI * g.boreM * g.boreM * g.strokeM) / 4;
}

/** Clearance volume Vc = Vd / (rc − 1), m³. */
export function clearanceVolume(g: CylinderGeometry): number {
  return displacedVolume(g) / (g.compressionRatio - 1);
}

/** Rod-to-crank-radius ratio R = l / a with a = L/2. */
export function rodRatio(g: CylinderGeometry): number {
  return g.rodM / (g.strokeM / 2);
}

/** Distance from crank axis to piston pin s = a·cosθ + √(l² − a²sin²θ), m. */
export function pistonPinDistance(g: CylinderGeometry, thetaRad: number): number {
  const a = g.strokeM / 2;
  const sin = Math.sin(thetaRad);
  return a * Math.cos(thetaRad) + Math.sqrt(g.rodM * g.rodM - a * a * sin * sin);
}

/** Instantaneous volume V = Vc + (πB²/4)(l + a − s), m³. */
export function cylinderVolume(g: CylinderGeometry, thetaRad: number): number {
  const a = g.strokeM / 2;
  const s = pistonPinDistance(g, thetaRad);
  return clearanceVolume(g) + ((Math.PI * g.boreM * g.boreM) / 4) * (g.rodM + a - s);
}

/** V/Vc = 1 + ½(rc − 1)[R + 1 − cosθ − √(R² − sin²θ)], dimensionless. */
export function volumeRatio(rc: number, R: number, thetaRad: number): number {
  const sin = Math.sin(thetaRad);
  return 1 + 0.5 * (rc - 1) * (R + 1 - Math.cos(thetaRad) - Math.sqrt(R * R - sin * sin));
}

/** d(V/Vc)/dθ per radian, the derivative of {@link volumeRatio}. */
export function volumeRatioSlope(rc: number, R: number, thetaRad: number): number {
  const sin = Math.sin(thetaRad);
  const cos = Math.cos(thetaRad);
  return 0.5 * (rc - 1) * (sin + (sin * cos) / Math.sqrt(R * R - sin * sin));
}

/** Mean piston speed S̄p = 2·L·N, m/s, with N in revolutions per second. */
export function meanPistonSpeed(strokeM: number, rpm: number): number {
  return (2 * strokeM * rpm) / 60;
}

/** Polytropic compression p2 = p1·(V1/V2)ⁿ. */
export function polytropicPressure(p1: number, v1: number, v2: number, n: number): number {
  return p1 * Math.pow(v1 / v2, n);
}
