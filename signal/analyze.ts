/**
 * The analysis: picks the method for the channels present, runs it (and the other one as a cross-check when
 * both current and crank channels exist), and turns the fit into per-cylinder results, a verdict and warnings.
 */
import { checkFiringOrder, firingIntervals } from './engine/firing';
import { CaptureError } from './errors';
import { clampReversed, type MethodOutcome, type MethodRun, runCurrentMethod } from './methods/current';
import { type CrankInput, type CrankTeeth, readCrankTeeth, runCrankSpeedMethod, runSpeedChannelMethod } from './methods/crank-speed';
import { runEventDurationMethod } from './methods/event-duration';
import { startedSentence } from './steps/cranking-end';
import { NO_TEETH } from './steps/cranking-window';
import { findCycleMarks } from './teeth/cycle-marks';
import { describePattern } from './grade/pattern';
import { summarize } from './steps/summarize';
import { runFit } from './fit/run-fit';
import { dropWarnings, type QualityWarning, warning } from './warnings';
import type { AnalysisResult, AnalysisSettings, CaptureColumns, CylinderResult, CylinderStatus, Method, MethodResult, WheelInfo } from './types';
import { ENGINE_VERSION } from './version';
import { cylinderIntervals, widenBy } from './grade/interval';
import { crossCheck as compareMethods } from './steps/cross-check';
import type { CrankSpeedTrace } from './steps/clutch-overrun';
import { gradeCapture, holdAfterLow, holdHigh, holdMostLow, isThin, type Limits, settleStatuses } from './grade/status';
import { batteryAtTeeth, isEdgeSampled, runBatteryMethod } from './methods/battery';
import { teethOf, wheelNotation } from './teeth/wheel';
import { measureStarting, type StartingFigures } from './starting/measure';
import { checkStartingSystem, type StartingSystem } from './starting/check';
import { LIMITS, limitProblem } from './limits';
import { methodAdjective } from './format';

/**
 * Smallest interval half-width, points, for crank speed and for the electrical methods: each the narrowest, in
 * half points, on which the ensemble gives no confident wrong flag on either of its samples (seeds 1–80 and
 * 201–280). The electrical methods at 3 called a healthy cylinder low once on battery voltage; at 3.5 their
 * intervals hold 93.0–93.3 % and 95.4 % of the truths on the two samples, 93.8–96.9 % on the held-out family (97.2–97.8 %
 * at 4, over the 97 % cap) and 96.6–98.8 % with a weak battery or a dragging starter. Crank speed at 2.5 held only
 * 89.2 % on VR, too near the 88 % floor.
 */
const CRANK_FLOOR_POINTS = 3;
const ELECTRICAL_FLOOR_POINTS = 3.5;
const MIN_RPM = 100;
const MAX_RPM = 400;
const MIN_CYCLES = 3;
const MIN_FIT = 0.6;
/** Teeth this long before the cranking window are an unsteady start worth a sentence (the starter engages within 0.5 s). */
const UNSTEADY_LEAD_S = 1;

/** Analyses decoded capture columns. Throws CaptureError only for bad settings; a bad capture gives `uncertain`. */
export function analyzeCapture(columns: CaptureColumns, settings: AnalysisSettings, importWarnings: QualityWarning[] = []): AnalysisResult {
  const setup = settings.engine;
  checkFiringOrder(setup.firingOrder, setup.cylinders);
  firingIntervals(setup);
  const lowLimit = settings.lowLimitPercent ?? LIMITS.lowLimitPercent.default;
  const spreadLimit = settings.spreadLimitPercent ?? LIMITS.spreadLimitPercent.default;
  const highLimit = settings.highLimitPercent ?? LIMITS.highLimitPercent.default;
  const problem = limitProblem('highLimitPercent', highLimit) ?? limitProblem('lowLimitPercent', lowLimit) ?? limitProblem('spreadLimitPercent', spreadLimit);
  if (problem) throw new CaptureError('BAD_SETTINGS', problem);
  const limits: Limits = { lowLimitPercent: lowLimit, highLimitPercent: highLimit, minEvents: MIN_CYCLES };
  const rotation = Math.trunc(settings.rotation ?? 0);
  const choice = settings.method ?? 'auto';
  const hasCurrent = !!(columns.current && columns.time);
  const hasCrank = !!(columns.toothTimes || (columns.crank && columns.time) || (columns.rpm && columns.time));
  const hasBattery = !!(columns.battery && columns.time);
  const hasTeeth = !!(columns.toothTimes || (columns.crank && columns.time));
  const crankInput: CrankInput = {
    toothTimes: columns.toothTimes,
    time: columns.time,
    crank: columns.crank,
    sync: columns.sync,
    marks: columns.marks,
    sensor: settings.sensor,
    teeth: settings.teeth,
    markOffsetDeg: settings.markOffsetDeg,
  };
  let teethRead: CrankTeeth | null | undefined;
  const readTeeth = () => (teethRead === undefined ? (teethRead = readCrankTeeth(crankInput, setup)) : teethRead);

  let crankOutcome: MethodOutcome | undefined;
  const runMethod = (method: Method): MethodOutcome => {
    if (method === 'current') {
      if (!hasCurrent) return { ok: false, warnings: [warning('NO_USABLE_CHANNEL', 'The starter-current method needs a current channel (A) and a time column; map them or choose the crank-speed method.')] };
      const { current, notice } = orientCurrent(columns.current!);
      const outcome = runCurrentMethod(columns.time!, current, columns.sync, setup, rotation, settings.window, crankSpeed());
      return notice ? withWarning(outcome, notice) : outcome;
    }
    if (method === 'battery') {
      if (!hasBattery) return { ok: false, warnings: [warning('NO_USABLE_CHANNEL', 'The battery-voltage method needs a battery-voltage channel (V) and a time column; map them or choose another method.')] };
      // Logged only at each tooth edge, the voltage is read along the crank-speed method's events.
      if (isEdgeSampled(columns)) return batteryAtTeeth(columns, runMethod('crank-speed'), setup, lowLimit);
      return runBatteryMethod(columns.time!, columns.battery!, columns.sync, setup, rotation, settings.window, crankSpeed());
    }
    if (method === 'event-duration') {
      if (!hasTeeth) return { ok: false, warnings: [warning('NO_USABLE_CHANNEL', 'The event-duration method needs crank tooth times or a crank sensor channel; map one or choose another method.')] };
      const read = readTeeth();
      if (!read) return { ok: false, warnings: [warning('NO_CRANKING', NO_TEETH)] };
      return runEventDurationMethod(
        {
          teeth: read.teeth,
          ...wheelForDurations(read, columns.marks),
          marks: columns.marks,
          markOffsetDeg: settings.markOffsetDeg,
          sync: columns.sync && columns.time ? { time: columns.time, values: columns.sync } : undefined,
          lowLimitPercent: lowLimit,
        },
        setup,
        rotation,
        settings.window,
      );
    }
    if (!hasCrank) return { ok: false, warnings: [warning('NO_USABLE_CHANNEL', 'The crank-speed method needs crank tooth times, a crank sensor channel or an engine-speed channel; map one or choose the starter-current method.')] };
    // Run once: the cross-check, the choice of method and the electrical methods' clutch check all ask for it.
    crankOutcome ??=
      !columns.toothTimes && !columns.crank
        ? runSpeedChannelMethod(columns.time!, columns.rpm!, setup, rotation, settings.window)
        : runCrankSpeedMethod(crankInput, setup, rotation, settings.window, readTeeth());
    return crankOutcome;
  };
  // The crank's own speed, where its wheel draws a speed curve, shows where the starter's clutch ran free.
  const crankSpeed = (): CrankSpeedTrace | undefined => {
    const crank = hasCrank ? runMethod('crank-speed') : undefined;
    return crank?.ok && !crank.run.wheel?.tooCoarse ? { t: crank.run.motion.t, omega: crank.run.motion.s } : undefined;
  };
  const results = new Map<Method, MethodResult>();
  const resultOf = (method: Method): MethodResult => {
    let r = results.get(method);
    if (!r) results.set(method, (r = toMethodResult(method, runMethod(method), settings, limits, spreadLimit, importWarnings)));
    return r;
  };

  // Crank speed first; on a wheel too coarse to separate cylinders, an electrical channel leads.
  let primary: Method = choice === 'auto' ? (hasCrank ? 'crank-speed' : hasCurrent ? 'current' : hasBattery ? 'battery' : 'current') : choice;
  if (choice === 'auto' && primary === 'crank-speed' && (hasCurrent || hasBattery)) {
    const crank = runMethod('crank-speed');
    if (crank.ok && crank.run.wheel?.tooCoarse) primary = hasCurrent ? 'current' : 'battery';
  } else if (choice === 'auto' && primary === 'crank-speed' && hasTeeth && !usable(resultOf('crank-speed')) && !isFinding(resultOf('crank-speed'))) {
    // Teeth too coarse or too noisy for a speed curve still time each event; thin figures beat none.
    const duration = resultOf('event-duration');
    if (usable(duration) || (hasFigures(duration) && !hasFigures(resultOf('crank-speed')))) primary = 'event-duration';
  }
  const result = resultOf(primary);
  const firstTooth = columns.toothTimes?.[0];
  if (firstTooth !== undefined && !settings.window && result.window.endS > result.window.startS && result.window.startS - firstTooth > UNSTEADY_LEAD_S) {
    const skipped = result.window.startS - firstTooth;
    result.warnings.push(warning('UNSTEADY_START', `The first ${skipped.toFixed(1)} s of crank teeth were unsteady (the starter engaging, or lost, extra or noisy edges) and were left out; the steady cranking from ${result.window.startS.toFixed(1)} s was read.`));
  }
  const startingSystem = checkStarting(columns, result, settings);
  if (distortedByStarting(result, startingSystem)) settle(result.cylinders, result.method, result.warnings, result.wheel, setup, limits);

  let crossCheck: AnalysisResult['crossCheck'];
  const electrical: Method | null = hasCurrent ? 'current' : hasBattery ? 'battery' : null;
  // Teeth fine enough for a speed curve are timed event by event as well, when no electrical channel checks them
  // (not where the engine fired: crank speed leaves those events out, event duration cannot tell them).
  const fired = result.warnings.some((w) => w.code === 'ENGINE_FIRED');
  const teethCheck: Method | null = primary === 'crank-speed' && hasTeeth && result.wheel && !result.wheel.tooCoarse && !fired ? 'event-duration' : null;
  const otherMethod: Method | null =
    choice !== 'auto' ? null : primary === 'crank-speed' || primary === 'event-duration' ? (electrical ?? teethCheck) : hasCrank ? 'crank-speed' : null;
  if (otherMethod) {
    const other = resultOf(otherMethod);
    // A method whose own evidence is thin (a wheel too coarse for crank speed, say) is no check on the other.
    const checked = !isThin(other.method, other.warnings, other.wheel) && other.fitQuality > 0 ? compareMethods(result, other, setup.firingOrder) : null;
    if (checked) {
      crossCheck = checked;
      result.warnings.push(...other.warnings.filter((w) => w.code === 'CLUTCH_OVERRUN'));
      settle(result.cylinders, result.method, result.warnings, result.wheel, setup, limits);
      if (!checked.agree) {
        const check = otherMethod === teethCheck ? 'the wheel, the cylinder count and the firing order' : 'both probes and the firing order';
        result.warnings.push(warning('METHODS_DISAGREE', `The ${methodAdjective(primary)} and ${methodAdjective(otherMethod)} methods differ by up to ${checked.maxDifference} points; check ${check} before trusting either.`));
      }
    }
  }

  const statuses = result.cylinders.map((c) => c.status);
  // A cylinder read low stands even when another is uncertain; otherwise any doubt makes the verdict uncertain.
  const verdict: CylinderStatus = statuses.includes('low') ? 'low' : statuses.includes('high') ? 'high' : statuses.includes('uncertain') ? 'uncertain' : 'ok';
  const pattern = describePattern(setup, result.cylinders, verdict === 'uncertain', result.identity === 'assumed');
  const quality = gradeCapture(result.cylinders, result.warnings, isThin(result.method, result.warnings, result.wheel), result.identity === 'assumed');
  return {
    engineVersion: ENGINE_VERSION,
    ...result,
    verdict,
    quality,
    pattern,
    settings: {
      method: choice,
      cylinders: setup.cylinders,
      firingOrder: setup.firingOrder,
      lowLimitPercent: lowLimit,
      spreadLimitPercent: spreadLimit,
      highLimitPercent: highLimit,
      rotation,
      teeth: settings.teeth ? wheelNotation(settings.teeth) : undefined,
    },
    startingSystem,
    crossCheck,
  };
}

/** The battery and starter from the electrical channels, and the cranking speed. */
function checkStarting(columns: CaptureColumns, result: MethodResult, settings: AnalysisSettings): StartingSystem | undefined {
  const figures = columns.time ? measureStarting({ time: columns.time, current: columns.current, battery: columns.battery, window: result.window }) : null;
  if (!figures && !(result.crankingRpm > 0)) return undefined;
  // An electrical method that found no compression found no cranking speed either (a stalled starter reads its ripple).
  const noSpeed = result.method !== 'crank-speed' && result.method !== 'event-duration' && result.warnings.some((w) => w.code === 'NO_COMPRESSION' || w.code === 'NO_CRANKING');
  return checkStartingSystem(figures ?? NOTHING_MEASURED, noSpeed ? null : result.crankingRpm || null, settings.starting);
}

/**
 * Points added to each side of every interval when the engine cranked slower than the starting-system limit:
 * slow cranking moves the figures further than their events show (measured on the simulator's weak-battery and
 * dragging-starter families, where the intervals without it held 83–84 % of the truths on the electrical methods).
 */
const SLOW_CRANKING_POINTS = 4;
/**
 * Below this share of the slowest cranking speed the electrical methods give no figures: the starter's one-way
 * clutch lets go between compressions, so its current no longer follows the crank (on the simulator's weak-battery
 * and dragging-starter families their figures went wrong from about 120 rpm down, and held above it).
 * Event duration gives none as soon as cranking is slow: each event's duration then follows the starter catching
 * the crank up. On 10 draws per layout of those families a leaking cylinder read two to four times its true loss
 * below the slowest cranking speed, and a healthy cylinder beside a dead one read 0 %.
 */
const OVERRUN_SHARE = 0.8;

/**
 * Figures read through a starting-system fault. A crank slower than the analysis needs gives no figures at all;
 * cranking slower than the starting-system limit widens every interval and leaves event duration without figures,
 * and well below it the electrical methods give none either (OVERRUN_SHARE). True when figures changed.
 */
function distortedByStarting(result: MethodResult, s: StartingSystem | undefined): boolean {
  if (!result.cylinders.some((c) => c.relativePercent !== null)) return false;
  const check = (key: string) => s?.checks.find((c) => c.key === key);
  const status = (key: string) => check(key)?.status;
  const slow = status('cranking-speed') === 'low';
  const speed = check('cranking-speed');
  const crawling = speed?.value != null && speed.threshold !== null && speed.value < OVERRUN_SHARE * speed.threshold;
  const drawHigh = status('cranking-current') === 'high';
  const fault = !!s?.weakBattery || drawHigh;
  const cause = s?.weakBattery ? 'The battery is weak' : drawHigh ? 'The starter draws too much' : 'The engine cranked slowly';
  const electrical = result.method === 'current' || result.method === 'battery';
  const tooSlow = result.warnings.some((w) => w.code === 'CRANKING_TOO_SLOW');
  // Crawling is below 80 % of the same limit that makes cranking slow, so it is always slow too.
  const starterBound = electrical ? crawling : result.method === 'event-duration' && slow;
  if (tooSlow || starterBound) {
    for (const c of result.cylinders) withholdFigures(c);
    const why = tooSlow ? 'the crank turned too slowly to compare cylinders' : electrical ? 'the starter’s current no longer follows the crank' : 'each event’s duration follows the starter catching the crank up';
    if (fault || slow) result.warnings.push(warning('WEAK_BATTERY', `${cause} (see the starting system) and ${why}: no figures are given. Put the battery or starter right and record again${electrical && !tooSlow ? ', or record the crank sensor' : ''}.`));
    return true;
  }
  if (slow) for (const c of result.cylinders) if (c.interval) c.interval = widenBy(c.interval, SLOW_CRANKING_POINTS);
  if (slow || fault) result.warnings.push(warning('WEAK_BATTERY', `${cause} (see the starting system): slow, uneven cranking moves the figures${slow ? ', so their ranges are wider' : ''}; put it right and record again before acting on a close call.`));
  return slow;
}

/** A cylinder's figures taken away (its raw measurements stay): no compression to compare, or none to trust. */
function withholdFigures(c: CylinderResult): void {
  c.relativePercent = null;
  c.interval = null;
  c.plainPercent = null;
  c.perCycle = [];
}

const NOTHING_MEASURED: StartingFigures = { systemV: 12, engagedAtS: null, restingV: null, inrushMinV: null, crankingMinV: null, crankingMeanV: null, inrushPeakA: null, crankingMeanA: null, internalMilliOhm: null };

function toMethodResult(
  method: Method,
  outcome: MethodOutcome,
  settings: AnalysisSettings,
  limits: Limits,
  spreadLimit: number,
  importWarnings: QualityWarning[],
): MethodResult {
  const lowLimit = limits.lowLimitPercent;
  const setup = settings.engine;
  const n = setup.cylinders;
  const warnings: QualityWarning[] = [...importWarnings];
  if (!outcome.ok) {
    warnings.push(...outcome.warnings);
    return {
      method,
      crankingRpm: 0,
      identity: 'assumed',
      window: { startS: 0, endS: 0 },
      cylinders: Array.from({ length: n }, (_, i) => ({
        cylinder: i + 1, relativePercent: null, interval: null, status: 'uncertain' as const, events: 0, rejected: 0, spreadPercent: 0, plainPercent: null, raw: 0, perCycle: [],
      })),
      events: [],
      rawUnit: RAW_UNIT[method],
      spreadPercent: 0,
      fitQuality: 0,
      warnings,
    };
  }
  const run: MethodRun = outcome.run;
  warnings.push(...run.warnings);
  // With no compression, or events that contradict the engine set up, there is nothing to compare: no figures,
  // and no follow-on complaints about events.
  const noCompression = run.warnings.some((w) => w.code === 'NO_COMPRESSION' || w.cylinders !== undefined);
  const half = Math.min(...firingIntervals(setup)) / 2;
  const isCurrent = method !== 'crank-speed';
  let fit = run.fit;
  const skip = run.excluded ?? new Set<string>();
  let summary = run.figures ?? summarize(run.motion, fit, n, half, isCurrent, lowLimit, skip);
  if (summary.rejectedKeys.size > 0 && !run.figures) {
    const refit = runFit(run.motion, setup, run.identity !== 'assumed', Math.trunc(settings.rotation ?? 0), new Set([...summary.rejectedKeys, ...skip]));
    if (refit) {
      fit = refit;
      const again = summarize(run.motion, fit, n, half, isCurrent, lowLimit, skip);
      // Keep the first pass's rejected set: the refit leaves those events out.
      summary = { ...again, rejectedKeys: summary.rejectedKeys };
    }
    if (!noCompression) warnings.push(warning('EVENTS_REJECTED', `${summary.rejectedKeys.size} compression event(s) looked malformed (a spike or dropout) and were left out.`));
  }

  if (noCompression) {
    // With no compression there is no cylinder count to read either.
    const none = run.warnings.some((w) => w.code === 'NO_COMPRESSION');
    dropWarnings(warnings, (w) => w.code === 'FIRING_ORDER_MISMATCH' && (none || w.cylinders === undefined));
  }
  const rpm = Math.round(run.rpm * 10) / 10;
  if (rpm < MIN_RPM) warnings.push(warning('CRANKING_TOO_SLOW', `Cranking averaged ${rpm.toFixed(0)} rpm, below the ${MIN_RPM} rpm needed; charge or replace the battery and check the starter, then record again.`));
  if (rpm > MAX_RPM) warnings.push(warning('CRANKING_TOO_FAST', `The crank turned at ${rpm.toFixed(0)} rpm, faster than cranking (${MAX_RPM} rpm); the engine may have started. Disable fuel as the service information directs and record again.`));
  const cycles = Math.min(...summary.cylinders.map((c) => c.events));
  if (run.startedAtS !== undefined) warnings.push(warning('ENGINE_STARTED', startedSentence(run.startedAtS, run.window.endS - run.window.startS, cycles)));
  if (cycles < MIN_CYCLES && !noCompression) warnings.push(warning('TOO_FEW_CYCLES', `Only ${cycles} complete engine cycle(s) per cylinder were usable; crank for 5–10 s so at least ${MIN_CYCLES} are recorded.`));
  if (fit.r2 < MIN_FIT && !noCompression && !warnings.some((w) => w.code === 'FIRING_ORDER_MISMATCH')) warnings.push(warning('FIRING_ORDER_MISMATCH', `The compression events do not follow ${n} cylinders firing ${setup.firingOrder.join('-')}; check the cylinder count, firing order and intervals against the service information.`));
  if (run.identity === 'assumed' && !warnings.some((w) => w.code === 'SYNC_NOT_FOUND')) {
    warnings.push(warning('NO_SYNC', `Without a cylinder 1 sync channel, the numbers assume the first event is cylinder ${setup.firingOrder[0]}; rotate the assignment if you know better, or record again with sync on cylinder 1.`));
  }
  if (run.rawScale) for (const c of summary.cylinders) c.raw = Math.round(c.raw * run.rawScale * 100) / 100;
  const thin = isThin(method, warnings, run.wheel);
  const intervals = cylinderIntervals(
    summary.cylinders.map((c) => c.perCycle),
    summary.cylinders.map((c) => c.relativePercent),
    { lowLimitPercent: lowLimit, floorPoints: method === 'crank-speed' ? CRANK_FLOOR_POINTS : ELECTRICAL_FLOOR_POINTS, leaky: Array.from(fit.leakPerS, (l) => l > 0) },
  );
  const inconsistent: number[] = [];
  for (const [i, c] of summary.cylinders.entries()) {
    if (noCompression) {
      // Nothing to compare: no figure of any kind, only the raw measurements.
      withholdFigures(c);
      c.spreadPercent = 0;
    }
    // A method that gives its own intervals (event duration) keeps them.
    c.interval = c.relativePercent === null ? null : run.figures && c.interval ? c.interval : intervals[i];
    if (c.spreadPercent > spreadLimit) inconsistent.push(c.cylinder);
  }
  settle(summary.cylinders, method, warnings, run.wheel, setup, limits);
  if (inconsistent.length && !noCompression) {
    warnings.push(warning('INCONSISTENT_CYCLES', `Cylinder${inconsistent.length > 1 ? 's' : ''} ${inconsistent.join(', ')} varied by more than ${spreadLimit} points from cycle to cycle; look at the trace for misfiring probes or an unsteady crank.`));
  }
  if (summary.spreadPercent > spreadLimit && !thin) {
    warnings.push(warning('SPREAD_HIGH', `The strongest and weakest cylinders differ by ${summary.spreadPercent} points, more than the ${spreadLimit}-point spread limit.`));
  }
  return {
    method,
    crankingRpm: rpm,
    identity: run.identity,
    identityNote: run.identityNote,
    wheel: run.wheel,
    speedSwing: run.speedSwing,
    window: { startS: round3(run.window.startS), endS: round3(run.window.endS) },
    cylinders: summary.cylinders,
    events: summary.events.map((e) => ({ ...e, timeS: round3(e.timeS) })),
    rawUnit: RAW_UNIT[method],
    spreadPercent: noCompression ? 0 : summary.spreadPercent,
    fitQuality: Math.round(fit.r2 * 1000) / 1000,
    warnings,
  };
}

const RAW_UNIT = { current: 'A', 'crank-speed': 'rpm', 'event-duration': 'ms', battery: 'V' } as const;

/** A result that ranks cylinders: figures for every cylinder and no warning that leaves nothing to rank. */
function usable(r: MethodResult): boolean {
  return !isThin(r.method, r.warnings, r.wheel) && hasFigures(r);
}

/**
 * A result whose lack of figures is itself the answer: no compression, or events that contradict the engine, read
 * on a wheel fine enough to see them (a coarse pattern learned from its gaps may be compression, not a gap).
 */
function isFinding(r: MethodResult): boolean {
  return !r.wheel?.tooCoarse && r.warnings.some((w) => w.code === 'NO_COMPRESSION' || w.cylinders !== undefined);
}

function hasFigures(r: MethodResult): boolean {
  return r.cylinders.every((c) => c.relativePercent !== null);
}

/**
 * The wheel the event-duration method times events on: the learned one when it is fine, or coarse but in step
 * with a cycle mark (its teeth a cycle are the mark's); otherwise none, and the method counts teeth per cycle
 * itself (a coarse pattern learned from its gaps can be compression, not a gap).
 */
function wheelForDurations(read: CrankTeeth, marks: CaptureColumns['marks']): { angles?: { times: Float64Array; angleDeg: Float64Array }; wheel?: WheelInfo; cycleTeeth?: number } {
  const f = read.found;
  if (!f) return {};
  const fine = teethOf(f.wheel) >= 16;
  const cycle = fine ? null : findCycleMarks(marks, read.teeth);
  if (!fine && !(cycle && Math.abs(cycle.teethPerCycle - 2 * teethOf(f.wheel)) < 0.6)) return {};
  return { angles: { times: f.angles.times, angleDeg: f.angles.angleDeg }, wheel: f.info, cycleTeeth: 2 * teethOf(f.wheel) };
}

/** A clamp put on backwards reads the cranking current negative: read its magnitude, and say so. */
function orientCurrent(current: Float64Array): { current: Float64Array; notice?: QualityWarning } {
  if (!clampReversed(current)) return { current };
  return {
    current: current.map((v) => -v),
    notice: warning('CLAMP_REVERSED', 'The current reads negative while cranking: the clamp is on backwards. The capture was read as its magnitude; turn the clamp so its arrow points along the current next time.'),
  };
}

function withWarning(outcome: MethodOutcome, w: QualityWarning): MethodOutcome {
  return outcome.ok ? { ok: true, run: { ...outcome.run, warnings: [w, ...outcome.run.warnings] } } : { ok: false, warnings: [w, ...outcome.warnings] };
}

/**
 * Statuses from the intervals, then the electrical methods' hold on a cylinder right after a low one: once when
 * the result is made, and again when a disagreeing second method has widened the intervals.
 */
function settle(cylinders: CylinderResult[], method: Method, warnings: QualityWarning[], wheel: WheelInfo | undefined, setup: AnalysisSettings['engine'], limits: Limits): void {
  settleStatuses(cylinders, isThin(method, warnings, wheel), limits, warnings);
  if (method === 'event-duration') holdMostLow(cylinders, warnings);
  holdAfterLow(cylinders, setup, limits.lowLimitPercent, warnings, method);
  if (method === 'event-duration') holdHigh(cylinders, warnings);
}

function round3(v: number): number {
  return Math.round(v * 1000) / 1000;
}
