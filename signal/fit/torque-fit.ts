/**
 * The torque-balance fit: dω/dt = c₀ + c₁·s + Σ kᵢ·τ(θ − TDCᵢ), one coefficient per cylinder (or per
 * compression event), τ the nominal cylinder's gas torque. A linear least squares at each TDC phase offset;
 * the offset with the smallest residual wins. Modelling every cylinder at once keeps the neighbour's gas-spring
 * return out of each figure.
 */
import { GENERIC_GAS, TORQUE_TABLE_STEPS_PER_DEG, LATE_LEAK_FAMILY_PER_S, LEAK_FAMILY_PER_S, ORIFICE_LEAK_FAMILY_PER_S, leakyTorqueShape, type GasModel, type LeakyShape, torqueAt } from '../engine/gas-torque';
import { NormalEquations } from '../dsp/solve';
import { type CrankMotion, meanRpm } from '../steps/crank-motion';

export interface FitEvent {
  /** Cylinder number, 1-based. */
  cylinder: number;
  /** Firing position in the firing order, 0-based. */
  position: number;
  /** Crank angle of the event's compression TDC, degrees on the motion's scale. */
  tdcDeg: number;
  /** The event's whole closed-valve window lies inside the data. */
  complete: boolean;
}

export interface TorqueFit {
  /** TDC of cylinder 1 (firing position 0), degrees on the motion's scale, modulo 720. */
  phaseDeg: number;
  /** Torque coefficient per cylinder (index = cylinder − 1); NaN where no complete event was seen. */
  perCylinder: Float64Array;
  /** Peak-pressure estimate per cylinder, in units of a sealed nominal cylinder: coefficient × the chosen leak shape's peak ratio. */
  pressure: Float64Array;
  /** The leak rate of the shape each cylinder took, 1/s. */
  leakPerS: Float64Array;
  /** Peak-pressure estimate per complete event, same order as `events`. NaN for incomplete events. */
  perEvent: Float64Array;
  events: FitEvent[];
  /** Share of the variance of the left side that the model explains, 0…1. */
  r2: number;
}

export interface FitOptions {
  /** Each cylinder's TDC, degrees after cylinder 1's (index = cylinder − 1). */
  phasesDeg: Float64Array;
  firingOrder: number[];
  /** Offsets of cylinder 1's TDC to try, degrees. */
  scanFromDeg: number;
  scanToDeg: number;
  /** Coarse scan step, degrees. @default 6 */
  coarseStepDeg?: number;
  /** Events to leave out of the per-cylinder figures (keys `${position}:${tdcDeg.toFixed(1)}`), e.g. rejected ones. */
  exclude?: Set<string>;
  gas?: GasModel;
  /** Let each cylinder take the leak shape that fits it best. @default true */
  refineLeaks?: boolean;
}

const families = new Map<string, LeakyShape[]>();
/** The leak-shape family for a gas model at a cranking speed (rounded to 10 rpm so it can be cached). */
function familyFor(gas: GasModel, rpm: number): LeakyShape[] {
  const r = Math.max(30, Math.round(rpm / 10) * 10);
  const key = `${JSON.stringify(gas)}@${r}`;
  let f = families.get(key);
  if (!f) {
    f = familyOver(gas, r);
    families.set(key, f);
  }
  return f;
}

/** Every shape of the family: sealed and leaking through the stroke, late leaks and orifices (over a measured speed when given). */
function familyOver(gas: GasModel, rpm: number, degPerS?: Float64Array): LeakyShape[] {
  return [
    ...LEAK_FAMILY_PER_S.map((l) => leakyTorqueShape(gas, l, rpm, 'whole stroke', degPerS)),
    ...LATE_LEAK_FAMILY_PER_S.map((l) => leakyTorqueShape(gas, l, rpm, 'near TDC', degPerS)),
    ...ORIFICE_LEAK_FAMILY_PER_S.map((l) => leakyTorqueShape(gas, l, rpm, 'early', degPerS)),
  ];
}

/**
 * Each cylinder's mean crank speed through its closed-valve window, deg/s at each table step: measured where a
 * row falls, interpolated between, held at the ends. The crank slows into every TDC, and more so after a weak
 * cylinder, so each cylinder's leak shapes are integrated over its own speed.
 */
function speedProfiles(m: CrankMotion, o: FitOptions, phaseDeg: number): Float64Array[] {
  const gas = o.gas ?? GENERIC_GAS;
  const n = o.firingOrder.length;
  const size = 720 * TORQUE_TABLE_STEPS_PER_DEG;
  const sum = Array.from({ length: n }, () => new Float64Array(size));
  const count = Array.from({ length: n }, () => new Uint32Array(size));
  const rows = m.t.length;
  const events = eventsFor(o, phaseDeg, m.thetaDeg[0], m.thetaDeg[rows - 1], gas);
  const ivc = -180 + gas.ivcAbdcDeg;
  const evo = 180 - gas.evoBbdcDeg;
  let first = 0;
  for (let r = 1; r + 1 < rows; r++) {
    const th = m.thetaDeg[r];
    const dt = m.t[r + 1] - m.t[r - 1];
    if (!(dt > 0)) continue;
    const degPerS = (m.thetaDeg[r + 1] - m.thetaDeg[r - 1]) / dt;
    while (first < events.length && events[first].tdcDeg + evo < th) first++;
    for (let e = first; e < events.length && events[e].tdcDeg + ivc <= th; e++) {
      const psi = th - events[e].tdcDeg;
      if (psi > evo) continue;
      const i = Math.round((psi + 360) * TORQUE_TABLE_STEPS_PER_DEG);
      sum[events[e].cylinder - 1][i] += degPerS;
      count[events[e].cylinder - 1][i]++;
    }
  }
  return sum.map((total, c) => {
    const out = new Float64Array(size);
    let prev = -1;
    for (let i = 0; i < size; i++) {
      if (count[c][i] === 0) continue;
      out[i] = total[i] / count[c][i];
      if (prev < 0) out.fill(out[i], 0, i);
      else for (let j = prev + 1; j < i; j++) out[j] = out[prev] + ((out[i] - out[prev]) * (j - prev)) / (i - prev);
      prev = i;
    }
    if (prev >= 0) out.fill(out[prev], prev + 1);
    return out;
  });
}

export function eventKey(e: FitEvent): string {
  return `${e.position}:${e.tdcDeg.toFixed(1)}`;
}

/** Lists the compression events whose closed-valve window touches [θmin, θmax] for a given cylinder-1 TDC. */
export function eventsFor(o: FitOptions, phaseDeg: number, thetaMin: number, thetaMax: number, gas: GasModel): FitEvent[] {
  const ivc = -180 + gas.ivcAbdcDeg;
  const evo = 180 - gas.evoBbdcDeg;
  const events: FitEvent[] = [];
  for (let position = 0; position < o.firingOrder.length; position++) {
    const cylinder = o.firingOrder[position];
    const base = phaseDeg + o.phasesDeg[cylinder - 1];
    const k0 = Math.floor((thetaMin - evo - base) / 720);
    const k1 = Math.ceil((thetaMax - ivc - base) / 720);
    for (let k = k0; k <= k1; k++) {
      const tdc = base + 720 * k;
      if (tdc + evo < thetaMin || tdc + ivc > thetaMax) continue;
      events.push({ cylinder, position, tdcDeg: tdc, complete: tdc + ivc >= thetaMin && tdc + evo <= thetaMax });
    }
  }
  events.sort((a, b) => a.tdcDeg - b.tdcDeg);
  return events;
}

interface Solved {
  coef: Float64Array;
  rss: number;
  events: FitEvent[];
  columnOf: Int32Array;
}

/** One least-squares solve at a phase; `stride` > 1 uses every stride-th row (the coarse phase scan). */
function solveAt(m: CrankMotion, o: FitOptions, phaseDeg: number, perEvent: boolean, shapes: Float64Array[], stride = 1): Solved | null {
  const gas = o.gas ?? GENERIC_GAS;
  const n = o.firingOrder.length;
  const rows = m.t.length;
  const thetaMin = m.thetaDeg[0];
  const thetaMax = m.thetaDeg[rows - 1];
  const events = eventsFor(o, phaseDeg, thetaMin, thetaMax, gas);
  const columnOf = new Int32Array(events.length);
  let next = 2 + (perEvent ? 0 : n);
  for (let e = 0; e < events.length; e++) {
    const ev = events[e];
    const usable = ev.complete && !o.exclude?.has(eventKey(ev));
    columnOf[e] = usable && !perEvent ? 2 + ev.cylinder - 1 : next++;
  }
  const ne = new NormalEquations(next);
  const cols = new Int32Array(2 + events.length);
  const vals = new Float64Array(2 + events.length);
  const ivc = -180 + gas.ivcAbdcDeg;
  const evo = 180 - gas.evoBbdcDeg;
  let first = 0;
  for (let r = 0; r < rows; r += stride) {
    const th = m.thetaDeg[r];
    cols[0] = 0;
    vals[0] = 1;
    cols[1] = 1;
    vals[1] = m.s[r];
    let count = 2;
    while (first < events.length && events[first].tdcDeg + evo < th) first++;
    for (let e = first; e < events.length && events[e].tdcDeg + ivc <= th; e++) {
      const psi = th - events[e].tdcDeg;
      if (psi > evo) continue;
      cols[count] = columnOf[e];
      vals[count] = torqueAt(shapes[events[e].cylinder - 1], psi);
      count++;
    }
    ne.add(cols, vals, count, m.y[r]);
  }
  // Columns that never received data (cylinders without complete events) are pinned by the ridge.
  for (let c = 0; c < next; c++) if (ne.xtx[c * next + c] === 0) ne.xtx[c * next + c] = 1;
  const solved = ne.solve();
  return solved ? { coef: solved.coef, rss: solved.rss, events, columnOf } : null;
}

/**
 * Scans the TDC phase with the sealed shape, then lets each cylinder take the leak shape that fits it best.
 * Returns the best fit, or null when the data cannot support one.
 */
export function fitTorque(m: CrankMotion, o: FitOptions): TorqueFit | null {
  if (m.t.length < 50) return null;
  const n = o.firingOrder.length;
  const rpm = meanRpm(m);
  const gas = o.gas ?? GENERIC_GAS;
  const steady = familyFor(gas, rpm);
  /** Each cylinder's shapes: at a steady speed until the phase is known, then over the cylinder's own speed. */
  let family: LeakyShape[][] = Array.from({ length: n }, () => steady);
  const choice = new Int32Array(n);
  const shapes = () => Array.from(choice, (f, c) => family[c][f].table);
  const step = o.coarseStepDeg ?? 6;
  let bestPhase = NaN;
  let bestRss = Infinity;
  const tryPhase = (p: number, stride = 1) => {
    const s = solveAt(m, o, p, false, shapes(), stride);
    // Compression only ever slows the crank into TDC: a phase that needs the cylinders' torque upside down
    // (half an event out, where the sum of shapes nearly changes sign) is not a fit.
    let sum = 0;
    if (s) for (let c = 0; c < n; c++) sum += s.coef[2 + c];
    if (s && sum > 0 && s.rss < bestRss) {
      bestRss = s.rss;
      bestPhase = p;
    }
  };
  // Coarse scan on every third row, then the fine scans on all rows from the coarse best.
  for (let p = o.scanFromDeg; p < o.scanToDeg; p += step) tryPhase(p, 3);
  if (!Number.isFinite(bestPhase)) return null;
  const centre = bestPhase;
  if (o.refineLeaks === false) {
    // The quick fit (comparing angle scales): the coarse phase on every row, nothing finer.
    const quick = solveAt(m, o, centre, false, shapes());
    return quick ? fitResult(m, o, family, choice, centre, quick, null) : null;
  }
  // 1° steps on every second row, then quarter degrees on all rows.
  bestRss = solveAt(m, o, centre, false, shapes(), 2)?.rss ?? Infinity;
  for (let p = centre - step; p <= centre + step; p += 1) if (p !== centre) tryPhase(p, 2);
  const centre2 = bestPhase;
  bestRss = solveAt(m, o, centre2, false, shapes())?.rss ?? Infinity;
  for (let p = centre2 - 0.75; p <= centre2 + 0.75; p += 0.25) if (p !== centre2) tryPhase(p);

  family = speedProfiles(m, o, bestPhase).map((p) => familyOver(gas, rpm, p));
  // Cylinders reading below 97 % of the median take, in turn, the leak shape with the smallest residual; two
  // passes settle neighbours. Sealed cylinders keep the sealed shape.
  const first = solveAt(m, o, bestPhase, false, shapes());
  bestRss = first?.rss ?? Infinity;
  const coef = first ? Array.from({ length: n }, (_, c) => first.coef[2 + c]) : [];
  const ref = [...coef].sort((a, b) => a - b)[n >> 1];
  const suspects = coef.map((k, c) => (k < 0.97 * ref ? c : -1)).filter((c) => c >= 0);
  // A second pass only matters when neighbours can trade residual with each other.
  for (let pass = 0; pass < (suspects.length > 1 ? 2 : 1); pass++) {
    for (const c of suspects) {
      let bestF = choice[c];
      for (let f = 0; f < family[c].length; f++) {
        if (f === bestF) continue;
        choice[c] = f;
        const s = solveAt(m, o, bestPhase, false, shapes());
        if (s && s.rss < bestRss * (1 - 1e-4)) {
          bestRss = s.rss;
          bestF = f;
        }
      }
      choice[c] = bestF;
    }
  }

  const final = shapes();
  const global = solveAt(m, o, bestPhase, false, final);
  const single = solveAt(m, o, bestPhase, true, final);
  if (!global || !single) return null;
  return fitResult(m, o, family, choice, bestPhase, global, single);
}

/** The fit's figures from the global solve (per cylinder) and, when given, the per-event solve. */
function fitResult(m: CrankMotion, o: FitOptions, family: LeakyShape[][], choice: Int32Array, bestPhase: number, global: Solved, single: Solved | null): TorqueFit {
  const n = o.firingOrder.length;
  const perCylinder = new Float64Array(n).fill(NaN);
  const pressure = new Float64Array(n).fill(NaN);
  const leakPerS = new Float64Array(n);
  const seen = new Uint8Array(n);
  for (let e = 0; e < global.events.length; e++) {
    const ev = global.events[e];
    if (global.columnOf[e] < 2 + n) seen[ev.cylinder - 1] = 1;
  }
  for (let c = 0; c < n; c++) {
    leakPerS[c] = family[c][choice[c]].leakPerS;
    if (!seen[c]) continue;
    perCylinder[c] = global.coef[2 + c];
    pressure[c] = perCylinder[c] * family[c][choice[c]].peakRatio;
  }
  const events = (single ?? global).events;
  const perEvent = new Float64Array(events.length).fill(NaN);
  if (single) {
    for (let e = 0; e < single.events.length; e++) {
      const ev = single.events[e];
      if (ev.complete) perEvent[e] = single.coef[single.columnOf[e]] * family[ev.cylinder - 1][choice[ev.cylinder - 1]].peakRatio;
    }
  }

  let mean = 0;
  for (let r = 0; r < m.y.length; r++) mean += m.y[r];
  mean /= m.y.length;
  let tss = 0;
  for (let r = 0; r < m.y.length; r++) tss += (m.y[r] - mean) * (m.y[r] - mean);
  const phaseDeg = ((bestPhase % 720) + 720) % 720;
  return { phaseDeg, perCylinder, pressure, leakPerS, perEvent, events, r2: tss > 0 ? 1 - global.rss / tss : 0 };
}
