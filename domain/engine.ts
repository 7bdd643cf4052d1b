/** The engine as a vehicle or profile stores it: what the analysis needs (the vehicle schema checks it, domain/vehicle.ts). */
export interface EngineSpec {
  cylinders: number;
  layout: 'inline' | 'v' | 'flat';
  numbering?: 'along-crank' | 'bank-by-bank';
  firingOrder: number[];
  intervalsDeg?: number[];
  displacementL?: number;
}
