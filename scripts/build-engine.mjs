// Part of `npm run build`: bundles the engine's worker thread (server/engine/thread.ts, with the signal library
// it runs) into .engine/thread.mjs for `npm start`, where TypeScript is not loaded.
import { build } from 'esbuild';

await build({
  entryPoints: ['server/engine/thread.ts'],
  outfile: '.engine/thread.mjs',
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  sourcemap: true,
  logLevel: 'warning',
  banner: { js: "import { createRequire } from 'node:module'; const require = createRequire(import.meta.url);" },
});
console.log('engine thread: .engine/thread.mjs');
