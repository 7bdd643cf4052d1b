/**
 * A cranking simulator: slider-crank volume, polytropic gas with per-cylinder leakage, a DC starter on a
 * battery with internal resistance, crank inertia and friction. It returns every channel type and the truth
 * (each cylinder's peak compression pressure) so the analysis can be checked against it.
 */
import { type EngineSetup, tdcPhasesDeg } from '../engine/firing';
import { volumeRatio, volumeRatioSlope } from '../engine/geometry';
import { simpleWheel, type ToothWheel } from '../teeth/wheel';
import { seededRandom } from '../dsp/random';

export type SimChannel = 'current' | 'hall' | 'vr' | 'sync' | 'rpm' | 'battery';
export type LeakModel = 'linear' | 'orifice' | 'late';

export interface SimOptions {
  engine: EngineSetup;
  /** @default 1 */
  seed?: number;
  /** Length of the recording, s. @default 6 */
  durationS?: number;
  /** Output sample rate, Hz. @default 10000 */
  sampleRateHz?: number;
  /** Starter engaged, s. @default 0.4 */
  starterOnS?: number;
  /** Starter released, s. @default durationS − 0.8 */
  starterOffS?: number;
  /** Leak rate per cylinder (index = cylinder − 1), 1/s; 0 is a sealed cylinder. */
  leakPerS?: number[];
  /** Total displacement, litres. @default 0.5 per cylinder */
  displacementL?: number;
  /** @default 10 */
  compressionRatio?: number;
  /** @default 3.3 */
  rodRatio?: number;
  /** @default 45 */
  ivcAbdcDeg?: number;
  /** @default 45 */
  evoBbdcDeg?: number;
  /** Polytropic exponent while cranking. @default 1.25 */
  n?: number;
  /** Battery rest voltage, V. @default 12.5 */
  batteryV?: number;
  /** Target mean cranking speed used to size the starter, rpm. @default 200 */
  targetRpm?: number;
  /** Tooth wheel: total positions and missing teeth. @default { count: 60, missing: 2 } */
  teeth?: { count: number; missing: number };
  /** Any wheel (several gaps, an extra tooth); overrides `teeth`. */
  wheel?: ToothWheel;
  /** A cam window, crank degrees after cylinder 1's compression TDC (0–720): its edges are recorded. */
  camWindowDeg?: [number, number];
  /** Trapped charge per cylinder (index = cylinder − 1), 1 = normal; above 1 stands for carbon build-up raising compression. */
  chargeScale?: number[];
  /** A cylinder (1-based) that fires on every second cycle: its pressure after TDC is raised fourfold. */
  firesCylinder?: number;
  /** Crank degrees from cylinder 1's compression TDC to the first tooth after the gap. @default 84 */
  gapOffsetDeg?: number;
  /** Variable-reluctance amplitude multiplier (0.1 gives a few tenths of a volt). @default 1 */
  vrScale?: number;
  /** The VR sensor's wires swapped (the wave upside down). @default false */
  vrInverted?: boolean;
  /**
   * The VR wave's physics. `simple`: a sine a tooth whose amplitude follows speed, a small wiggle across the gap.
   * `flux`: the voltage is the rate of change of the flux through the coil, each tooth a bump of flux as wide as
   * its pitch, so the amplitude grows in proportion to speed (a few tenths of a volt at the slowest teeth, with
   * `vrScale` 1), the gap is one wide swing down and up, a bent wheel modulates each revolution, and the noise
   * carries a slow drift. @default 'simple'
   */
  vrModel?: 'simple' | 'flux';
  /** Spark plugs out: no compression, only valve springs and friction. @default false */
  plugsOut?: boolean;
  /** Starter stall torque, less friction, over one cylinder's peak compression torque. @default 1.5 */
  starterMargin?: number;
  /** Crank and flywheel inertia, kg·m². @default tuned per engine for a real engine's swing */
  crankInertia?: number;
  /** Multiplies the crank and flywheel inertia (default or given). @default 1 */
  inertiaScale?: number;
  /** Noise level multiplier (1 = a clean clamp and sensor, 4 = a noisy bay). @default 1 */
  noise?: number;
  /**
   * How a leaking cylinder loses its charge (the rate is `leakPerS`):
   * - `linear`: flow in proportion to the pressure above the outside (dm/dt = −λ·m·(p − p0)/p0), all through the stroke;
   * - `orifice`: flow through a fixed opening past a valve or the rings, growing with the square root of the pressure
   *   difference, so the loss starts early in the stroke;
   * - `late`: a path that opens only near top dead centre (from `lateLeakFromDeg`), flow in proportion to the pressure.
   * @default 'linear'
   */
  leakModel?: LeakModel;
  /** Crank degrees before TDC at which a `late` leak opens. @default 35 */
  lateLeakFromDeg?: number;
  /** Heat loss to the cylinder wall (dT/dt = −h·(T − T_wall)), 1/s; the wall sits at the intake temperature. @default 0 */
  heatLossPerS?: number;
  /** Battery internal resistance, Ω. @default 0.011 */
  batteryOhm?: number;
  /** Resistance of the cables and their joints between battery and starter, Ω. @default 0 */
  cableOhm?: number;
  /** The starter armature's inertia reflected to the crank, kg·m². @default 0.03 */
  armatureInertia?: number;
  /** Speed-dependent friction over the default (viscous term multiplier). @default 1 */
  viscousScale?: number;
  /** Friction rising with the square of speed, N·m per (rad/s)². @default 0 */
  frictionSquare?: number;
  /**
   * A dragging starter (worn bushes, an armature rubbing its field): a friction torque on the armature, reflected
   * to the crank, as a share of the starter's stall torque. It draws more current for less speed. @default 0
   */
  starterDrag?: number;
  channels?: SimChannel[];
}

export interface SimTruth {
  /** Mean per-cycle peak gauge pressure while cranking, kPa (index = cylinder − 1). */
  peakKpa: Float64Array;
  /** Peak pressure in percent of the median of the sealed cylinders. */
  relativePercent: Float64Array;
  meanRpm: number;
  /** Cycles completed while the starter was engaged. */
  cycles: number;
  /**
   * The starter's one-way clutch while cranking steadily: the share of the time it ran free (the crank ahead of
   * the armature), and each stretch from letting go to catching the crank again, s.
   */
  overrun: { share: number; spans: Array<[number, number]> };
  /** The starting system as simulated: what a starting-system check should read. */
  starting: {
    /** Battery rest voltage, V. */
    restingV: number;
    /** Resistance inside the battery, between its rest voltage and its terminals, Ω. */
    batteryOhm: number;
    /** Highest current, A (the inrush as the starter engages). */
    inrushPeakA: number;
    /** Mean current while cranking steadily, A. */
    crankingMeanA: number;
    /** Lowest terminal voltage while cranking steadily, V. */
    crankingMinV: number;
  };
}

export interface SimResult {
  sampleRateHz: number;
  time: Float64Array;
  current?: Float64Array;
  hall?: Float64Array;
  vr?: Float64Array;
  sync?: Float64Array;
  rpm?: Float64Array;
  /** Battery voltage at its terminals, V. */
  battery?: Float64Array;
  /** Cam window edges, s (with `camWindowDeg`). */
  camEdges?: { rising: number[]; falling: number[] };
  /** Times of the crank-tooth edges, s. */
  toothTimes: Float64Array;
  truth: SimTruth;
}

const P0 = 101_325;
const RAD = Math.PI / 180;

/** Runs one simulated cranking capture. */
export function simulateCranking(options: SimOptions): SimResult {
  const o = options;
  const n = o.engine.cylinders;
  const duration = o.durationS ?? 6;
  const fs = o.sampleRateHz ?? 10_000;
  const onS = o.starterOnS ?? 0.4;
  const offS = o.starterOffS ?? duration - 0.8;
  const leak = o.leakPerS ?? [];
  const rc = o.compressionRatio ?? 10;
  const rodRatio = o.rodRatio ?? 3.3;
  const ivc = -180 + (o.ivcAbdcDeg ?? 45);
  const evo = 180 - (o.evoBbdcDeg ?? 45);
  const poly = o.n ?? 1.25;
  const vdM3 = ((o.displacementL ?? 0.5 * n) / n) / 1000;
  const vcM3 = vdM3 / (rc - 1);
  const noise = o.noise ?? 1;
  const wheel = o.wheel ?? simpleWheel((o.teeth ?? { count: 60, missing: 2 }).count, (o.teeth ?? { count: 60, missing: 2 }).missing);
  const teeth = { count: wheel.positions };
  // Which positions carry a tooth (position 0 first), from the wheel's runs and gaps.
  const presentAt = new Uint8Array(wheel.positions);
  for (let j = 0, pos = 0; j < wheel.gapsAfter.length; j++) {
    presentAt[pos] = 1;
    pos += 1 + wheel.gapsAfter[j];
  }
  const gapOffset = o.gapOffsetDeg ?? 84;
  const channels = new Set<SimChannel>(o.channels ?? ['current']);
  const rnd = seededRandom(o.seed ?? 1);
  const phases = tdcPhasesDeg(o.engine);

  // Starter and drivetrain sized for the engine. Friction grows with displacement. The crank and flywheel
  // turn on their own inertia; the starter's armature, reflected through the pinion and ring gear, adds a few
  // hundredths of a kg·m² and drives the crank through a one-way clutch, so the crank can run ahead of it
  // after each compression. The starter's stall torque clears a cylinder's peak compression torque, and its
  // free speed is chosen so that it carries the mean load at the target speed.
  const totalL = vdM3 * n * 1000;
  const frictionNm = 8 + 9 * totalL;
  const viscousNmPerRad = 0.25 * totalL * (o.viscousScale ?? 1);
  const frictionSquare = o.frictionSquare ?? 0;
  // Tuned so that healthy engines swing as real ones do within each compression event (max/min about 1.9–2.4
  // for petrol engines, 2.4–2.8 for a diesel: captures-real/README.md): more cylinders overlap their events
  // and need less inertia for the same swing.
  const crankInertia = (o.crankInertia ?? 0.25 * Math.pow(4 / n, 1.4) * ((vdM3 * 1000) / 0.5)) * (o.inertiaScale ?? 1);
  const armatureInertia = o.armatureInertia ?? 0.03;
  const valveSpringNm = 0.4 + 0.4 * totalL;
  const batteryV = o.batteryV ?? 12.5;
  // A battery's resistance is stated for a typical 2-litre car's; a bigger engine carries a bigger battery, so
  // its share of the circuit scales down with the starter's own (see rTotal below).
  const batteryOhm = o.batteryOhm ?? 0.011;
  const leakModel = o.leakModel ?? 'linear';
  const lateFrom = -(o.lateLeakFromDeg ?? 35);
  const heatLoss = o.heatLossPerS ?? 0;
  const omegaTarget = ((o.targetRpm ?? 200) * 2 * Math.PI) / 60;
  // Mean compression load at the crank, N·m, from the net work of the closed part of the cycle.
  const vIvcRatio = volumeRatio(rc, rodRatio, ivc * RAD);
  const meanGasNm = (n * P0 * vcM3 * 0.35 * Math.pow(rc, poly)) / (4 * Math.PI);
  const loadNm = frictionNm + viscousNmPerRad * omegaTarget + meanGasNm * 0.2;
  // One sealed cylinder's peak compression torque; the starter's stall torque clears it with margin.
  let gasPeakNm = 0;
  for (let psi = ivc; psi < 0; psi += 1) {
    const g = P0 * (Math.pow(vIvcRatio / volumeRatio(rc, rodRatio, psi * RAD), poly) - 1) * vcM3 * -volumeRatioSlope(rc, rodRatio, psi * RAD);
    gasPeakNm = Math.max(gasPeakNm, g);
  }
  const stallNm = Math.max((o.starterMargin ?? 1.5) * gasPeakNm + frictionNm, 2 * loadNm);
  const omegaFree = omegaTarget / (1 - loadNm / stallNm);
  const motorK = batteryV / omegaFree;
  // The starter is sized on a nominal battery (11 mΩ) and no cable drop; a weaker battery or a poor cable then
  // costs it speed and torque as it would on a real car.
  const rNominal = (motorK * batteryV) / stallNm;
  // A battery or cable worse than nominal adds to the circuit in proportion (a quarter more at 25 mΩ and a poor
  // cable), so the engine cranks slower yet still cranks: an engine that does not turn is no compression test.
  const rTotal = rNominal * (1 + (0.25 * (batteryOhm - 0.011 + (o.cableOhm ?? 0))) / 0.018);
  const rBattery = Math.min(0.7 * rTotal, batteryOhm * Math.min(1, rNominal / 0.017));
  const dragNm = (o.starterDrag ?? 0) * stallNm;
  const gearRatio = 12;
  const commutatorSegments = 24;

  const sub = Math.max(1, Math.ceil(40_000 / fs));
  const dt = 1 / (fs * sub);
  const samples = Math.floor(duration * fs);

  const time = new Float64Array(samples);
  const current = channels.has('current') ? new Float64Array(samples) : undefined;
  const hall = channels.has('hall') ? new Float64Array(samples) : undefined;
  const vr = channels.has('vr') ? new Float64Array(samples) : undefined;
  const sync = channels.has('sync') ? new Float64Array(samples) : undefined;
  const rpm = channels.has('rpm') ? new Float64Array(samples) : undefined;
  const battery = channels.has('battery') ? new Float64Array(samples) : undefined;
  const tooth: number[] = [];

  const mass = new Float64Array(n).fill(1);
  // The charge's pressure over the adiabatic one after heat lost to the wall (1 without heat loss).
  const heatFactor = new Float64Array(n).fill(1);
  const closed = new Uint8Array(n);
  const cyclePeak = new Float64Array(n);
  const peakSum = new Float64Array(n);
  const peakCount = new Float64Array(n);

  const pitch = 360 / teeth.count;
  let theta = -200 + rnd.next() * 360; // crank angle, degrees after cylinder 1's compression TDC
  let omega = 0;
  let omegaArm = 0;
  let locked = true;
  let freeSteps = 0;
  let steadySteps = 0;
  const spans: Array<[number, number]> = [];
  let t = 0;
  let lastToothSlot = Math.floor((theta - gapOffset) / pitch);
  const cam = { rising: [] as number[], falling: [] as number[] };
  const cycleCount = new Int32Array(n);
  let rpmSum = 0;
  let rpmCount = 0;
  const steadyFrom = onS + 0.8;
  let currentNow = 0;
  let inrushPeak = 0;
  let steadyCurrentSum = 0;
  let steadyCurrentCount = 0;
  let steadyCurrentMax = 0;
  const psiOf = (c: number, th: number) => {
    let psi = (th - phases[c]) % 720;
    if (psi < -360) psi += 720;
    if (psi >= 360) psi -= 720;
    return psi;
  };

  for (let s = 0; s < samples; s++) {
    for (let k = 0; k < sub; k++) {
      const engaged = t >= onS && t < offS;
      let gasNm = 0;
      for (let c = 0; c < n; c++) {
        const psi = psiOf(c, theta);
        if (!o.plugsOut && psi >= ivc && psi <= evo) {
          if (!closed[c]) {
            closed[c] = 1;
            mass[c] = o.chargeScale?.[c] ?? 1;
            heatFactor[c] = 1;
            cyclePeak[c] = 0;
            cycleCount[c]++;
          }
          const vRatio = volumeRatio(rc, rodRatio, psi * RAD);
          const p = P0 * Math.pow((mass[c] * vIvcRatio) / vRatio, poly) * heatFactor[c];
          const fired = o.firesCylinder === c + 1 && psi > 2 && cycleCount[c] % 2 === 1;
          const gauge = (p - P0) * (fired ? 4 : 1);
          if (gauge > cyclePeak[c]) cyclePeak[c] = gauge;
          gasNm += gauge * vcM3 * volumeRatioSlope(rc, rodRatio, psi * RAD);
          const l = leak[c] ?? 0;
          if (l > 0 && gauge > 0) {
            const rate = leakModel === 'orifice' ? Math.sqrt(gauge / P0) : leakModel === 'late' ? (psi >= lateFrom ? gauge / P0 : 0) : gauge / P0;
            mass[c] *= Math.exp(-l * rate * dt);
          }
          if (heatLoss > 0) {
            // Ideal gas: the charge's temperature over the intake's is p·v, v its volume per unit of trapped mass.
            const tRatio = (p / P0) * (vRatio / (mass[c] * vIvcRatio));
            heatFactor[c] *= Math.exp(-heatLoss * (1 - 1 / tRatio) * dt);
          }
        } else if (closed[c]) {
          closed[c] = 0;
          if (t > steadyFrom && t < offS) {
            peakSum[c] += cyclePeak[c];
            peakCount[c] += 1;
          }
        }
      }
      currentNow = engaged ? Math.max(0, (batteryV - motorK * omegaArm) / rTotal) : 0;
      const motorNm = motorK * currentNow - (engaged ? dragNm : 0);
      if (currentNow > inrushPeak) inrushPeak = currentNow;
      if (engaged && t > steadyFrom) {
        steadyCurrentSum += currentNow;
        steadyCurrentCount++;
        steadyCurrentMax = Math.max(steadyCurrentMax, currentNow);
      }
      const friction = omega > 1e-6 ? frictionNm + viscousNmPerRad * omega + frictionSquare * omega * omega : 0;
      const springNm = omega > 1e-6 ? -valveSpringNm * Math.sin(n * theta * RAD) : 0;
      const load = gasNm + springNm - friction;
      let accel: number;
      if (locked && engaged) {
        accel = (motorNm + load) / (crankInertia + armatureInertia);
        // The clutch carries motor torque less what the armature itself needs; below zero it lets go.
        if (motorNm - armatureInertia * accel < 0) {
          locked = false;
          if (t > steadyFrom && t < offS) spans.push([t, offS]);
        }
      }
      if (!locked || !engaged) {
        accel = load / crankInertia;
        omegaArm = Math.max(0, omegaArm + ((engaged ? motorNm : 0) - 0.5) / armatureInertia * dt);
      }
      if (omega <= 1e-6 && motorNm + gasNm <= frictionNm) accel = Math.max(0, accel!);
      if (engaged && t > steadyFrom) {
        steadySteps++;
        if (!locked) freeSteps++;
      }
      const thetaBefore = theta;
      omega = Math.max(0, omega + accel! * dt);
      if (locked && engaged) omegaArm = omega;
      else if (engaged && omegaArm >= omega) {
        // The armature catches the crank: the clutch locks and the two share their momentum.
        omega = omegaArm = (crankInertia * omega + armatureInertia * omegaArm) / (crankInertia + armatureInertia);
        locked = true;
        const open = spans[spans.length - 1];
        if (open && open[1] === offS) open[1] = t;
      }
      theta += (omega * dt) / RAD;
      // Crank-tooth edges crossed in this step.
      const slot = Math.floor((theta - gapOffset) / pitch);
      for (let q = lastToothSlot + 1; q <= slot; q++) {
        const pos = ((q % teeth.count) + teeth.count) % teeth.count;
        const edges = presentAt[pos] ? [gapOffset + q * pitch] : [];
        // The extra tooth sits 40 % of a pitch after the last position.
        if (wheel.extraTooth && pos === teeth.count - 1) edges.push(gapOffset + (q + 0.4) * pitch);
        for (const edge of edges) {
          const frac = (edge - thetaBefore) / Math.max(1e-12, theta - thetaBefore);
          tooth.push(t + Math.min(1, frac) * dt + rnd.gauss() * 3e-6 * noise);
        }
      }
      lastToothSlot = slot;
      if (o.camWindowDeg) {
        const before = ((thetaBefore % 720) + 720) % 720;
        const after = ((theta % 720) + 720) % 720;
        const crossed = (a: number) => (before <= after ? before < a && a <= after : before < a || a <= after);
        if (crossed(o.camWindowDeg[0])) cam.rising.push(t);
        if (crossed(o.camWindowDeg[1])) cam.falling.push(t);
      }
      t += dt;
    }
    time[s] = s / fs;
    if (t > steadyFrom && t < offS) {
      rpmSum += omega;
      rpmCount++;
    }
    if (current) {
      const ripple = currentNow > 0 ? 5 * Math.sin((commutatorSegments * gearRatio * theta * RAD) % (2 * Math.PI)) : 0;
      current[s] = currentNow + noise * (1.2 * rnd.gauss() + ripple);
    }
    const wheelDeg = theta - gapOffset;
    const slotF = wheelDeg / pitch;
    const pos = ((Math.floor(slotF) % teeth.count) + teeth.count) % teeth.count;
    const present = presentAt[pos] === 1;
    const u = slotF - Math.floor(slotF);
    if (hall) hall[s] = (present && u < 0.5 ? 5 : 0.1) + noise * 0.03 * rnd.gauss();
    if (vr && o.vrModel === 'flux') {
      vr[s] = (o.vrInverted ? -1 : 1) * (o.vrScale ?? 1) * fluxVoltage(wheelDeg, pitch, presentAt, omega) + noise * (0.015 * rnd.gauss() + 0.01 * Math.sin(2 * Math.PI * 0.7 * t));
    } else if (vr) {
      // Across the gap a small wiggle stays (the flux still changes a little); a VR interface must ignore it.
      const amp = (0.4 + (omega / omegaTarget) * 2.5) * (o.vrScale ?? 1) * (o.vrInverted ? -1 : 1);
      vr[s] = (present ? amp : 0.15 * amp) * Math.sin(2 * Math.PI * (u + 0.5)) + noise * 0.02 * (o.vrScale ?? 1) * rnd.gauss();
    }
    if (sync) {
      const psi1 = psiOf(0, theta);
      sync[s] = (psi1 >= -14 && psi1 <= -10 ? 5 : 0) + noise * 0.03 * rnd.gauss();
    }
    if (battery) battery[s] = batteryV - currentNow * rBattery + noise * 0.01 * rnd.gauss();
    if (rpm) rpm[s] = Math.round(((omega * 60) / (2 * Math.PI) + noise * 0.5 * rnd.gauss()) * 4) / 4;
  }

  const peakKpa = new Float64Array(n);
  for (let c = 0; c < n; c++) peakKpa[c] = peakCount[c] > 0 ? peakSum[c] / peakCount[c] / 1000 : 0;
  const sealed: number[] = [];
  for (let c = 0; c < n; c++) if (!(leak[c] > 0)) sealed.push(peakKpa[c]);
  const ref = median(sealed.length ? sealed : Array.from(peakKpa));
  const relativePercent = peakKpa.map((p) => (100 * p) / ref);
  const meanOmega = rpmCount ? rpmSum / rpmCount : 0;
  const cycles = Math.min(...Array.from(peakCount));

  return {
    sampleRateHz: fs,
    time,
    current,
    hall,
    vr,
    sync,
    rpm,
    battery,
    camEdges: o.camWindowDeg ? cam : undefined,
    toothTimes: Float64Array.from(tooth),
    truth: {
      peakKpa,
      relativePercent,
      meanRpm: (meanOmega * 60) / (2 * Math.PI),
      cycles,
      overrun: { share: steadySteps ? freeSteps / steadySteps : 0, spans },
      starting: {
        restingV: batteryV,
        batteryOhm: rBattery,
        inrushPeakA: inrushPeak,
        crankingMeanA: steadyCurrentCount ? steadyCurrentSum / steadyCurrentCount : 0,
        crankingMinV: batteryV - steadyCurrentMax * rBattery,
      },
    },
  };
}

/** Coil voltage per rad/s of crank speed at a tooth's flank (V·s): about 1.5 V at 200 rpm. */
const VR_VOLTS_PER_RAD_S = 0.07;
/** Width of a tooth's flux bump, pitches (σ of a Gaussian): neighbours overlap, so the flux sags only at a gap. */
const VR_BUMP_PITCHES = 0.32;

/**
 * The coil's voltage for the `flux` VR model: dΦ/dt = dΦ/dθ · ω, Φ the sum of a Gaussian bump per present tooth.
 * A runout of 8 % (the wheel a little off centre) modulates it once a revolution.
 */
function fluxVoltage(wheelDeg: number, pitch: number, presentAt: Uint8Array, omega: number): number {
  const slot = wheelDeg / pitch;
  const base = Math.floor(slot);
  const count = presentAt.length;
  let slope = 0;
  for (let q = base - 3; q <= base + 4; q++) {
    const pos = ((q % count) + count) % count;
    if (!presentAt[pos]) continue;
    const x = (slot - q) / VR_BUMP_PITCHES;
    slope += (-x / VR_BUMP_PITCHES) * Math.exp(-0.5 * x * x);
  }
  const runout = 1 + 0.08 * Math.sin((wheelDeg * Math.PI) / 180);
  // dΦ/dθ in units of a tooth's bump per pitch, to volts per rad/s, times the speed.
  return -slope * runout * VR_VOLTS_PER_RAD_S * omega * 0.35;
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}
