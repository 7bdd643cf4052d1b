/**
 * The crank-speed method: tooth edge times (given, or found in a sampled Hall or variable-reluctance
 * waveform), the missing-tooth gap for the angle, speed per tooth, and the torque-balance fit. An engine-speed
 * channel (rpm) is integrated for the angle instead.
 */
import { type EngineSetup } from '../engine/firing';
import { indexAtTime } from '../dsp/decimate';
import { median } from '../dsp/stats';
import { windowFromSpeed } from '../steps/cranking-window';
import { type CrankMotion, meanRpm, motionFromSpeed, motionFromTeeth } from '../steps/crank-motion';
import { runFit } from '../steps/run-fit';
import { eventCountWarning, resampleByAngle } from '../steps/event-count';
import { findSyncPulses } from '../steps/sync-pulses';
import { type QualityWarning, warning } from '../steps/warnings';
import { guessSensorKind, type SensorKind, toothTimesFromWaveform } from '../teeth/from-waveform';
import { detectPattern, type ToothPattern, toothAngles } from '../teeth/tooth-angles';
import type { CrankingWindow } from '../steps/cranking-window';
import type { MethodOutcome } from './current';

export interface CrankInput {
  toothTimes?: Float64Array;
  time?: Float64Array;
  crank?: Float64Array;
  sync?: Float64Array;
  sensor?: 'auto' | SensorKind;
  teeth?: ToothPattern;
}

export function runCrankSpeedMethod(
  input: CrankInput,
  setup: EngineSetup,
  rotation: number,
  windowOverride?: CrankingWindow,
): MethodOutcome {
  const warnings: QualityWarning[] = [];
  const fail = (code: Parameters<typeof warning>[0], message: string): MethodOutcome => ({
    ok: false,
    warnings: [...warnings, warning(code, message)],
  });
  let times = input.toothTimes;
  let sampleRate = 0;
  if (!times && input.time && input.crank) {
    const kind = input.sensor && input.sensor !== 'auto' ? input.sensor : guessSensorKind(input.crank);
    times = toothTimesFromWaveform(input.time, input.crank, kind);
    sampleRate = (input.time.length - 1) / (input.time[input.time.length - 1] - input.time[0]);
  }
  if (!times || times.length < 20) {
    return fail('NO_CRANKING', 'No crank teeth were found: the crank did not turn, or the crank sensor channel is not connected. Check the probe and record while cranking.');
  }
  const pattern = input.teeth ?? detectPattern(times);
  if (!pattern) {
    return fail('NO_TOOTH_GAP', 'No missing-tooth gap was found in the crank signal, so crank angle is unknown; set the tooth pattern (for example 60-2) or check the sensor signal.');
  }
  const angles = toothAngles(times, pattern);
  if (!angles || angles.revolutions < 2) {
    return fail('NO_TOOTH_GAP', `The ${pattern.count}-${pattern.missing} gap was not found at least twice; check the tooth pattern setting and record longer.`);
  }
  // Speed per tooth interval, for the window and the sample-rate check.
  const m0 = motionFromTeeth(angles.times, angles.angleDeg, -Infinity, Infinity);
  const window = windowOverride ?? windowFromSpeed(m0.t, m0.s);
  if (!window) return fail('NO_CRANKING', 'The crank never turned steadily; record 5–10 s of cranking.');
  if (sampleRate > 0) {
    const fastest = Math.max(...sampleSpeeds(m0.s));
    const toothPeriodS = (2 * Math.PI) / pattern.count / fastest;
    if (toothPeriodS * sampleRate < 4) {
      warnings.push(warning('SAMPLE_RATE_TOO_LOW', `At ${Math.round(sampleRate)} samples/s each ${pattern.count}-${pattern.missing} tooth gets fewer than 4 samples; record at ${Math.ceil((8 / toothPeriodS) / 1000)} kS/s or more.`));
    }
  }
  const motion = motionFromTeeth(angles.times, angles.angleDeg, window.startS, window.endS);
  // With sync, put the first sync pulse at 0° (mod 720) on the motion's scale.
  let identity: 'sync' | 'assumed' = 'assumed';
  if (input.sync && input.time) {
    const rpm0 = (median(m0.s) * 60) / (2 * Math.PI);
    const pulses = findSyncPulses(input.time, input.sync, (0.6 * 120) / Math.max(30, rpm0)).filter(
      (s) => s >= window.startS && s <= window.endS,
    );
    if (pulses.length >= 2) {
      const theta0 = angleAtTime(motion.t, motion.thetaDeg, pulses[0]);
      for (let r = 0; r < motion.thetaDeg.length; r++) motion.thetaDeg[r] -= theta0;
      identity = 'sync';
    } else {
      warnings.push(warning('SYNC_NOT_FOUND', 'The sync channel holds no clear pulse once per cycle; check the probe on the cylinder 1 trigger. Cylinder numbers below are assumed.'));
    }
  }
  const mismatch = countCheck(motion, setup, 'crank speed');
  if (mismatch) warnings.push(mismatch);
  const fit = runFit(motion, setup, identity === 'sync', rotation);
  if (!fit) return fail('TOO_FEW_CYCLES', 'The crank signal holds too little cranking to fit; crank for 5–10 s.');
  const rpm = meanRpm(motion);
  return { ok: true, run: { motion, fit, window, rpm, identity, warnings } };
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
  if (!fit) return { ok: false, warnings: [warning('TOO_FEW_CYCLES', 'The speed log holds too little cranking to fit; crank for 5–10 s.')] };
  return { ok: true, run: { motion, fit, window, rpm: meanRpm(motion), identity: 'assumed', warnings: mismatch ? [mismatch] : [] } };
}

/** Crank angle is known from the teeth or the speed, so the acceleration's repeat rate checks the cylinder count. */
function countCheck(motion: CrankMotion, setup: EngineSetup, where: string) {
  const grid = resampleByAngle(motion.thetaDeg, motion.y);
  return grid && eventCountWarning(grid.x, grid.samplesPerCycle, setup.cylinders, where);
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
