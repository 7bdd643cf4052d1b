/** The cautions of PRODUCT.md, shown before a test and in every report. */
export const CAUTIONS = [
  'Crank only with fuel disabled as the vehicle’s service information directs; keep hands, hair, clothing and leads clear of belts, fans and pulleys; transmission in park or neutral, wheels chocked; ventilate exhaust.',
  'Ignition systems carry high voltage; battery gases are explosive.',
  'Restore fuel and ignition, and clear codes or relearn values that the test created, as the service information directs.',
  'A relative test ranks cylinders against each other; it cannot see wear that is equal on all cylinders. Confirm a low result with a gauge compression test and a cylinder leakage test before teardown.',
  'Follow the manufacturer’s service information, local regulations and licensed practice; Crankprint’s figures are estimates.',
] as const;
