/**
 * npm run bench: in one run, the plain parsing baseline and the full import + analysis on generated 1M- and
 * 10M-sample captures (each measurement in a fresh process, medians over repeats), papaparse and csv-parse on
 * the same 1M file (why the importer is our own), min/max decimation against one plain pass, and the report
 * PDF, and the recovery sweep's figures on the simulator (one `sweep:` line). Ends with one `bench:` line.
 */
import { execFileSync } from 'node:child_process';
import { appendFileSync, copyFileSync, existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { renderReportPdf } from '../server/pdf/render';
import { decimateMinMax } from '../signal/dsp/decimate';
import { ENSEMBLE_DRAWS, ENSEMBLE_METHODS, runEnsembleSweep, runSweep } from '../signal/sim/sweep';
import { sampleReportData } from '../tests/report/sample-report';
import { generateCapture } from './bench/generate';
import { chooseToBars, healthDuringAnalysis } from './bench/served';
import { exited, freePort, signInCookie, startApp, waitReady } from './app-server';

const dir = '/tmp/crankprint-bench';
mkdirSync(dir, { recursive: true });

const median = (v: number[]) => [...v].sort((a, b) => a - b)[v.length >> 1];
const child = (mode: string, file: string) =>
  JSON.parse(execFileSync(process.execPath, ['--import', 'tsx', 'scripts/bench/child.ts', mode, file], { encoding: 'utf8' }).trim().split('\n').pop()!);

interface Row {
  baselineMs: number;
  importMs: number;
  analysisMs: number;
  peakRatio: number;
  mb: number;
}

function measure(label: string, samples: number, repeats: number): Row {
  const file = `${dir}/capture-${label}.csv`;
  const bytes = generateCapture(file, samples);
  const mb = bytes / 1048576;
  const base: number[] = [];
  const imp: number[] = [];
  const ana: number[] = [];
  const peak: number[] = [];
  for (let r = 0; r < repeats; r++) {
    base.push(child('baseline', file).ms);
    const m = child('import', file);
    imp.push(m.importMs);
    ana.push(m.analysisMs);
    peak.push(m.peakBytes / m.columnBytes);
  }
  const row = { baselineMs: median(base), importMs: median(imp), analysisMs: median(ana), peakRatio: median(peak), mb };
  console.log(
    `${label.padEnd(4)} ${mb.toFixed(0).padStart(4)} MB  baseline ${row.baselineMs.toFixed(0).padStart(5)} ms (${(mb / (row.baselineMs / 1000)).toFixed(0)} MB/s)` +
      `  import ${row.importMs.toFixed(0).padStart(5)} ms (${(mb / (row.importMs / 1000)).toFixed(0)} MB/s, ${(row.importMs / row.baselineMs).toFixed(2)}× baseline, ${((row.importMs * 1e6) / samples).toFixed(0)} ns/sample)` +
      `  analysis ${row.analysisMs.toFixed(0).padStart(4)} ms  peak memory ${row.peakRatio.toFixed(2)}× column bytes`,
  );
  return row;
}

const r1 = measure('1m', 1_000_000, 7);

// The hand-written importer against two well-known CSV packages, bulk-parsing the same 1M file to numbers.
const packages = Object.fromEntries(
  (['papaparse', 'csv-parse'] as const).map((p) => {
    const ms = median(Array.from({ length: 5 }, () => child(p, `${dir}/capture-1m.csv`).ms as number));
    console.log(`1m   ${p.padEnd(9)} bulk parse ${ms.toFixed(0).padStart(5)} ms (${(ms / r1.importMs).toFixed(2)}× our import)`);
    return [p, ms];
  }),
);
const r10 = measure('10m', 10_000_000, 5);

async function measureServed(): Promise<{ barsMs: number; confirmedMs: number; redrawMs: number; healthP99: number } | null> {
  if (!existsSync('.next/BUILD_ID')) {
    console.log('served: no production build (npm run build): choose → bars and health during analysis left out');
    return null;
  }
  const data = mkdtempSync(join(tmpdir(), 'crankprint-bench-served-'));
  const server = startApp(await freePort(), { CRANKPRINT_DATA_DIR: data, CRANKPRINT_RATE_LIMIT_SCALE: '100' });
  try {
    await waitReady(server);
    const cookie = await signInCookie(server.base, 'tech@demo.crankprint.test');
    // Five distinct copies of the 1M file (one more line each), so the server stores every one.
    const copies = Array.from({ length: 5 }, (_, k) => {
      const copy = `${dir}/choose-${k}.csv`;
      copyFileSync(`${dir}/capture-1m.csv`, copy);
      appendFileSync(copy, `${(10 + k / 1000).toFixed(7)},0.00,0.00\n`);
      return copy;
    });
    const { barsMs, confirmedMs, redrawMs } = await chooseToBars(server.base, cookie, copies);
    console.log(`served: choose → bars (1M samples, headless Chromium) median ${median(barsMs).toFixed(0)} ms [${barsMs.map((x) => x.toFixed(0)).join(', ')}]; → server's reading confirmed ${median(confirmedMs).toFixed(0)} ms`);
    console.log(`served: zoom → trace redrawn (1M samples) median ${median(redrawMs).toFixed(0)} ms, worst ${Math.max(...redrawMs).toFixed(0)} ms over ${redrawMs.length} zooms (target 100 ms)`);
    const health = await healthDuringAnalysis(server.base, cookie, readFileSync(`${dir}/capture-10m.csv`, 'utf8'));
    console.log(`served: /api/health p99 ${health.restP99.toFixed(0)} ms at rest, ${health.busyP99.toFixed(0)} ms during three 10M-sample analyses (${health.saves} saves)`);
    return { barsMs: median(barsMs), confirmedMs: median(confirmedMs), redrawMs: median(redrawMs), healthP99: health.busyP99 };
  } finally {
    server.child.kill('SIGTERM');
    await exited(server.child);
    rmSync(data, { recursive: true, force: true });
  }
}

// Decimation of the full 10M range to 2,000 columns against one plain pass over the same array.
const n = 10_000_000;
const t = Float64Array.from({ length: n }, (_, i) => i / 1e6);
const y = Float64Array.from({ length: n }, (_, i) => Math.sin(i / 1000));
const dec: number[] = [];
const pass: number[] = [];
let sink = 0;
for (let r = 0; r < 7; r++) {
  let t0 = performance.now();
  let s = 0;
  for (let i = 0; i < n; i++) s += y[i];
  pass.push(performance.now() - t0);
  sink += s;
  t0 = performance.now();
  sink += decimateMinMax(t, y, 0, n, 2000).max[0];
  dec.push(performance.now() - t0);
}
console.log(`decimate 10M → 2,000 columns ${median(dec).toFixed(1)} ms; one plain pass ${median(pass).toFixed(1)} ms ${sink > Infinity ? '' : ''}`);

// A typical report PDF (two analyses, chart and trace excerpt), the first render including font loading.
const pdfRuns: number[] = [];
const data = sampleReportData();
for (let r = 0; r < 6; r++) {
  const t0 = performance.now();
  await renderReportPdf(data);
  pdfRuns.push(performance.now() - t0);
}
console.log(`report PDF: first ${pdfRuns[0].toFixed(0)} ms, then median ${median(pdfRuns.slice(1)).toFixed(0)} ms`);

// The recovery sweep on the simulator (signal/sim/sweep.ts): its figures per method, tracked like speed.
const sweepStarted = performance.now();
const sweep = runSweep([11]);
console.log(`sweep took ${((performance.now() - sweepStarted) / 1000).toFixed(0)} s; confident wrong flags: ${sweep.wrong.length}`);
console.log(sweep.line());
// The same on the ensemble of independent physics, and on the family kept out of its calibration (wall heat loss).
for (const family of ['ensemble', 'held-out'] as const) {
  const tally = runEnsembleSweep(family, ENSEMBLE_DRAWS);
  console.log(tally.line(`sweep_${family.replace('-', '_')}`, ENSEMBLE_METHODS));
}

// Served by the production build (npm run build first): choose → bars in headless Chromium on a 1M-sample file,
// and /api/health p99 while three 10M-sample analyses run in the engine's thread pool.
const served = await measureServed();

const f = (v: number, d = 2) => v.toFixed(d);
const na = (v: number | undefined) => (v === undefined || Number.isNaN(v) ? 'na' : v.toFixed(0));
console.log(
  `bench: import_ratio_10m=${f(r10.importMs / r10.baselineMs)} analysis_share_10m=${f(r10.analysisMs / r10.importMs)} ` +
    `e2e_1m_ms=${f(r1.importMs + r1.analysisMs, 0)} e2e_10m_ms=${f(r10.importMs + r10.analysisMs, 0)} ` +
    `peak_mem_ratio_10m=${f(r10.peakRatio)} decimate_ratio_10m=${f(median(dec) / median(pass))} pdf_ms=${f(median(pdfRuns.slice(1)), 0)} ` +
    `papaparse_1m_ms=${f(packages.papaparse, 0)} csv_parse_1m_ms=${f(packages['csv-parse'], 0)} import_1m_ms=${f(r1.importMs, 0)} ` +
    `choose_to_bars_1m_ms=${na(served?.barsMs)} choose_to_confirmed_1m_ms=${na(served?.confirmedMs)} zoom_redraw_1m_ms=${na(served?.redrawMs)} health_p99_during_analysis_ms=${na(served?.healthP99)}`,
);
