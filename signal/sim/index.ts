/** The cranking simulator's public surface (the demo's captures, the samples, the benches): outside signal/, import it from here. */
export { simulateCranking } from './simulate';
export type { SimChannel, SimOptions } from './simulate';
export { simToCsv } from './to-csv';
