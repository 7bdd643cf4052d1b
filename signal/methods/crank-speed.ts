/**
 * The crank-speed method: tooth edge times (given, or found in a sampled Hall or variable-reluctance
 * waveform), the missing-tooth gap for the angle, speed per tooth, and the torque-balance fit. An engine-speed
 * channel (rpm) is integrated for the angle instead.
 */
import { type EngineSetup, firingIntervals } from '../engine/firing';
import { indexAtTime } from '../dsp/decimate';
import { median } from '../dsp/stats';
import { NO_TEETH, NOT_STEADY, windowFromSpeed } from '../steps/cranking-window';
import { engineStartOnTeeth, startedTooSoon } from '../steps/cranking-end';
import { type CrankMotion, meanRpm, motionFromSpeed, motionFromTeeth } from '../steps/crank-motion';
import { runFit } from '../fit/run-fit';
import { eventCountWarning, meanAbs, MIN_SPEED_ORDER_SHARE, resampleByAngle } from '../steps/event-count';
import { orderAmplitude } from '../dsp/event-rate';
import { findSyncPulses, SYNC_PULSE_MISSING } from '../steps/sync-pulses';
import { type QualityWarning, warning } from '../warnings';
import { guessSensorKind, type SensorKind, toothTimesFromWaveform } from '../teeth/from-waveform';
import { dropGlitches, learnWheel, type TeethRepair, type WheelAngles, wheelAngles } from '../teeth/learn-wheel';
import { cycleMarksOf, findCycleMarks } from '../teeth/cycle-marks';
import { describeWheel, teethOf, type ToothWheel, wheelNotation } from '../teeth/wheel';
import type { CylinderMarks } from '../import/edge-log';
import { DEFAULT_MARK_OFFSET_DEG, MARK_WORDS } from './mark-words';
import { compressionEvidence, MIN_COMPRESSION_SWING, noCompressionOnSpeed } from '../steps/compression-evidence';
import type { IdentitySource, WheelInfo } from '../types';
import type { CrankingWindow } from '../steps/cranking-window';
import type { MethodOutcome } from './current';

export interface CrankInput {
  toothTimes?: Float64Array;
  time?: Float64Array;
  crank?: Float64Array;
  sync?: Float64Array;
  /** Cylinder-1 mark candidates from an edge log, best first. */
  marks?: CylinderMarks[];
  sensor?: 'auto' | SensorKind;
  teeth?: ToothWheel;
  markOffsetDeg?: number;
}

/** A wheel with fewer positions than this per firing interval cannot separate cylinders by crank speed (the compression torque's shape needs about six samples an event; an 8-tooth wheel on an inline 4 gives four). */
const MIN_POSITIONS_PER_EVENT = 6;

/** Crank teeth as read from a capture: the clean edge times, and the wheel with every edge's angle where one was found. */
export interface CrankTeeth {
  /** Edge times with glitches dropped, s. */
  teeth: Float64Array;
  /** Samples per second of a sampled waveform (0 for edge times). */
  sampleRate: number;
  /** The wheel, its angles and what was repaired, when its reference was found at least twice. */
  found?: { wheel: ToothWheel; angles: WheelAngles; info: WheelInfo; repairs: TeethRepair[] };
  /** Why no wheel was found, as the method's failure. */
  problem?: QualityWarning;
}

/**
 * Tooth edges (given, or found in a sampled waveform) with glitches dropped, and the wheel: the one set, or the
 * one learned from its gaps. A gapped pattern that a cycle mark shows to repeat several times a revolution (the
 * same gap every 120°, say) becomes the whole wheel, its angles scaled to match.
 */
export function readCrankTeeth(input: CrankInput, setup: EngineSetup): CrankTeeth | null {
  let times = input.toothTimes;
  let sampleRate = 0;
  if (!times && input.time && input.crank) {
    const kind = input.sensor && input.sensor !== 'auto' ? input.sensor : guessSensorKind(input.crank);
    times = toothTimesFromWaveform(input.time, input.crank, kind);
    sampleRate = (input.time.length - 1) / (input.time[input.time.length - 1] - input.time[0]);
  }
  if (!times || times.length < 20) return null;
  const clean = dropGlitches(times);
  const learned = !input.teeth;
  // A noisy first stretch (sync lost, bursts) can hide the pattern: learn it again on the later teeth.
  const unit = input.teeth ?? learnWheel(clean.times) ?? learnWheel(clean.times.subarray(Math.floor(clean.times.length * 0.4)));
  const out: CrankTeeth = { teeth: clean.times, sampleRate };
  if (!unit) {
    out.problem = warning('NO_TOOTH_GAP', 'No gap or extra tooth repeats in the crank signal, so crank angle is unknown; set the wheel (for example 60-2, or 36:15/2,14/1,3/1 for several gaps) or check the sensor signal.');
    return out;
  }
  const unitAngles = wheelAngles(clean.times, unit);
  if (!unitAngles || unitAngles.revolutions < 2) {
    out.problem = warning('NO_TOOTH_GAP', `The ${describeWheel(unit)} wheel was not found at least twice in a row; check the wheel setting and record longer.`);
    return out;
  }
  // A learned pattern that repeats r times a revolution: a cycle mark counts 2·r patterns' teeth a cycle.
  const repeats = learned ? repeatsPerRevolution(input.marks, clean.times, teethOf(unit)) || repeatsFromCompression(unitAngles, setup, unit) : 1;
  const wheel = repeats > 1 ? repeatWheel(unit, repeats) : unit;
  const angles = repeats > 1 ? { ...unitAngles, wheel, angleDeg: unitAngles.angleDeg.map((a) => a / repeats) } : unitAngles;
  const iv = firingIntervals(setup);
  const pitch = 360 / wheel.positions;
  const info: WheelInfo = {
    notation: wheelNotation(wheel),
    description: describeWheel(wheel) + (repeats > 1 ? ` (the same pattern ${repeats} times a revolution${input.marks?.length ? ', placed by the cycle mark' : '; which of them starts the revolution is assumed'})` : ''),
    learned,
    glitchesDropped: clean.dropped + angles.dropped,
    teethInserted: angles.inserted,
    tooCoarse: Math.min(...iv) / pitch < MIN_POSITIONS_PER_EVENT,
  };
  const glitches = clean.droppedAtS.map((t): TeethRepair => ({ kind: 'dropped', count: 1, fromS: t, toS: t }));
  out.found = { wheel, angles, info, repairs: [...glitches, ...angles.repairs] };
  return out;
}

/** How many times a learned tooth pattern repeats a revolution, from a cycle mark's teeth per cycle (0 without one). */
function repeatsPerRevolution(marks: CylinderMarks[] | undefined, teeth: Float64Array, unitTeeth: number): number {
  const cycle = findCycleMarks(marks, teeth);
  if (!cycle) return 0;
  const r = cycle.teethPerCycle / (2 * unitTeeth);
  const whole = Math.round(r);
  // A coarse pattern's "gap" may be compression stretching a tooth period: only a fine pattern is repeated.
  return unitTeeth >= 8 && whole >= 2 && whole <= 6 && Math.abs(r - whole) < 0.05 ? whole : 1;
}

/**
 * Without a cycle mark: the compression events the speed shows per two of the pattern's turns. An engine has
 * n/2 events a revolution, so a pattern that shows n/(2r) of them repeats r times a revolution (the same gap every
 * 120° shows one event a pattern on a V6, against three a revolution). Only a clear compression signature (its
 * order at least 1.5 % of the speed) counts; the revolution's start is then assumed.
 */
function repeatsFromCompression(a: WheelAngles, setup: EngineSetup, unit: ToothWheel): number {
  if (teethOf(unit) < 8) return 1;
  const m = motionFromTeeth(a.times, a.angleDeg, -Infinity, Infinity);
  const grid = resampleByAngle(m.thetaDeg, m.s);
  if (!grid) return 1;
  const n = setup.cylinders;
  const mean = meanAbs(grid.x);
  let best = 0;
  let bestCount = n;
  for (let c = 1; c <= n; c++) {
    const amp = orderAmplitude(grid.x, grid.samplesPerCycle, c);
    if (amp > best) {
      best = amp;
      bestCount = c;
    }
  }
  const r = n / bestCount;
  // A weak cylinder on an ordinary wheel also shows lower orders, but the firing order stays: the pattern repeats
  // only when the order n is itself weak beside the one found.
  const own = orderAmplitude(grid.x, grid.samplesPerCycle, n);
  // The whole wheel must stay a crank wheel (up to 48 positions here: a 60-2 read twice is a wrong cylinder count).
  const plausible = Number.isInteger(r) && r >= 2 && r <= 4 && unit.positions * r <= MAX_REPEATED_POSITIONS;
  return plausible && best >= MIN_SPEED_ORDER_SHARE * mean && best >= 3 * own ? r : 1;
}

/** Positions of a wheel whose pattern repeats, at most (a 36-position wheel with the same gap every 120° is one). */
const MAX_REPEATED_POSITIONS = 48;

/** The pattern written out `r` times: the whole wheel. */
function repeatWheel(unit: ToothWheel, r: number): ToothWheel {
  return { positions: unit.positions * r, gapsAfter: Array.from({ length: r }, () => unit.gapsAfter).flat(), extraTooth: unit.extraTooth };
}

export function runCrankSpeedMethod(
  input: CrankInput,
  setup: EngineSetup,
  rotation: number,
  windowOverride?: CrankingWindow,
  read: CrankTeeth | null = readCrankTeeth(input, setup),
): MethodOutcome {
  const warnings: QualityWarning[] = [];
  const fail = (code: Parameters<typeof warning>[0], message: string): MethodOutcome => ({
    ok: false,
    warnings: [...warnings, warning(code, message)],
  });
  if (!read) {
    return fail('NO_CRANKING', NO_TEETH);
  }
  if (!read.found) return { ok: false, warnings: [read.problem!] };
  const { wheel, angles, info: allInfo, repairs } = read.found;
  const sampleRate = read.sampleRate;
  const iv = firingIntervals(setup);
  if (angles.unmatched > angles.revolutions) {
    return fail('NO_TOOTH_GAP', `Most revolutions (${angles.unmatched}) did not match the ${describeWheel(wheel)} wheel; check the wheel setting and the sensor signal.`);
  }
  // Speed per tooth interval, for the window and the sample-rate check.
  const m0 = motionFromTeeth(angles.times, angles.angleDeg, -Infinity, Infinity);
  // An engine that started: only the cranking before it.
  const start = engineStartOnTeeth(angles, iv, 4.5 * (360 / wheel.positions));
  // The cranking ends two firing intervals (at the cranking speed) before the first running event: the event across
  // the change is neither.
  let cranking = -1;
  if (start) {
    const crankingSpeed = median(m0.s.subarray(0, Math.max(1, indexAtTime(m0.t, start.timeS))));
    cranking = indexAtTime(m0.t, start.timeS - (2 * Math.min(...iv) * Math.PI) / 180 / crankingSpeed);
  }
  const window = windowOverride ?? (cranking >= 0 ? windowFromSpeed(m0.t.subarray(0, cranking), m0.s.subarray(0, cranking)) : windowFromSpeed(m0.t, m0.s));
  if (!window) return start ? fail('ENGINE_STARTED', startedTooSoon(start)) : fail('NO_CRANKING', NOT_STEADY);
  // Repairs count where the cranking is read: the starter engaging and the crank coasting to a stop (the speed
  // changing fastest) are no sign of a wiring fault.
  const wheelInfo = repairsWithin(allInfo, repairs, window, warnings);
  if (sampleRate > 0) {
    const fastest = Math.max(...sampleSpeeds(m0.s));
    const periodS = (2 * Math.PI) / wheel.positions / fastest;
    if (periodS * sampleRate < 4) {
      warnings.push(warning('SAMPLE_RATE_TOO_LOW', `At ${Math.round(sampleRate)} samples/s each tooth of the ${wheelInfo.notation} wheel gets fewer than 4 samples; record at ${Math.ceil((8 / periodS) / 1000)} kS/s or more.`));
    }
  }
  const motion = motionFromTeeth(angles.times, angles.angleDeg, window.startS, window.endS);
  // Cylinder 1: a sync channel's pulse near TDC, or a cam/injector/coil mark a known angle before it.
  let identity: IdentitySource = 'assumed';
  let identityNote: string | undefined;
  if (input.sync && input.time) {
    const rpm0 = (median(m0.s) * 60) / (2 * Math.PI);
    const pulses = findSyncPulses(input.time, input.sync, (0.6 * 120) / Math.max(30, rpm0)).filter(
      (s) => s >= window.startS && s <= window.endS,
    );
    if (pulses.length >= 2) {
      shiftAngles(motion, angleAtTime(angles.times, angles.angleDeg, pulses[0]));
      identity = 'sync';
    } else {
      warnings.push(warning('SYNC_NOT_FOUND', SYNC_PULSE_MISSING));
    }
  } else if (input.marks?.length) {
    // A cam with several windows a cycle is first reduced to its once-a-cycle edge.
    const once = input.marks.map((m) => cycleMarksOf(m, read.teeth, 2 * teethOf(wheel) - 1)?.marks ?? m);
    const mark = firstCycleMark(once, angles.times, angles.angleDeg, window);
    if (mark) {
      const offset = input.markOffsetDeg ?? DEFAULT_MARK_OFFSET_DEG[mark.marks.source];
      shiftAngles(motion, mark.firstAngle + offset);
      identity = mark.marks.source;
      identityNote = `Cylinder 1 from "${mark.marks.channel}" (${MARK_WORDS[mark.marks.source]}), taking cylinder 1's compression TDC ${offset}° after its mark; set the mark offset from the service information if it differs.`;
      const order = mark.marks.order;
      if (order && order.length === setup.cylinders && !sameCycle(order, setup.firingOrder)) {
        warnings.push(warning('MARK_ORDER', `"${mark.marks.channel}" names the cylinders in the order ${order.join('-')}, but the firing order set up is ${setup.firingOrder.join('-')}; only cylinder 1 is taken from it. Check the firing order against the service information.`));
      }
    } else {
      warnings.push(warning('SYNC_NOT_FOUND', `"${input.marks[0].channel}" does not mark one point every engine cycle (720°), so it cannot name cylinder 1; cylinder numbers below are assumed.`));
    }
  }
  const mismatch = countCheck(motion, setup, 'crank speed');
  if (mismatch) warnings.push(mismatch);
  const synced = identity !== 'assumed';
  let fit = runFit(motion, setup, synced, rotation);
  if (!fit) return fail('TOO_FEW_CYCLES', 'The crank signal holds too little cranking to fit; crank for 5–10 s.');
  const half = Math.min(...iv) / 2;
  const evidence = compressionEvidence(motion, fit, half);
  if (evidence.swing < MIN_COMPRESSION_SWING) {
    warnings.push(noCompressionOnSpeed(evidence.swing));
  } else if (evidence.fired.size > 0) {
    warnings.push(warning('ENGINE_FIRED', `The engine fired during the test: ${evidence.fired.size} event(s) sped the crank up sharply after top dead centre and were left out. Disable fuel and ignition as the service information directs and record again.`));
    fit = runFit(motion, setup, synced, rotation, evidence.fired) ?? fit;
  }
  if (wheelInfo.tooCoarse) {
    warnings.push(warning('WHEEL_TOO_COARSE', `The ${wheelInfo.description} wheel gives fewer than ${MIN_POSITIONS_PER_EVENT} teeth per compression event, too coarse for crank speed to separate cylinders; the electrical channel is used when there is one.`));
  }
  const rpm = meanRpm(motion);
  return {
    ok: true,
    run: { motion, fit, window, rpm, identity, identityNote, warnings, wheel: wheelInfo, speedSwing: Math.round(evidence.swing * 100) / 100, excluded: evidence.fired, startedAtS: start?.timeS },
  };
}


function shiftAngles(motion: CrankMotion, theta0: number): void {
  for (let r = 0; r < motion.thetaDeg.length; r++) motion.thetaDeg[r] -= theta0;
}

/** The first candidate whose marks inside the window fall 720° apart (±25°, at least 2 of them). */
function firstCycleMark(
  candidates: CylinderMarks[],
  times: Float64Array,
  angleDeg: Float64Array,
  window: CrankingWindow,
): { marks: CylinderMarks; firstAngle: number } | null {
  for (const marks of candidates) {
    const inside = Array.from(marks.times).filter((t) => t >= Math.max(window.startS, times[0]) && t <= Math.min(window.endS, times[times.length - 1]));
    if (inside.length < 2) continue;
    const all = inside.map((t) => angleAtTime(times, angleDeg, t));
    // A cam with several windows: the edge after the widest space between edges comes once a cycle.
    const th = all.length > 2 && all[all.length - 1] - all[0] < 720 * (all.length - 1) * 0.8 ? afterWidestSpace(all) : all;
    let good = 0;
    for (let k = 1; k < th.length; k++) if (Math.abs(th[k] - th[k - 1] - 720) < 25) good++;
    if (th.length >= 2 && good >= 0.8 * (th.length - 1)) return { marks, firstAngle: th[0] };
  }
  return null;
}

/** The angles that follow a space at least 90 % as wide as the widest one. */
function afterWidestSpace(th: number[]): number[] {
  let widest = 0;
  for (let k = 1; k < th.length; k++) widest = Math.max(widest, th[k] - th[k - 1]);
  const out: number[] = [];
  for (let k = 1; k < th.length; k++) if (th[k] - th[k - 1] >= 0.9 * widest) out.push(th[k]);
  return out;
}

/** Two orders are the same cycle when one is a rotation of the other. */
function sameCycle(a: number[], b: number[]): boolean {
  const i = b.indexOf(a[0]);
  return i >= 0 && a.every((c, k) => b[(i + k) % b.length] === c);
}

/** The engine-speed-channel variant: rpm sampled over time. */
export function runSpeedChannelMethod(
  time: Float64Array,
  rpmChannel: Float64Array,
  setup: EngineSetup,
  rotation: number,
  windowOverride?: CrankingWindow,
): MethodOutcome {
  const fs = (time.length - 1) / (time[time.length - 1] - time[0]);
  if (fs < 200) {
    return {
      ok: false,
      warnings: [warning('SAMPLE_RATE_TOO_LOW', `The engine-speed channel was logged at ${fs.toFixed(0)} samples/s; compression events need 200–400 samples/s or more. Ordinary scan-tool polling (5–20 Hz) is too slow.`)],
    };
  }
  const omega = rpmChannel.map((r) => (r * 2 * Math.PI) / 60);
  const window = windowOverride ?? windowFromSpeed(time, omega);
  if (!window) return { ok: false, warnings: [warning('NO_CRANKING', 'The engine speed never rose to a steady cranking speed; record 5–10 s of cranking.')] };
  const step = Math.max(1, Math.round(fs / 1000));
  const motion = motionFromSpeed(time, rpmChannel, indexAtTime(time, window.startS), indexAtTime(time, window.endS), step);
  const mismatch = countCheck(motion, setup, 'engine speed');
  const fit = runFit(motion, setup, false, rotation);
  if (!fit) return { ok: false, warnings: [...(mismatch ? [mismatch] : []), warning('TOO_FEW_CYCLES', 'The speed log holds too little cranking to fit; crank for 5–10 s.')] };
  return { ok: true, run: { motion, fit, window, rpm: meanRpm(motion), identity: 'assumed', warnings: mismatch ? [mismatch] : [] } };
}

/** Crank angle is known from the teeth or the speed, so the speed's repeat rate checks the cylinder count. */
export function countCheck(motion: CrankMotion, setup: EngineSetup, where: string) {
  const grid = resampleByAngle(motion.thetaDeg, motion.s);
  return grid && eventCountWarning(grid.x, grid.samplesPerCycle, setup, where, MIN_SPEED_ORDER_SHARE);
}

function sampleSpeeds(s: Float64Array): Float64Array {
  const sorted = Float64Array.from(s).sort();
  return sorted.subarray(Math.floor(sorted.length * 0.02), Math.ceil(sorted.length * 0.98));
}

function angleAtTime(t: Float64Array, theta: Float64Array, time: number): number {
  const i = Math.min(t.length - 1, Math.max(1, indexAtTime(t, time)));
  const f = (time - t[i - 1]) / (t[i] - t[i - 1]);
  return theta[i - 1] + f * (theta[i] - theta[i - 1]);
}

/**
 * The wheel's repair counts inside the cranking window, and the sentence that names them (none when every repair
 * lies outside it).
 */
function repairsWithin(info: WheelInfo, repairs: TeethRepair[], window: CrankingWindow, warnings: QualityWarning[]): WheelInfo {
  const inside = repairs.filter((r) => r.toS >= window.startS && r.fromS <= window.endS);
  const count = (kind: TeethRepair['kind']) => inside.filter((r) => r.kind === kind).reduce((a, r) => a + r.count, 0);
  const dropped = count('dropped');
  const inserted = count('inserted');
  const unmatched = count('unmatched');
  if (dropped + inserted + unmatched > 0) {
    const parts = [
      dropped ? `${dropped} glitch edge(s) dropped` : '',
      inserted ? `${inserted} missing tooth edge(s) inserted` : '',
      unmatched ? `${unmatched} revolution(s) that did not match the wheel left out` : '',
    ].filter(Boolean);
    warnings.push(warning('TEETH_REPAIRED', `The crank signal was repaired: ${parts.join(', ')}. Check the sensor wiring and probe ground if this happens often.`));
  }
  return { ...info, glitchesDropped: dropped, teethInserted: inserted };
}
