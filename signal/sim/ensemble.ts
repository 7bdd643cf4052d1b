/**
 * An ensemble of simulated engines whose physics varies independently along every axis the analysis cannot
 * know: how a cylinder leaks, the gas's polytropic exponent, intake valve closing, crank inertia, the starter's
 * armature, the battery's internal resistance and the cables, friction rising with speed, and a VR sensor's wave
 * from the flux through its coil (amplitude, polarity). One family, heat lost to the cylinder wall, is kept out of
 * the ensemble: the analysis is calibrated without it and tested on it.
 */
import { seededRandom, type Random } from '../dsp/random';
import type { EngineSetup } from '../engine/firing';
import type { LeakModel, SimOptions } from './simulate';

/**
 * `weak-battery` (25–40 mΩ) and `dragging-starter` (a drag of 12–22 % of the starter's stall torque) are the
 * ensemble with a starting-system fault: the check must name it, and the compression figures stay honest on it.
 */
export type EnsembleFamily = 'ensemble' | 'held-out' | 'weak-battery' | 'dragging-starter';

/** The physics of one drawn engine, and its leak pattern. */
export interface EnsembleDraw {
  family: EnsembleFamily;
  /** Options for simulateCranking, without the engine, channels and seed. */
  physics: Partial<SimOptions>;
  leakPerS: number[];
  /** A short description of the draw, for a look at the misses. */
  label: string;
}

const LEAK_MODELS: LeakModel[] = ['linear', 'orifice', 'late'];

const uniform = (rnd: Random, lo: number, hi: number) => lo + (hi - lo) * rnd.next();
const logUniform = (rnd: Random, lo: number, hi: number) => Math.exp(uniform(rnd, Math.log(lo), Math.log(hi)));

/** A leak pattern: healthy, one leaking cylinder, a neighbouring pair (a gasket between them) or a nearly dead one. */
function drawLeaks(rnd: Random, engine: EngineSetup, model: LeakModel): { leak: number[]; kind: string } {
  const n = engine.cylinders;
  const leak = new Array<number>(n).fill(0);
  const pick = rnd.next();
  // A late path saturates: past about 40 % its rate no longer matters, so it is drawn from a narrower range.
  const rate = () => (model === 'late' ? logUniform(rnd, 0.3, 4) : logUniform(rnd, 0.3, 6));
  if (pick < 0.25) return { leak, kind: 'healthy' };
  const at = Math.floor(rnd.next() * n);
  if (pick < 0.65) {
    leak[engine.firingOrder[at] - 1] = rate();
    return { leak, kind: 'one leak' };
  }
  if (pick < 0.9) {
    // Cylinders side by side in a bank: the simplest stand-in is neighbours by number.
    const c = engine.firingOrder[at] - 1;
    const d = c + 1 < n ? c + 1 : c - 1;
    leak[c] = rate();
    leak[d] = rate();
    return { leak, kind: 'pair' };
  }
  leak[engine.firingOrder[at] - 1] = model === 'late' ? 8 : 20;
  return { leak, kind: 'nearly dead' };
}

/** One engine's physics drawn from the ensemble (or from the held-out family), reproducible from its seed. */
export function drawEngine(engine: EngineSetup, seed: number, family: EnsembleFamily): EnsembleDraw {
  const rnd = seededRandom(0x5eed + 7919 * seed + (family === 'held-out' ? 104_729 : 0));
  const leakModel = LEAK_MODELS[Math.floor(rnd.next() * LEAK_MODELS.length)];
  const physics: Partial<SimOptions> = {
    leakModel,
    n: uniform(rnd, 1.1, 1.35),
    ivcAbdcDeg: uniform(rnd, 30, 70),
    inertiaScale: uniform(rnd, 0.7, 1.3),
    armatureInertia: uniform(rnd, 0.015, 0.05),
    batteryOhm: uniform(rnd, 0.005, 0.025),
    cableOhm: uniform(rnd, 0, 0.004),
    batteryV: uniform(rnd, 12.2, 12.7),
    viscousScale: uniform(rnd, 0.5, 3),
    frictionSquare: uniform(rnd, 0, 0.015),
    heatLossPerS: family === 'held-out' ? uniform(rnd, 3, 12) : 0,
  };
  // The faults from their own draw, so each engine is the ensemble's with only the fault added.
  const fault = seededRandom(0xfa17 + 7907 * seed);
  if (family === 'weak-battery') physics.batteryOhm = uniform(fault, 0.025, 0.04);
  if (family === 'dragging-starter') physics.starterDrag = uniform(fault, 0.12, 0.22);
  const { leak, kind } = drawLeaks(rnd, engine, leakModel);
  // The VR sensor from its own draw (so the engines stay as they were): the flux model's wave, a few tenths of a
  // volt to over a volt, either polarity, recorded at 20 kHz.
  const sensor = seededRandom(0x7e5 + 104_723 * seed);
  physics.vrModel = 'flux';
  physics.vrScale = uniform(sensor, 0.3, 1.2);
  physics.vrInverted = sensor.next() < 0.5;
  const f = (v: number | undefined, d = 2) => (v ?? 0).toFixed(d);
  const label = `${kind} (${leakModel}) n=${f(physics.n)} ivc=${f(physics.ivcAbdcDeg, 0)} J×${f(physics.inertiaScale)} Rb=${f(1000 * physics.batteryOhm!, 0)}mΩ h=${f(physics.heatLossPerS, 1)}${physics.starterDrag ? ` drag=${f(physics.starterDrag)}` : ''}`;
  return { family, physics, leakPerS: leak, label };
}
