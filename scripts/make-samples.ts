/** Generates samples/ from the cranking simulator: the captures, manifest.json (with the truth) and README.md. */
import { mkdirSync, writeFileSync } from 'node:fs';
import type { EngineSetup } from '../signal/engine/firing';
import { type SimChannel, type SimOptions, simulateCranking } from '../signal/sim/simulate';
import { type CsvStyle, edgeLogToCsv, simToCsv, toothTimesToCsv } from '../signal/sim/to-csv';
import { parseWheel } from '../signal/teeth/wheel';
import { headerlessEdgeLog, noisyStart, thenRuns, toothPeriodLog } from '../signal/sim/shapes';

interface SampleSpec {
  file: string;
  engine: EngineSetup;
  engineLabel: string;
  fault: string;
  sim: Omit<SimOptions, 'engine'>;
  style?: CsvStyle;
  toothTimes?: boolean;
  /** Written as a logic analyser's edge log (crank, and cam when the simulation records one). */
  edgeLog?: boolean;
  teeth?: string;
  expect: string;
  /** Warning codes the analysis must give. */
  codes?: string[];
  /** The verdict when it is not the truth's own (plugs out: uncertain). */
  verdict?: string;
  identity?: string;
  method?: string;
  sensor?: 'vr';
  /** A shape made from the simulation: the engine starts at `startsAtS`, a noisy first stretch, a period log. */
  shape?: { startsAtS?: number; noisyUntilS?: number; headerless?: boolean; periodLog?: boolean };
}

const I4: EngineSetup = { cylinders: 4, firingOrder: [1, 3, 4, 2], layout: 'inline' };
const I6: EngineSetup = { cylinders: 6, firingOrder: [1, 5, 3, 6, 2, 4], layout: 'inline' };
const V6: EngineSetup = { cylinders: 6, firingOrder: [1, 6, 5, 4, 3, 2], intervalsDeg: [90, 150, 90, 150, 90, 150], layout: 'v', numbering: 'along-crank' };
const V6even: EngineSetup = { cylinders: 6, firingOrder: [1, 2, 3, 4, 5, 6], layout: 'v', numbering: 'along-crank' };
const I3: EngineSetup = { cylinders: 3, firingOrder: [1, 2, 3], layout: 'inline' };
const V8: EngineSetup = { cylinders: 8, firingOrder: [1, 8, 4, 3, 6, 5, 7, 2], layout: 'v', numbering: 'along-crank' };
const logger = ['Crankprint sample capture (simulated)', 'Probe: clamp on starter cable'];
const even = (teeth: number) => ({ positions: teeth, gapsAfter: new Array<number>(teeth).fill(0), extraTooth: false });

const specs: SampleSpec[] = [
  { file: 'i4-healthy-current-sync.csv', engine: I4, engineLabel: 'Inline 4, 1-3-4-2', fault: 'none', sim: { seed: 101, channels: ['current', 'sync'] }, style: { channels: ['current', 'sync'], preamble: logger }, expect: 'all ok' },
  { file: 'i4-burnt-valve-current-sync.csv', engine: I4, engineLabel: 'Inline 4, 1-3-4-2', fault: 'cylinder 3 leaks (burnt valve)', sim: { seed: 102, channels: ['current', 'sync'], leakPerS: [0, 0, 3, 0] }, style: { channels: ['current', 'sync'] }, expect: 'cylinder 3 low, one-low pattern' },
  { file: 'i4-adjacent-low-current-sync.csv', engine: I4, engineLabel: 'Inline 4, 1-3-4-2', fault: 'cylinders 2 and 3 leak (gasket between them)', sim: { seed: 103, channels: ['current', 'sync'], leakPerS: [0, 2, 2, 0] }, style: { channels: ['current', 'sync'] }, expect: 'cylinders 2 and 3 low, neighbours pattern' },
  { file: 'i6-one-low-current.csv', engine: I6, engineLabel: 'Inline 6, 1-5-3-6-2-4', fault: 'cylinder 5 leaks', sim: { seed: 104, channels: ['current'], leakPerS: [0, 0, 0, 0, 2.5, 0] }, style: { channels: ['current'], delimiter: ';', timeUnit: 's', preamble: ['Export;bay 1'] }, expect: 'one cylinder low; numbers assumed (no sync)' },
  { file: 'v6-odd-fire-current-sync.csv', engine: V6, engineLabel: 'V6 90° odd-fire, 1-6-5-4-3-2, 90°/150°', fault: 'cylinder 4 leaks', sim: { seed: 105, channels: ['current', 'sync'], leakPerS: [0, 0, 0, 3, 0, 0] }, style: { channels: ['current', 'sync'], delimiter: '\t' }, expect: 'cylinder 4 low' },
  { file: 'v8-sync-current.csv', engine: V8, engineLabel: 'V8, 1-8-4-3-6-5-7-2', fault: 'cylinder 6 leaks', sim: { seed: 106, channels: ['current', 'sync'], leakPerS: [0, 0, 0, 0, 0, 4, 0, 0] }, style: { channels: ['current', 'sync'] }, expect: 'cylinder 6 low' },
  { file: 'i4-60-2-tooth-times.csv', engine: I4, engineLabel: 'Inline 4, 1-3-4-2, 60-2 wheel', fault: 'one cylinder leaks (cylinder 2 by the simulator)', sim: { seed: 107, channels: [], leakPerS: [0, 4, 0, 0] }, toothTimes: true, teeth: '60-2', expect: 'one cylinder low; numbers assumed (crank only)' },
  { file: 'i4-36-1-hall-sync.csv', engine: I4, engineLabel: 'Inline 4, 1-3-4-2, 36-1 wheel', fault: 'cylinder 4 leaks', sim: { seed: 108, channels: ['hall', 'sync'], leakPerS: [0, 0, 0, 3], teeth: { count: 36, missing: 1 }, sampleRateHz: 10000 }, style: { channels: ['hall', 'sync'], timeUnit: 's' }, teeth: '36-1', expect: 'cylinder 4 low' },
  { file: 'i4-noisy-current-sync.csv', engine: I4, engineLabel: 'Inline 4, 1-3-4-2', fault: 'cylinder 1 leaks; noisy clamp', sim: { seed: 109, channels: ['current', 'sync'], leakPerS: [3, 0, 0, 0], noise: 4 }, style: { channels: ['current', 'sync'] }, expect: 'cylinder 1 low' },
  { file: 'v6-edge-log-cam-36-gaps.csv', engine: V6even, engineLabel: 'V6 60°, 1-2-3-4-5-6, wheel 36:15/2,14/1,3/1', fault: 'cylinder 2 leaks', sim: { seed: 111, channels: [], leakPerS: [0, 3, 0, 0, 0, 0], wheel: parseWheel('36:15/2,14/1,3/1')!, camWindowDeg: [700, 40] }, edgeLog: true, expect: 'cylinder 2 low; wheel learned; cylinder 1 from the cam', identity: 'cam' },
  { file: 'i3-edge-log-fires.csv', engine: I3, engineLabel: 'Inline 3, 1-2-3, wheel 36:22/2,10/2', fault: 'cylinder 2 fires every second cycle', sim: { seed: 112, channels: [], wheel: parseWheel('36:22/2,10/2')!, firesCylinder: 2, durationS: 7 }, edgeLog: true, expect: 'ENGINE_FIRED; those events left out', codes: ['ENGINE_FIRED'] },
  { file: 'i4-vr-60-2.csv', engine: I4, engineLabel: 'Inline 4, 1-3-4-2, 60-2 wheel', fault: 'cylinder 3 leaks', sim: { seed: 113, channels: ['vr', 'sync'], leakPerS: [0, 0, 3, 0], sampleRateHz: 20000, vrScale: 0.3 }, style: { channels: ['vr', 'sync'], timeUnit: 's' }, sensor: 'vr', expect: 'cylinder 3 low (VR waveform, a few tenths of a volt)' },
  { file: 'i4-plugs-out-tooth-times.csv', engine: I4, engineLabel: 'Inline 4, 1-3-4-2, 60-2 wheel', fault: 'spark plugs out', sim: { seed: 114, channels: [], plugsOut: true }, toothTimes: true, expect: 'uncertain, NO_COMPRESSION, no figures', codes: ['NO_COMPRESSION'], verdict: 'uncertain' },
  { file: 'i4-reversed-clamp-current-sync.csv', engine: I4, engineLabel: 'Inline 4, 1-3-4-2', fault: 'cylinder 4 leaks; clamp on backwards', sim: { seed: 115, channels: ['current', 'sync'], leakPerS: [0, 0, 0, 3] }, style: { channels: ['current', 'sync'], invertCurrent: true }, expect: 'cylinder 4 low; CLAMP_REVERSED notice', codes: ['CLAMP_REVERSED'] },
  { file: 'i4-battery-sync.csv', engine: I4, engineLabel: 'Inline 4, 1-3-4-2', fault: 'cylinder 1 leaks', sim: { seed: 116, channels: ['battery', 'sync'], leakPerS: [3, 0, 0, 0] }, style: { channels: ['battery', 'sync'] }, expect: 'cylinder 1 low by the battery-voltage method', method: 'battery' },
  { file: 'v6-3-tooth-edge-log-cam.csv', engine: V6even, engineLabel: 'V6 60°, 1-2-3-4-5-6, 3 teeth a revolution', fault: 'cylinder 4 leaks', sim: { seed: 117, channels: [], leakPerS: [0, 0, 0, 2, 0, 0], wheel: even(3), camWindowDeg: [0, 30] }, edgeLog: true, expect: 'cylinder 4 low by event duration (one tooth an event); cylinder 1 from the cam', identity: 'cam', method: 'event-duration' },
  { file: 'i4-4-tooth-edge-log-cam.csv', engine: I4, engineLabel: 'Inline 4, 1-3-4-2, 4 teeth a revolution', fault: 'none', sim: { seed: 118, channels: [], wheel: even(4), camWindowDeg: [0, 30] }, edgeLog: true, expect: 'all ok by event duration', identity: 'cam', method: 'event-duration' },
  { file: 'v6-repeated-gap-edge-log-cam.csv', engine: V6even, engineLabel: 'V6 60°, 1-2-3-4-5-6, wheel 36:10/2,10/2,10/2', fault: 'cylinder 3 leaks', sim: { seed: 119, channels: [], leakPerS: [0, 0, 2, 0, 0, 0], wheel: parseWheel('36:10/2,10/2,10/2')!, camWindowDeg: [0, 30] }, edgeLog: true, expect: 'cylinder 3 low; the same gap every 120° learned as one wheel, placed by the cam', identity: 'cam' },
  { file: 'i4-starts-60-2-edge-log-cam.csv', engine: I4, engineLabel: 'Inline 4, 1-3-4-2, 60-2 wheel', fault: 'cylinder 2 leaks; the engine starts at 4.5 s', sim: { seed: 120, channels: [], leakPerS: [0, 3, 0, 0], camWindowDeg: [0, 30], durationS: 7 }, edgeLog: true, shape: { startsAtS: 4.5 }, expect: 'cylinder 2 low from the cranking before the start; ENGINE_STARTED says when', codes: ['ENGINE_STARTED'], identity: 'cam' },
  { file: 'i6-noisy-start-headerless.csv', engine: I6, engineLabel: 'Inline 6, 1-5-3-6-2-4, 36-2 wheel', fault: 'none; the trigger is noisy for the first 1.5 s', sim: { seed: 121, channels: [], teeth: { count: 36, missing: 2 }, durationS: 7 }, shape: { noisyUntilS: 1.5, headerless: true }, expect: 'all ok; the noisy start left out and said (UNSTEADY_START); read as an edge log without a header', codes: ['UNSTEADY_START'] },
  { file: 'i6-tooth-period-log.csv', engine: I6, engineLabel: 'Inline 6, 1-5-3-6-2-4, 36-2 wheel', fault: 'cylinder 6 leaks', sim: { seed: 122, channels: [], leakPerS: [0, 0, 0, 0, 0, 2.5], teeth: { count: 36, missing: 2 }, durationS: 9 }, shape: { periodLog: true }, expect: 'one cylinder low; tooth periods in µs, buffers joined at their marker rows', teeth: '36-2' },
  { file: 'i4-current-hall-light-starter.csv', engine: I4, engineLabel: 'Inline 4, 1-3-4-2, 36-1 wheel', fault: "cylinder 2 leaks; a light starter armature lets the clutch run free after each compression", sim: { seed: 123, channels: ['current', 'hall', 'sync'], leakPerS: [0, 3, 0, 0], teeth: { count: 36, missing: 1 }, sampleRateHz: 10000, armatureInertia: 0.016 }, style: { channels: ['current', 'hall', 'sync'], timeUnit: 's' }, teeth: '36-1', expect: 'cylinder 2 low by crank speed, checked by the current; CLUTCH_OVERRUN counts the events where the starter ran free', codes: ['CLUTCH_OVERRUN'] },
  { file: 'no-cranking.csv', engine: I4, engineLabel: 'Inline 4, 1-3-4-2', fault: 'the starter never engaged', sim: { seed: 110, channels: ['current'], starterOnS: 99, durationS: 4 }, style: { channels: ['current'] }, expect: 'uncertain, NO_CRANKING; the upload refuses it (no compression events)' },
];

mkdirSync('samples', { recursive: true });
const manifest: unknown[] = [];
const rows: string[] = [];
for (const s of specs) {
  const sim = simulateCranking({ engine: s.engine, ...s.sim, sampleRateHz: s.sim.sampleRateHz ?? 5000 });
  if (s.shape?.startsAtS) sim.toothTimes = thenRuns(sim.toothTimes, s.shape.startsAtS, 4, 2);
  if (s.shape?.noisyUntilS) sim.toothTimes = noisyStart(sim.toothTimes, s.shape.noisyUntilS, s.sim.seed ?? 1);
  const text = s.shape?.periodLog
    ? toothPeriodLog(sim)
    : s.shape?.headerless
      ? headerlessEdgeLog(sim.toothTimes)
      : s.edgeLog
        ? edgeLogToCsv(sim, ['Crankprint sample (simulated logic-analyser export)'])
        : s.toothTimes
          ? toothTimesToCsv(sim)
          : simToCsv(sim, s.style);
  writeFileSync(`samples/${s.file}`, text);
  const truth = Array.from(sim.truth.relativePercent, (v) => Math.round(Math.min(100, v) * 10) / 10);
  const channels = s.shape?.periodLog
    ? ['tooth periods']
    : s.shape?.headerless
      ? ['crank edges']
      : s.edgeLog
        ? s.sim.camWindowDeg
          ? ['crank edges', 'cam edges']
          : ['crank edges']
        : s.toothTimes
          ? ['tooth times']
          : ((s.style?.channels ?? ['current']) as (SimChannel | string)[]);
  const truthShown = s.sim.starterOnS === 99 || s.sim.plugsOut ? null : truth;
  manifest.push({
    file: s.file,
    engine: s.engine,
    teeth: s.teeth,
    channels,
    fault: s.fault,
    expect: s.expect,
    truthPercent: truthShown,
    synced: channels.includes('sync') || !!s.sim.camWindowDeg,
    codes: s.codes,
    verdict: s.verdict,
    identity: s.identity,
    method: s.method,
    sensor: s.sensor,
  });
  rows.push(`| \`${s.file}\` | ${s.engineLabel} | ${s.fault} | ${channels.join(', ')} | ${s.expect} | ${truthShown ? truth.map((v) => v.toFixed(0)).join(' / ') : '—'} |`);
}
writeFileSync(
  'samples/malformed.csv',
  'Time (ms),Starter current [A]\n0.0,12.5\n0.2,13.1\n0.4,12.9\n0.6,13.4\n0.8,13.0\n1.0,starter\n1.2,clamp off\n1.4,??\n1.6,--\n1.8,err\n2.0,n/c\n2.2,\u0007\n',
);
rows.push('| `malformed.csv` | — | text where numbers belong | current | refused: names line 7, column 2 | — |');
manifest.push({ file: 'malformed.csv', fault: 'text where numbers belong', expect: 'BAD_NUMBER at line 7, column 2', channels: ['current'] });
writeFileSync('samples/manifest.json', `${JSON.stringify(manifest, null, 2)}\n`);
writeFileSync(
  'samples/README.md',
  `# Sample captures

Simulated with \`npm run samples\` (signal/sim: slider-crank volume, polytropic gas with per-cylinder leakage, a DC
starter on a battery driving through a one-way clutch, valve springs, crank inertia and friction; healthy
engines swing about 2× within each compression event, as real ones do). The last column is the simulator's truth: each cylinder's
peak compression pressure in percent of the sealed cylinders' median, cylinder 1 first. The captures are
invented for the demo and the tests; no vehicle was measured.

| File | Engine | Fault | Channels | What the analysis should show | Truth (%) |
|---|---|---|---|---|---|
${rows.join('\n')}

Without a sync channel the cylinder numbers are assumed (the first event is cylinder 1), so a crank-only or
current-only capture names the low cylinder up to a rotation along the firing order.
`,
);
console.log(`wrote ${specs.length + 1} samples`);
