/**
 * The engine against real cranking recordings (external check data, never copied into this repository): every
 * file in ../shared/captures-real/ and its second-set/ (or CRANKPRINT_REAL_DIR) is imported and analysed, and the
 * expectations written in that folder's README are checked (1–4 for the first six, 5 for the second set). Exits 1 when any fails, 0 when all hold; prints
 * "N passed, N failed".
 */
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { type AnalysisResult, analyzeBytes, type EngineSetup } from '../signal';
import { MIN_COMPRESSION_SWING } from '../signal/steps/compression-evidence';

const dir = resolve(process.env.CRANKPRINT_REAL_DIR ?? join(import.meta.dirname, '..', '..', 'shared', 'captures-real'));

/** The engines as that README gives them (firing orders from memory, as it says). */
const ENGINES: { match: RegExp; engine: EngineSetup }[] = [
  { match: /^v6-/, engine: { cylinders: 6, firingOrder: [1, 2, 3, 4, 5, 6], layout: 'v' } },
  { match: /^i3-/, engine: { cylinders: 3, firingOrder: [1, 2, 3] } },
  { match: /^i4-(2\.4l|1\.8l|2\.0l)/, engine: { cylinders: 4, firingOrder: [1, 3, 4, 2] } },
  { match: /^i4-small/, engine: { cylinders: 4, firingOrder: [1, 2, 4, 3] } },
  { match: /^i6-/, engine: { cylinders: 6, firingOrder: [1, 5, 3, 6, 2, 4] } },
  { match: /^flat4-/, engine: { cylinders: 4, firingOrder: [1, 3, 2, 4], layout: 'flat' } },
];

type Check = [string, boolean];

/** The wheels as that README's table gives them, in our words. */
const WHEELS = [
  { match: /^v6-/, words: '36 positions, 32 teeth, gaps of 1, 1 and 2' },
  { match: /^i3-/, words: '36 positions, 32 teeth, gaps of 2 and 2' },
  { match: /^i4-2\.4l/, words: '12 positions, 12 teeth, no gap and one extra tooth' },
  { match: /^i4-small/, words: '8 positions, 7 teeth, a gap of 1' },
];

/** Expectation 5 of captures-real/README.md: the second set, whose shapes the first six did not show. */
function secondSet(file: string, r: AnalysisResult, mappingConfidence: number): Check[] {
  const codes = r.warnings.map((w) => w.code);
  const checks: Check[] = [
    ['5. read without a mapping dialog or an error: a sure mapping', mappingConfidence >= 0.7],
    ['5. read from the crank teeth (an edge log, not a starter current)', r.method === 'crank-speed' || r.method === 'event-duration'],
    ['5. figures for every cylinder', r.cylinders.every((c) => c.relativePercent !== null)],
    ['5. presumably healthy: no cylinder low', r.cylinders.every((c) => c.status !== 'low')],
    ['5. never "no compression"', !codes.includes('NO_COMPRESSION')],
  ];
  if (file.includes('-starts')) {
    const started = r.warnings.find((w) => w.code === 'ENGINE_STARTED');
    checks.push(
      ['5. an engine that starts: when it started and how much cranking was used', !!started && /started at [\d.]+ s; [\d.]+ s of cranking/.test(started.message)],
      ['5. an engine that starts: the cranking speed is the cranking before it', r.crankingRpm > 100 && r.crankingRpm < 400],
    );
  }
  if (/crank-[1-6]-|crank-[1-6]-teeth/.test(file)) checks.push(['5. a wheel with few teeth is read by event duration', r.method === 'event-duration']);
  if (file.includes('noisy')) {
    checks.push(
      ['5. the noisy start is left out, and said so', r.window.startS >= 1.5 && codes.includes('UNSTEADY_START')],
      ['5. the steady part is read (2.3–6.6 s)', r.window.endS - r.window.startS >= 2.5],
    );
  }
  if (file.includes('double-gaps')) checks.push(['5. the same gap every 120° is one wheel of 36 positions', r.wheel?.notation === '36:10/2,10/2,10/2']);
  return checks;
}

/** Expectations 1–4 of captures-real/README.md, "What Crankprint must do with them". */
function expectations(file: string, r: AnalysisResult, mappingConfidence: number): Check[] {
  const codes = r.warnings.map((w) => w.code);
  const wheel = WHEELS.find((w) => w.match.test(file))!;
  const checks: Check[] = [
    ['1. read without a mapping dialog or an error: a sure mapping', mappingConfidence >= 0.7],
    ['1. edge log decoded into compression events', r.events.length > 0],
    [`1. wheel learned as the table says: ${wheel.words}`, r.wheel?.description === wheel.words && r.wheel.learned],
  ];
  if (file.includes('plugs-out')) {
    checks.push(
      ['2. plugs out: uncertain', r.verdict === 'uncertain'],
      ['2. plugs out: no percentages', r.cylinders.every((c) => c.relativePercent === null)],
      ['2. plugs out: no ok/low', r.cylinders.every((c) => c.status === 'uncertain')],
      ['2. plugs out: warning that no compression signature was found', codes.includes('NO_COMPRESSION')],
    );
  } else if (file.startsWith('v6-') || file.startsWith('i4-small')) {
    const source = file.startsWith('v6-') ? 'cam' : 'injector';
    checks.push(
      ['3. plugs in: every cylinder ok', r.cylinders.every((c) => c.status === 'ok')],
      ['3. plugs in: spread within the limit', r.spreadPercent <= r.settings.spreadLimitPercent && !codes.includes('SPREAD_HIGH')],
      [`3. plugs in: identity from the ${source} channel`, r.identity === source],
    );
    if (file.startsWith('v6-')) {
      // Issue 19, point 1: where the teeth are fine enough for the crank-speed fit, event duration checks it.
      checks.push(['3. plugs-in V6: the event-duration reading of the same teeth checks the figures and agrees', r.crossCheck?.method === 'event-duration' && r.crossCheck.agree]);
    }
    if (file.startsWith('i4-small')) {
      checks.push([
        '3. small I4: the two methods agree, or the wheel is said to be too coarse',
        (r.crossCheck?.method === 'battery' && r.crossCheck.agree) || codes.includes('WHEEL_TOO_COARSE'),
      ]);
    }
  } else if (file.startsWith('i3-')) {
    checks.push(
      ['4. plugs-in I3: glitch edges repaired and counted', (r.wheel?.glitchesDropped ?? 0) > 0 && codes.includes('TEETH_REPAIRED')],
      ['4. plugs-in I3: combustion, where it shows, is warned of', r.speedSwing! > MIN_COMPRESSION_SWING && (codes.includes('ENGINE_FIRED') || r.cylinders.every((c) => c.status !== 'low'))],
    );
  }
  return checks;
}

function main(): void {
  if (!existsSync(dir)) {
    process.stdout.write(`check:real: no folder at ${dir}; nothing to check.\n0 passed, 0 failed\n`);
    return;
  }
  let passed = 0;
  let failed = 0;
  const second = join(dir, 'second-set');
  const files = [
    ...readdirSync(dir).filter((f) => f.endsWith('.csv')).sort(),
    ...(existsSync(second) ? readdirSync(second).filter((f) => f.endsWith('.csv')).sort().map((f) => `second-set/${f}`) : []),
  ];
  for (const path of files) {
    const file = path.replace(/^second-set\//, '');
    const engine = ENGINES.find((e) => e.match.test(file))?.engine;
    if (!engine) {
      process.stdout.write(`? ${file}: no engine known for it (see captures-real/README.md)\n`);
      failed++;
      continue;
    }
    let checks: Check[];
    let summary = '';
    try {
      const { capture, result } = analyzeBytes(readFileSync(join(dir, path)), { engine });
      checks = path === file ? expectations(file, result, capture.confidence) : secondSet(file, result, capture.confidence);
      summary = `${result.method}, ${result.verdict}, ${result.identity}, ${result.wheel?.description ?? 'no wheel'}, swing ${result.speedSwing}, figures ${result.cylinders.map((c) => c.relativePercent ?? '—').join(' ')}`;
    } catch (e) {
      checks = [['read without an error', false]];
      summary = (e as Error).message;
    }
    process.stdout.write(`${path}: ${summary}\n`);
    for (const [what, ok] of checks) {
      process.stdout.write(`  ${ok ? 'ok  ' : 'FAIL'} ${what} (captures-real/README.md)\n`);
      if (ok) passed++;
      else failed++;
    }
  }
  process.stdout.write(`check:real: ${passed} passed, ${failed} failed\n`);
  process.exitCode = failed > 0 ? 1 : 0;
}

main();
