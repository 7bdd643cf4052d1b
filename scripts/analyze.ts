/** Command line: analyse one capture file and print the per-cylinder result (or JSON with --json). */
import { readFileSync, statSync } from 'node:fs';
import { parseArgs } from 'node:util';
import { analysisSettingsSchema, engineSettings } from '../domain/analysis-settings';
import { progress } from './progress';
import {
  analyzeBytes,
  type AnalysisResult,
  type AnalysisSettings,
  CaptureError,
  isCaptureError,
  MAX_CAPTURE_BYTES,
  MAX_CAPTURE_SIZE,
  intervalText,
  LIMITS,
  METHOD_CHOICES,
  STATUS_WORDS,
  VERDICT_WORDS,
  percentText,
} from '../signal';

const HELP = `Usage: npm run --silent analyze -- FILE --cylinders N --firing-order 1-3-4-2 [options]

  --method ${METHOD_CHOICES.join('|')}   method (auto: crank speed when there are teeth)
  --teeth WHEEL          crank wheel, learned from the capture when left out: 60-2, or runs of
                         teeth and gaps from position 0 such as 36:15/2,14/1,3/1, or 12:12+1
                         for 12 teeth and one extra tooth
  --mark-offset DEG      crank degrees from a cam/injector/coil mark to cylinder 1's TDC
                         (default 0 for a cam, 360 for an injector output)
  --low-limit ${LIMITS.lowLimitPercent.default}         low limit, % of the healthy cylinders
  --high-limit ${LIMITS.highLimitPercent.default}       upper limit: a cylinder wholly above it reads high
  --spread-limit ${LIMITS.spreadLimitPercent.default}      spread limit, percentage points
  --intervals 90-150-…   firing intervals for uneven fire, degrees
  --sample-rate HZ       samples per second, for a sample-index column
  --rotation N           step the assumed cylinder assignment
  --displacement L       engine displacement, litres (the starting-system check's current limit)
  --diesel               a diesel engine (twice the cranking-current allowance)
  --temperature C        air temperature, °C (the cranking-voltage limit falls when colder)
  --json                 one JSON object on stdout
  --help                 this text`;

/** The flag each setting comes from, to name it in a refusal. */
const FLAG_OF: Record<string, string> = {
  'engine.cylinders': '--cylinders',
  'engine.firingOrder': '--firing-order',
  'engine.intervalsDeg': '--intervals',
  method: '--method',
  teeth: '--teeth',
  ...Object.fromEntries(Object.entries(LIMITS).map(([key, rule]) => [key, rule.flag])),
  rotation: '--rotation',
  'starting.displacementL': '--displacement',
  'starting.temperatureC': '--temperature',
};

function usage(): never {
  return fail(HELP.split('\n')[0]);
}

let json = process.argv.includes('--json');

function fail(message: string, code = 'BAD_INPUT'): never {
  process.stderr.write(`${message}\n`);
  if (json) process.stdout.write(`${JSON.stringify({ error: { code, message } })}\n`);
  process.exit(2);
}

function main() {
  let parsed;
  try {
    parsed = parseArgs({
      allowPositionals: true,
      options: {
        cylinders: { type: 'string' },
        'firing-order': { type: 'string' },
        method: { type: 'string', default: 'auto' },
        teeth: { type: 'string' },
        'low-limit': { type: 'string' },
        'high-limit': { type: 'string' },
        'spread-limit': { type: 'string' },
        intervals: { type: 'string' },
        'sample-rate': { type: 'string' },
        rotation: { type: 'string', default: '0' },
        'mark-offset': { type: 'string' },
        displacement: { type: 'string' },
        diesel: { type: 'boolean', default: false },
        temperature: { type: 'string' },
        json: { type: 'boolean', default: false },
        help: { type: 'boolean', default: false },
      },
    });
  } catch (e) {
    fail(`${(e as Error).message}.`);
  }
  const { values, positionals } = parsed;
  if (values.help) {
    process.stdout.write(`${HELP}\n`);
    return;
  }
  json = !!values.json;
  const file = positionals[0];
  if (!file || positionals.length > 1) usage();
  const cylinders = Number(values.cylinders);
  if (!values.cylinders || !Number.isInteger(cylinders) || cylinders < 1 || cylinders > 16) fail('Give --cylinders as a whole number from 1 to 16.');
  if (!values['firing-order']) fail('Give --firing-order, for example 1-3-4-2.');
  // A flag left out is left to the schema's default (signal/limits.ts for the limits).
  const num = (flag: 'low-limit' | 'high-limit' | 'spread-limit' | 'rotation' | 'displacement' | 'temperature') => {
    if (values[flag] === undefined) return undefined;
    const v = Number(values[flag]);
    return Number.isFinite(v) ? v : fail(`--${flag} must be a number, not "${values[flag]}".`);
  };
  // The same schema, ranges and sentences as the workspace's settings (domain/analysis-settings.ts).
  const checked = analysisSettingsSchema.safeParse({
    engine: {
      cylinders,
      firingOrder: values['firing-order']!.trim().split(/[\s,\-–]+/).filter(Boolean).map(Number),
      intervalsDeg: values.intervals ? values.intervals.split(/[-,/]/).map(Number) : undefined,
    },
    method: values.method,
    teeth: values.teeth,
    lowLimitPercent: num('low-limit'),
    highLimitPercent: num('high-limit'),
    spreadLimitPercent: num('spread-limit'),
    rotation: num('rotation'),
    starting: {
      displacementL: num('displacement'),
      temperatureC: num('temperature'),
      diesel: values.diesel || undefined,
    },
  });
  if (!checked.success) {
    const issue = checked.error.issues[0];
    fail(`${FLAG_OF[issue.path.join('.')] ?? '--' + issue.path.join('.')}: ${issue.message}`);
  }
  const markOffset = values['mark-offset'] === undefined ? undefined : Number(values['mark-offset']);
  if (markOffset !== undefined && !Number.isFinite(markOffset)) fail('--mark-offset must be a number of crank degrees.');
  const sampleRate = values['sample-rate'] ? Number(values['sample-rate']) : undefined;
  if (sampleRate !== undefined && !(sampleRate > 0)) fail('--sample-rate must be a positive number of samples per second.');

  let bytes: Uint8Array;
  try {
    const st = statSync(file);
    if (!st.isFile()) fail(`${file} is not a file.`);
    if (st.size > MAX_CAPTURE_BYTES) fail(`${file} is ${(st.size / 1048576).toFixed(0)} MB; captures up to ${MAX_CAPTURE_SIZE} are accepted.`, 'TOO_LARGE');
    bytes = readFileSync(file);
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === 'ENOENT') fail(`No file at ${file}.`);
    throw e;
  }
  try {
    const settings: AnalysisSettings = { ...engineSettings(checked.data), markOffsetDeg: markOffset };
    const line = progress(file);
    line.step(`analysing ${(bytes.length / 1048576).toFixed(1)} MB`);
    const { result } = analyzeBytes(bytes, settings, { sampleRateHz: sampleRate });
    line.done();
    if (json) {
      process.stdout.write(`${JSON.stringify(result)}\n`);
      return;
    }
    const lines = [
      `Method ${result.method}, cranking ${result.crankingRpm} rpm, cylinder identity ${result.identity}, verdict ${result.verdict}`,
      `${VERDICT_WORDS[result.verdict]}.`,
      ...(result.wheel ? [`Wheel: ${result.wheel.description} (${result.wheel.notation}, ${result.wheel.learned ? 'learned from the capture' : 'as set'})`] : []),
      ...(result.identityNote ? [result.identityNote] : []),
      ...result.cylinders.map((c) => `  cylinder ${String(c.cylinder).padStart(2)}  ${percentText(c.relativePercent).padStart(5)} %  (90 %: ${intervalText(c.interval)})  ${STATUS_WORDS[c.status].padEnd(9)} ${c.events} events`),
      `Capture quality ${result.quality.grade}${result.quality.limitedBy !== 'none' ? `, limited by ${result.quality.limitedBy}` : ''}: ${result.quality.note}`,
      ...(result.crossCheck ? [`Cross-check (${result.crossCheck.method}): ${result.crossCheck.cylinders.map((c) => c.relativePercent ?? '—').join(' ')} — ${result.crossCheck.agree ? 'agrees' : 'disagrees'}`] : []),
      `Spread ${result.spreadPercent} points. ${result.pattern.hint}`,
      ...(result.startingSystem ? startingLines(result.startingSystem) : []),
      ...result.warnings.map((w) => `  ! ${w.code}: ${w.message}${w.cylinders !== undefined ? ` Try --cylinders ${w.cylinders} with that engine's firing order.` : ''}`),
    ];
    process.stdout.write(`${lines.join('\n')}\n`);
  } catch (e) {
    if (isCaptureError(e)) fail(describe(e), e.code);
    throw e;
  }
}

function describe(e: CaptureError): string {
  return e.message;
}

main();

/** The starting system in a few lines: each measured figure against its limit, then what to do. */
function startingLines(s: NonNullable<AnalysisResult['startingSystem']>): string[] {
  const measured = s.checks.filter((c) => c.status !== 'not measured');
  return [
    `Starting system (${s.systemV} V): ${measured.map((c) => `${c.label.toLowerCase()} ${c.value} ${c.unit} ${c.status === 'ok' ? 'ok' : c.status} (${c.limit})`).join('; ') || 'nothing measured'}`,
    ...s.advice.map((a) => `  ! ${a}`),
  ];
}
