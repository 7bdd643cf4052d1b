// Bundles the engine's worker thread (server/engine/thread.ts, with the signal library and the PDF document it
// runs) into one ES module for node:worker_threads. `npm run build` writes .engine/thread.mjs for `npm start`;
// in development and tests the pool (server/engine/pool.ts) calls buildEngine() itself for .engine/thread.dev.mjs,
// so every mode runs the same bundled code.
import { mkdirSync, renameSync, writeFileSync } from 'node:fs';
import { dirname } from 'node:path';
import { pathToFileURL } from 'node:url';
import { build } from 'esbuild';

export async function buildEngine(outfile = '.engine/thread.mjs') {
  const out = await build({
    write: false,
    entryPoints: ['server/engine/thread.ts'],
    outfile,
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    sourcemap: true,
    logLevel: 'warning',
    jsx: 'automatic',
    // Loaded from node_modules at run time: the PDF renderer and React keep their own files (fonts, wasm).
    external: ['@react-pdf/renderer', 'react', 'react/jsx-runtime'],
    banner: { js: "import { createRequire } from 'node:module'; const require = createRequire(import.meta.url);" },
  });
  // Each file lands whole (written aside, then renamed): another process may be loading the previous one.
  mkdirSync(dirname(outfile), { recursive: true });
  for (const f of out.outputFiles) {
    const aside = `${f.path}.${process.pid}.tmp`;
    writeFileSync(aside, f.contents);
    renameSync(aside, f.path);
  }
  return outfile;
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  console.log(`engine thread: ${await buildEngine()}`);
}
