/**
 * The event-duration method, for any wheel, from one tooth per compression event upward: the time the crank takes
 * through each cylinder's segment of crank angle.
 *  - On a fine wheel the segment is the compression half (half a firing interval before TDC up to it); on a
 *    coarse wheel (or teeth spread evenly by count) a whole event between teeth.
 *  - Each duration per degree is taken over its engine cycle's mean, so the speed trend cancels, and over the
 *    healthy events of its own shape (uneven firing intervals give events of two kinds).
 *  - A cylinder is read from the event after it: a leaking cylinder lengthens that one most (FINE_GAIN, COARSE_GAIN),
 *    with the gain's range and the neighbours' readings in the interval.
 *  - Where the teeth also give a speed curve, the crank-speed method leads and this one checks it.
 */
import { type EngineSetup, firingIntervals } from '../engine/firing';
import { indexAtTime } from '../dsp/decimate';
import { median, quantile, stdDev } from '../dsp/stats';
import type { CylinderMarks } from '../import/edge-log';
import { findEngineStart, startedTooSoon } from '../steps/cranking-end';
import { findSyncPulses, SYNC_PULSE_MISSING } from '../steps/sync-pulses';
import { type CrankingWindow, NOT_STEADY } from '../steps/cranking-window';
import { motionFromTeeth } from '../steps/crank-motion';
import { detrendedDurations, type DurationEvent, eventSegments, timeAtAngle } from '../steps/event-durations';
import { symmetryStep, degreesOfPositions } from '../steps/identity';
import { cylinderIntervals } from '../grade/interval';
import { healthyReference, round1, type Summary } from '../steps/summarize';
import { eventKey, type FitEvent, type TorqueFit } from '../fit/torque-fit';
import { MIN_COMPRESSION_SWING, noCompressionOnSpeed } from '../steps/compression-evidence';
import { type QualityWarning, warning } from '../warnings';
import { type ToothAngles, toothPatternPeriod, uniformAngles } from '../teeth/coarse-angles';
import { type CycleMarks, findCycleMarks, toothIndexAt } from '../teeth/cycle-marks';
import { wheelNotation } from '../teeth/wheel';
import type { CylinderResult, EventMark, IdentitySource, WheelInfo } from '../types';
import type { MethodOutcome } from './current';
import { countCheck } from './crank-speed';
import { countMismatch } from '../steps/event-count';
import { DEFAULT_MARK_OFFSET_DEG, MARK_WORDS } from './mark-words';

export interface DurationInput {
  /** Crank tooth times, glitches dropped. */
  teeth: Float64Array;
  /** Angles from a wheel learned by its gaps, when there is one (every tooth of a matched revolution). */
  angles?: ToothAngles;
  /** Teeth an engine cycle on that wheel. */
  cycleTeeth?: number;
  wheel?: WheelInfo;
  marks?: CylinderMarks[];
  markOffsetDeg?: number;
  /** A cylinder 1 sync channel (a pulse at its compression TDC) and its sample times. */
  sync?: { time: Float64Array; values: Float64Array };
  lowLimitPercent: number;
}

/** Below this many teeth per compression event the wheel is coarse: segment edges sit on teeth. */
const FINE_TEETH_PER_EVENT = 6;
/**
 * Below this firing interval (an eight-cylinder's 90°) a coarse wheel's events overlap: on the simulator a V8's
 * leak lengthened events two and three after it, and read healthy cylinders low; its figures are withheld as thin.
 */
const MIN_COARSE_INTERVAL_DEG = 120;
/** Cranking speeds the method reads, rpm (cranking is 100–300 rpm, common practice; slow diesels and fast small engines either side). */
const MIN_EVENT_RPM = 60;
const MAX_EVENT_RPM = 450;
/**
 * On a coarse wheel each segment is a whole event, and what a leaking cylinder changes most is the event after
 * it: the compression it loses is energy the crank lacks, so it enters the next event slower and lingers there,
 * while its own event hardly changes (measured on the simulator with leaks through the stroke, cam-synchronised,
 * 2–6 teeth a revolution: the next event 14 % longer on an I4 and 27 % on a V6 or I6 for a cylinder at 46–48 %,
 * its own under 1 % shorter). So each cylinder is read from the event that follows it, with this gain (the next
 * event's lengthening per unit of lost compression: 0.25 on the I4, 0.51 on the six-cylinders) and the interval
 * spanning its range.
 */
const COARSE_GAIN = { mid: 0.35, low: 0.2, high: 0.6 };
/**
 * On a fine wheel each segment is the compression half of an event (half a firing interval before TDC up to it),
 * where the speed the crank enters with matters most, and a cylinder is read from the next event's half too. Its
 * lengthening per unit of lost compression grows with the cylinder count (shorter events, less time to recover):
 * measured on the simulator with leaks through the stroke, one and two leaking cylinders at 37–75 %, 0.2 on an I3,
 * 0.42 on an I4, 0.75 on an I5, 1.0 on an I6 and 0.8–1.1 on an odd-fire V6, 1.1–1.35 on a V8: about a quarter
 * per cylinder past 2.2, good to the factor FINE_GAIN_FACTOR either way.
 */
function fineGain(cylinders: number): { mid: number; low: number; high: number } {
  const mid = Math.min(1.5, Math.max(0.15, 0.25 * (cylinders - 2.2)));
  return { mid, low: mid / FINE_GAIN_FACTOR, high: mid * FINE_GAIN_FACTOR };
}
const FINE_GAIN_FACTOR = 1.4;
/** How far a neighbour's deviation from 100 % reaches into a cylinder's interval: see widenForNeighbours. */
const NEIGHBOUR_REACH = { fine: 0.3, coarse: 1 };
/**
 * Smallest interval half-width, points: on a fine wheel, and on a coarse one. The fine wheel's was set on the
 * ensemble (10 draws per layout, seeds 1–80): at 4, 3.5 and 3 points its intervals held 94.4, 94.1 and 94.1 % of the
 * truths, at 2.5 only 92.0 %, so 3, the narrowest that keeps what 4 held but one. On the held-out family it holds
 * 96.8 % (97.2 % at 4); on seeds 201–280, 91.9 and 96.5 %; no confident wrong flag on either.
 */
const FLOOR = { fine: 3, coarse: 5 };

export function runEventDurationMethod(input: DurationInput, setup: EngineSetup, rotation: number, windowOverride?: CrankingWindow): MethodOutcome {
  const warnings: QualityWarning[] = [];
  const fail = (code: Parameters<typeof warning>[0], message: string): MethodOutcome => ({ ok: false, warnings: [...warnings, warning(code, message)] });
  const n = setup.cylinders;
  const iv = firingIntervals(setup);
  const teeth = input.teeth;
  if (teeth.length < 2 * n) return fail('NO_CRANKING', 'Too few crank teeth were recorded to time the compression events; record 5–10 s of cranking.');

  // Crank angle: the learned wheel's, or the teeth per cycle spread evenly. Without a wheel the teeth per cycle are
  // counted against a cycle mark, or else taken from the tooth pattern's repeat once an event and the cylinder
  // count (a leaking cylinder breaks that repeat, so the mark comes first).
  const cycle = input.angles ? null : findCycleMarks(input.marks, teeth);
  const patternTeeth = input.angles || cycle ? 0 : n * toothPatternPeriod(teeth);
  let angles: ToothAngles;
  let teethPerCycle: number;
  let wheel: WheelInfo;
  let pitchDeg: number;
  if (input.angles && input.wheel) {
    angles = input.angles;
    wheel = input.wheel;
    const steps: number[] = [];
    for (let k = 1; k < angles.angleDeg.length; k++) steps.push(angles.angleDeg[k] - angles.angleDeg[k - 1]);
    pitchDeg = quantile(steps, 0.1);
    teethPerCycle = 720 / pitchDeg;
  } else {
    teethPerCycle = cycle ? Math.round(cycle.teethPerCycle) : patternTeeth;
    const ref = cycle ? Math.ceil(toothIndexAt(teeth, cycle.marks.times[0])) : 0;
    angles = uniformAngles(teeth, teethPerCycle, ref);
    pitchDeg = 720 / teethPerCycle;
    const perRev = teethPerCycle / 2;
    const notation = Number.isInteger(perRev) ? wheelNotation({ positions: perRev, gapsAfter: new Array<number>(perRev).fill(0), extraTooth: false }) : `${teethPerCycle}/720`;
    wheel = {
      notation,
      description: `${perRev} teeth a revolution, ${round1(teethPerCycle / n)} per compression event, no reference gap (${cycle ? `counted against "${cycle.marks.channel}"` : 'from the repeat of the tooth periods'})`,
      learned: true,
      glitchesDropped: 0,
      teethInserted: 0,
      tooCoarse: teethPerCycle / n < FINE_TEETH_PER_EVENT,
    };
  }
  const perEvent = teethPerCycle / n;
  // Teeth spread evenly by count (no wheel learned) are only sure at whole events: read as coarse.
  const coarse = perEvent < FINE_TEETH_PER_EVENT || !input.angles;
  // A left-out stretch (a revolution that did not match the wheel) breaks a segment.
  const maxStep = coarse ? 1.5 * pitchDeg : 4.5 * pitchDeg;
  const snap = coarse && Number.isInteger(Math.round(perEvent * 1000) / 1000) ? pitchDeg : 0;

  // Cylinder 1's TDC on the angle scale: the phase inside the firing interval from the speed's shape, the
  // cycle from a mark.
  const step = symmetryStep(iv);
  const period = degreesOfPositions(iv, step);
  const phase = tdcPhase(angles, iv, step, period, pitchDeg, coarse, perEvent);
  let identity: IdentitySource = 'assumed';
  let identityNote: string | undefined;
  let tdc1 = phase;
  const markSource = input.angles ? findCycleMarks(input.marks, teeth, input.cycleTeeth) : cycle;
  const syncAngle = input.sync ? firstSyncAngle(input.sync, angles, teethPerCycle) : undefined;
  if (input.sync && syncAngle === undefined) {
    warnings.push(warning('SYNC_NOT_FOUND', SYNC_PULSE_MISSING));
  } else if (syncAngle !== undefined) {
    // The pulse is cylinder 1's TDC: on a coarse wheel it picks the cycle of the phase the speed found.
    tdc1 = coarse && perEvent >= 2 ? phase + Math.round((syncAngle - phase) / period) * period : syncAngle;
    identity = 'sync';
  } else if (markSource?.symmetric) {
    warnings.push(warning('SYNC_NOT_FOUND', `"${markSource.marks.channel}" repeats the same pattern every revolution, so it cannot tell which revolution holds cylinder 1's compression; cylinder numbers below are assumed.`));
  } else if (markSource) {
    const markAngle = Array.from(markSource.marks.times, (x) => angleAtTime(angles, x)).find(Number.isFinite) ?? NaN;
    const offset = input.markOffsetDeg ?? DEFAULT_MARK_OFFSET_DEG[markSource.marks.source];
    if (Number.isFinite(markAngle)) {
      const want = markAngle + offset;
      // With under two teeth an event the speed cannot place TDC: the mark does.
      tdc1 = coarse && perEvent < 2 ? want : phase + Math.round((want - phase) / period) * period;
      identity = markSource.marks.source;
      identityNote = `Cylinder 1 from "${markSource.marks.channel}" (${MARK_WORDS[markSource.marks.source]}${markSource.edgesPerCycle > 1 ? `, its pattern of ${markSource.edgesPerCycle} edges a cycle` : ''}), taking cylinder 1's compression TDC ${offset}° after its mark; set the mark offset from the service information if it differs.`;
    }
  }

  // Every event, then where the engine started and the cranking window before it.
  const all = eventSegments(angles, tdc1, iv, maxStep, snap, !coarse);
  const speeds = all.map((e) => (Number.isFinite(e.durationS) && e.durationS > 0 ? e.spanDeg / e.durationS / 6 : NaN));
  const finite = all.map((e, j) => ({ t: e.timeS, v: speeds[j] })).filter((x) => Number.isFinite(x.v) && Number.isFinite(x.t));
  const start = findEngineStart(
    finite.map((x) => x.t),
    finite.map((x) => x.v),
  );
  const window = windowOverride ?? steadyWindow(all, speeds, start?.timeS ?? Infinity, n);
  if (!window) {
    if (start) return fail('ENGINE_STARTED', startedTooSoon(start));
    return fail('NO_CRANKING', NOT_STEADY);
  }
  const complete = (e: DurationEvent) => Number.isFinite(e.durationS) && e.startS >= window.startS - 1e-9 && e.endS <= window.endS + 1e-9;
  const events = all.filter((e) => e.timeS >= window.startS && e.timeS <= window.endS);
  if (!events.some(complete)) return fail('TOO_FEW_CYCLES', 'The capture holds too little steady cranking to time its compression events; crank for 5–10 s.');

  // Positions: from the mark, or the first complete event as cylinder 1 stepped by the user's rotation.
  let shift = 0;
  if (identity === 'assumed') {
    const first = events.find(complete)!;
    shift = first.position - (first.position % step) - rotation * step;
  }
  const positionOf = (e: DurationEvent) => (((e.position - shift) % n) + n) % n;

  // Durations per degree over their cycle's mean (so a drift in cranking speed cancels). A cylinder is read from the
  // event after it: the compression a weak cylinder loses is energy the crank lacks, so it enters the next event
  // slower and lingers there (a longer one: a weaker cylinder).
  const own = detrendedDurations(events.map((e) => (complete(e) ? e.durationS / e.spanDeg : NaN)), n);
  const next = own.map((_, j) => own[j + 1] ?? NaN);
  // The compression signature over whole events (the speed falls into TDC and rises after it).
  const swing = coarse ? NaN : segmentSwing(angles, eventSegments(angles, tdc1, iv, maxStep).filter((e) => complete(e) && e.timeS >= window.startS && e.timeS <= window.endS));
  if (Number.isFinite(swing) && swing < MIN_COMPRESSION_SWING) warnings.push(noCompressionOnSpeed(swing));

  const cylOf = (e: DurationEvent) => setup.firingOrder[positionOf(e)];
  // Uneven firing intervals give events of two or more shapes: each is read against the events of its own shape
  // (the positions one symmetry step apart), never against a shorter or longer kind.
  const shapeOf = (j: number) => (positionOf(events[j]) + 1) % step;
  const byShape = new Map<number, number[][]>();
  events.forEach((e, j) => {
    if (!Number.isFinite(next[j])) return;
    const cyls = byShape.get(shapeOf(j)) ?? Array.from({ length: n }, () => []);
    cyls[cylOf(e) - 1].push(next[j]);
    byShape.set(shapeOf(j), cyls);
  });
  const refOf = new Map<number, number>();
  for (const [shape, cyls] of byShape) {
    const means = cyls.filter((r) => r.length).map((r) => r.reduce((a, b) => a + b, 0) / r.length);
    // The healthy events are the short ones here: the reference is taken on their speeds (one over a duration).
    refOf.set(shape, coarse ? median(means) : 1 / healthyReference(means.map((m) => 1 / m), 100 - (100 - input.lowLimitPercent) * 0.25));
  }
  // Each reading over its shape's healthy reference: 1 for a healthy cylinder, above 1 for a weaker one.
  const detrended = next.map((r, j) => r / (refOf.get(shapeOf(j)) ?? NaN));
  const rByCyl: number[][] = Array.from({ length: n }, () => []);
  events.forEach((e, j) => {
    if (Number.isFinite(detrended[j])) rByCyl[cylOf(e) - 1].push(detrended[j]);
  });
  const rMeans = rByCyl.map((r) => (r.length ? r.reduce((a, b) => a + b, 0) / r.length : NaN));
  const share = coarse ? COARSE_GAIN : fineGain(n);
  const toPercent = (r: number) => 100 * (1 - (r - 1) / share.mid);
  // Malformed events: far from their cylinder's others (more than 20 points, or five robust spreads).
  const bounds = rByCyl.map((r) => {
    const p = r.map(toPercent);
    const mid = median(p);
    return { mid, tolerance: Math.max(20, 5 * 1.4826 * median(p.map((x) => Math.abs(x - mid)))) };
  });
  const rejected = new Set<number>();
  const pByCyl: number[][] = Array.from({ length: n }, () => []);
  const rawByCyl: number[][] = Array.from({ length: n }, () => []);
  events.forEach((e, j) => {
    if (!Number.isFinite(detrended[j])) return;
    const c = cylOf(e) - 1;
    const p = toPercent(detrended[j]);
    if (!(Math.abs(p - bounds[c].mid) <= bounds[c].tolerance)) {
      rejected.add(j);
      return;
    }
    pByCyl[c].push(p);
    rawByCyl[c].push(e.durationS * 1000);
  });
  const pMeans = pByCyl.map((p) => (p.length ? p.reduce((a, b) => a + b, 0) / p.length : NaN));
  // The plain index: the shortest reading (the strongest cylinder) over each cylinder's, in percent.
  const minR = Math.min(...rMeans.filter(Number.isFinite));
  const figures = pMeans.map((m) => (Number.isFinite(m) ? round1(m) : null));
  const intervals = cylinderIntervals(pByCyl, figures, { lowLimitPercent: input.lowLimitPercent, floorPoints: coarse ? FLOOR.coarse : FLOOR.fine }).map((iv) =>
    iv ? widenForShare(iv, share) : null,
  );
  widenForNeighbours(intervals, figures, setup.firingOrder, coarse ? NEIGHBOUR_REACH.coarse : NEIGHBOUR_REACH.fine);
  reachPastWeakNext(intervals, figures, setup.firingOrder, input.lowLimitPercent, coarse ? FLOOR.coarse : FLOOR.fine);
  // No cylinder holds less than no compression: a figure or interval end below 0 % is 0 %.
  for (let c = 0; c < n; c++) {
    if (figures[c] !== null) figures[c] = Math.max(0, figures[c]!);
    const iv = intervals[c];
    if (iv) intervals[c] = [Math.max(0, iv[0]), Math.max(0, iv[1])];
  }
  const cylinders: CylinderResult[] = pMeans.map((m, c) => {
    const perCycle = pByCyl[c].map(round1);
    const ms = rawByCyl[c].length ? rawByCyl[c].reduce((a, b) => a + b, 0) / rawByCyl[c].length : 0;
    return {
      cylinder: c + 1,
      relativePercent: figures[c],
      interval: intervals[c],
      status: 'ok',
      events: pByCyl[c].length,
      rejected: events.filter((e, j) => rejected.has(j) && cylOf(e) === c + 1).length,
      spreadPercent: round1(stdDev(perCycle)),
      plainPercent: Number.isFinite(rMeans[c]) ? round1((100 * minR) / rMeans[c]) : null,
      raw: Math.round(ms * 100) / 100,
      perCycle,
    };
  });
  const valid = figures.filter((f): f is number => f !== null);
  const marks: EventMark[] = events.map((e, j) => ({ timeS: e.timeS, cylinder: cylOf(e), used: Number.isFinite(detrended[j]) && !rejected.has(j) }));
  const fitEvents: FitEvent[] = events.map((e, j) => ({ cylinder: cylOf(e), position: positionOf(e), tdcDeg: e.tdcDeg, complete: Number.isFinite(detrended[j]) }));
  const summary: Summary = {
    cylinders,
    events: marks,
    spreadPercent: valid.length ? round1(Math.max(...valid) - Math.min(...valid)) : 0,
    rejectedKeys: new Set(fitEvents.filter((_, j) => rejected.has(j)).map(eventKey)),
  };
  if (rejected.size) warnings.push(warning('EVENTS_REJECTED', `${rejected.size} compression event(s) took far longer or shorter than their cylinder's others (a lost tooth or a dropout) and were left out.`));
  const used = fitEvents.filter((e) => e.complete).length;
  const fit: TorqueFit = {
    phaseDeg: ((tdc1 % 720) + 720) % 720,
    perCylinder: Float64Array.from(pMeans),
    pressure: Float64Array.from(pMeans, (m) => m / 100),
    leakPerS: new Float64Array(n),
    perEvent: Float64Array.from(events, (_, j) => (Number.isFinite(detrended[j]) ? toPercent(detrended[j]) : NaN)),
    events: fitEvents,
    r2: events.length ? used / events.length : 0,
  };
  if (coarse && Math.min(...iv) < MIN_COARSE_INTERVAL_DEG) {
    warnings.push(warning('EVENTS_OVERLAP', `Compression events ${Math.min(...iv)}° apart overlap on a wheel this coarse: one cylinder's event cannot be told from the next. Record a crank sensor with more teeth, or the starter current.`));
  }
  if (coarse) {
    warnings.push(
      warning(
        'COARSE_WHEEL',
        perEvent < 2
          ? `With ${round1(perEvent)} crank tooth per compression event, each figure is the time one event takes; the capture cannot show whether there is compression at all, so the figures only compare the cylinders with each other.`
          : `The wheel gives ${round1(perEvent)} teeth per compression event, too few for a speed curve: each figure is the time the crank takes through the cylinder's event, relative to the others.`,
      ),
    );
  }
  const rpm = meanRpmOf(events.filter(complete));
  // Teeth far outside cranking speed are not a cranking engine read this way (a stuck sensor, noise, a wrong wheel).
  if (!(rpm >= MIN_EVENT_RPM && rpm <= MAX_EVENT_RPM)) {
    return fail('NO_CRANKING', `Timed as compression events, the crank teeth come at ${Math.round(rpm)} rpm, outside cranking speed (${MIN_EVENT_RPM}–${MAX_EVENT_RPM} rpm); check the crank channel, the wheel and the cylinder count.`);
  }
  const motion = motionFromTeeth(angles.times, angles.angleDeg, window.startS, window.endS);
  // The events per cycle against the cylinder count: the speed's repeat on a fine wheel, the tooth pattern's
  // repeat against a cycle mark's teeth on a coarse one.
  const mismatch = coarse ? coarseCountCheck(cycle ?? findCycleMarks(input.marks, teeth), teeth, n) : countCheck(motion, setup, 'crank speed');
  if (mismatch) warnings.push(mismatch);
  return {
    ok: true,
    run: { motion, fit, window, rpm, identity, identityNote, warnings, wheel, speedSwing: Number.isFinite(swing) ? Math.round(swing * 100) / 100 : undefined, figures: summary, startedAtS: start?.timeS },
  };
}

/**
 * The steady cranking before `endS`: the longest run of events whose cycle's speed stays within 0.8–1.25 times
 * the median, without its first event (the starter still settling). An unsteady stretch (a noisy trigger, the starter
 * engaging or letting go) ends a run.
 */
function steadyWindow(all: DurationEvent[], eventSpeeds: number[], endS: number, n: number): CrankingWindow | null {
  // Each event's speed over the engine cycle around it, so one weak cylinder does not break a run.
  const speeds = eventSpeeds.map((_, j) => {
    const from = Math.max(0, j - Math.floor(n / 2));
    const window = eventSpeeds.slice(from, from + n);
    return window.length === n && window.every(Number.isFinite) ? n / window.reduce((a, v) => a + 1 / v, 0) : NaN;
  });
  const idx = all.map((_, j) => j).filter((j) => Number.isFinite(speeds[j]) && all[j].endS < endS);
  if (idx.length < 3) return null;
  const med = median(idx.map((j) => speeds[j]));
  let best: [number, number] = [0, -1];
  let from = -1;
  let last = -1;
  for (let j = 0; j <= all.length; j++) {
    // An event that could not be timed (a left-out stretch) neither starts nor ends a run.
    if (j < all.length && !Number.isFinite(speeds[j]) && !(all[j].startS >= endS)) continue;
    const steady = j < all.length && all[j].endS < endS && speeds[j] >= 0.8 * med && speeds[j] <= 1.25 * med;
    if (steady) {
      if (from < 0) from = j;
      last = j;
    } else if (from >= 0) {
      if (last - from > best[1] - best[0]) best = [from, last];
      from = -1;
    }
  }
  const [a, b] = [best[0] + 1, best[1]];
  if (b < a) return null;
  const startS = all[a].startS;
  const endAt = all[b].endS;
  return endAt - startS > 0.2 ? { startS, endS: endAt } : null;
}

/**
 * TDC's place inside the symmetry period: on a fine wheel the angle where the speed, folded over the period and
 * divided by its event's mean, is lowest at every TDC of the period; on a coarse wheel with two or more teeth an
 * event, the middle of its slowest tooth; with one tooth an event, half an interval after a tooth (the segment
 * is then that tooth's period).
 */
function tdcPhase(a: ToothAngles, iv: number[], step: number, period: number, pitchDeg: number, coarse: boolean, perEvent: number): number {
  const first = a.angleDeg[0];
  if (coarse && perEvent < 2) return first + iv[0] / 2;
  const bin = coarse ? pitchDeg : Math.max(2, pitchDeg);
  const bins = Math.max(1, Math.round(period / bin));
  const sum = new Float64Array(bins);
  const count = new Float64Array(bins);
  for (let k = 0; k + 1 < a.times.length; k++) {
    const span = a.angleDeg[k + 1] - a.angleDeg[k];
    const dt = a.times[k + 1] - a.times[k];
    if (!(span > 0) || !(dt > 0) || span > 4.5 * pitchDeg) continue;
    const mid = (a.angleDeg[k] + a.angleDeg[k + 1]) / 2;
    // The event's mean speed around this tooth: the period's angle over its time.
    const t0 = timeAtAngle(a, mid - period / 2, 4.5 * pitchDeg);
    const t1 = timeAtAngle(a, mid + period / 2, 4.5 * pitchDeg);
    if (!(t1 > t0)) continue;
    const rel = span / dt / (period / (t1 - t0));
    const b = Math.floor(((((mid - first) % period) + period) % period) / (period / bins)) % bins;
    sum[b] += rel;
    count[b] += 1;
  }
  const cum: number[] = [0];
  for (let p = 1; p < step; p++) cum.push(cum[p - 1] + iv[p - 1]);
  let best = 0;
  let bestScore = Infinity;
  for (let b = 0; b < bins; b++) {
    let score = 0;
    for (const c of cum) {
      const k = Math.floor(((b * (period / bins) + c) % period) / (period / bins)) % bins;
      score += count[k] ? sum[k] / count[k] : 1;
    }
    if (score < bestScore) {
      bestScore = score;
      best = b;
    }
  }
  return first + (best + 0.5) * (period / bins);
}

/** Median over events of the second-highest over the second-lowest tooth speed inside the segment. */
function segmentSwing(a: ToothAngles, events: DurationEvent[]): number {
  const swings: number[] = [];
  for (const e of events) {
    const s = toothSpeeds(a, e);
    if (s.length < 5) continue;
    s.sort((x, y) => x - y);
    swings.push(s[s.length - 2] / s[1]);
  }
  return swings.length ? median(swings) : NaN;
}

/** Speeds, degrees per second, of the tooth periods inside a segment. */
function toothSpeeds(a: ToothAngles, e: DurationEvent): number[] {
  const out: number[] = [];
  for (let k = indexAtTime(a.times, e.startS); k + 1 < a.times.length; k++) {
    if (a.times[k + 1] > e.endS) break;
    const dt = a.times[k + 1] - a.times[k];
    if (dt > 0) out.push((a.angleDeg[k + 1] - a.angleDeg[k]) / dt);
  }
  return out;
}

/**
 * A weak cylinder moves its neighbours' events too (measured on the simulator: on a coarse wheel the cylinder
 * before a leaking one reads about 16 points low, the one after 14 high, and two leaks in a row mask each other;
 * on a fine wheel the one before reads 10–18 points high and the one after 5–13 low for a cylinder 60 points
 * down): each interval reaches either side by `reach` times as far as its firing-order neighbours read away from
 * 100 %.
 */
function widenForNeighbours(intervals: ([number, number] | null)[], figures: (number | null)[], order: number[], reach: number): void {
  const n = order.length;
  for (let p = 0; p < n; p++) {
    const c = order[p] - 1;
    const iv = intervals[c];
    const fig = figures[c];
    if (!iv || fig === null) continue;
    const away = [order[(p + n - 1) % n], order[(p + 1) % n]].map((k) => Math.abs((figures[k - 1] ?? 100) - 100));
    const w = reach * Math.max(...away);
    intervals[c] = [round1(Math.min(iv[0], fig - w)), round1(Math.max(iv[1], fig + w))];
  }
}

/**
 * A cylinder is read from the event after it; when that event is a weak cylinder's own (its figure below the low
 * limit), the weak cylinder's missing compression changes the event too, and the reading mixes the two. On the
 * ensemble (10 draws per layout, seeds 1–80 and 201–280) an I3's healthy cylinder before a nearly dead one read 0 %
 * `low` twice, once from a figure of −122 %. Its interval reaches up by the weak cylinder's whole loss, and at least
 * to a healthy cylinder's (100 % and the floor).
 */
function reachPastWeakNext(intervals: ([number, number] | null)[], figures: (number | null)[], order: number[], lowLimit: number, floor: number): void {
  const n = order.length;
  for (let p = 0; p < n; p++) {
    const c = order[p] - 1;
    const next = figures[order[(p + 1) % n] - 1];
    const iv = intervals[c];
    const fig = figures[c];
    if (!iv || fig === null || next === null || !(next < lowLimit)) continue;
    intervals[c] = [iv[0], round1(Math.max(iv[1], fig + (100 - next), 100 + floor))];
  }
}

/** The interval stretched over the plausible range of the compression share (a larger share, a smaller deviation). */
function widenForShare(iv: [number, number], share: { mid: number; low: number; high: number }): [number, number] {
  const at = (x: number, s: number) => 100 + ((x - 100) * share.mid) / s;
  const lo = Math.min(iv[0], at(iv[0], share.low), at(iv[0], share.high));
  const hi = Math.max(iv[1], at(iv[1], share.low), at(iv[1], share.high));
  return [round1(lo), round1(hi)];
}

/** The crank angle of the first sync pulse on the teeth (pulses a cycle apart, at least two), or undefined. */
function firstSyncAngle(sync: { time: Float64Array; values: Float64Array }, a: ToothAngles, teethPerCycle: number): number | undefined {
  const periods: number[] = [];
  for (let k = 1; k < a.times.length; k += Math.max(1, Math.floor(a.times.length / 400))) periods.push(a.times[k] - a.times[k - 1]);
  const cycleS = median(periods) * teethPerCycle;
  const pulses = findSyncPulses(sync.time, sync.values, 0.6 * cycleS);
  if (pulses.length < 2) return undefined;
  return pulses.map((x) => angleAtTime(a, x)).find(Number.isFinite);
}

function angleAtTime(a: ToothAngles, x: number): number {
  const k = toothIndexAt(a.times, x);
  if (!Number.isFinite(k)) return NaN;
  const i = Math.min(a.angleDeg.length - 2, Math.floor(k));
  return a.angleDeg[i] + (k - i) * (a.angleDeg[i + 1] - a.angleDeg[i]);
}

/**
 * On a coarse wheel: a cycle mark that tells the revolutions apart counts the teeth a cycle, and the tooth
 * pattern repeats once an event, so their ratio is the events per cycle.
 */
function coarseCountCheck(cycle: CycleMarks | null, teeth: Float64Array, n: number): QualityWarning | null {
  if (!cycle || cycle.symmetric) return null;
  const events = cycle.teethPerCycle / toothPatternPeriod(teeth);
  const whole = Math.round(events);
  if (Math.abs(events - whole) > 0.1 || whole === n || whole < 2 || whole > 16) return null;
  return countMismatch(`The crank teeth repeat ${whole} times per engine cycle counted against "${cycle.marks.channel}", so the capture holds ${whole} compression events per cycle, not ${n}`, whole);
}

/** Mean cranking speed over the events, rpm: their angles over their time. */
function meanRpmOf(events: DurationEvent[]): number {
  let deg = 0;
  let s = 0;
  for (const e of events) {
    deg += e.spanDeg;
    s += e.durationS;
  }
  return s > 0 ? deg / 6 / s : 0;
}
