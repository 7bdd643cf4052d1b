/**
 * The shop's own baselines: for one engine (cylinders, layout, firing order and displacement), the analyses its
 * members signed that read healthy give the usual cranking speed, crank-speed swing, current rise per compression
 * and time per compression event, as the range from the 10th to the 90th percentile. A new capture is held
 * against them in plain words — only once at least five captures stand behind a figure, and never across shops.
 */
import { type AnalysisResult, median, quantile } from '@/signal';
import type { EngineSpec } from './engine';

/** Captures behind a figure before it is compared with. */
export const BASELINE_MIN_CAPTURES = 5;

export type BaselineFigure = 'crankingRpm' | 'speedSwing' | 'currentRiseA' | 'eventMs';

export interface BaselineRange {
  low: number;
  high: number;
  captures: number;
}

export type Baseline = Partial<Record<BaselineFigure, BaselineRange>>;

const WORDS: Record<BaselineFigure, { label: string; unit: string; digits: number }> = {
  crankingRpm: { label: 'Cranking speed', unit: ' rpm', digits: 0 },
  speedSwing: { label: 'Crank-speed swing (fastest over slowest)', unit: '', digits: 2 },
  currentRiseA: { label: 'Current rise per compression', unit: ' A', digits: 0 },
  eventMs: { label: 'Time per compression event', unit: ' ms', digits: 0 },
};

/** Engines that share a baseline: the same cylinders, layout, firing order and displacement (to 0.1 L). */
export function baselineKey(e: Pick<EngineSpec, 'cylinders' | 'layout' | 'firingOrder' | 'displacementL'>): string {
  return `${e.cylinders}|${e.layout}|${e.firingOrder.join('-')}|${e.displacementL ? e.displacementL.toFixed(1) : '?'}`;
}

/** The figures one result gives a baseline (those its method measures). */
export function baselineFigures(r: Pick<AnalysisResult, 'crankingRpm' | 'speedSwing' | 'rawUnit' | 'cylinders'>): Partial<Record<BaselineFigure, number>> {
  const mid = (v: number[]) => {
    const m = median(v);
    return Number.isFinite(m) ? m : undefined;
  };
  return {
    crankingRpm: r.crankingRpm > 0 ? r.crankingRpm : undefined,
    speedSwing: r.speedSwing && r.speedSwing > 1 ? r.speedSwing : undefined,
    currentRiseA: r.rawUnit === 'A' ? mid(r.cylinders.map((c) => c.raw)) : undefined,
    eventMs: mid(r.cylinders.map((c) => c.strokeMs ?? Number.NaN)),
  };
}

/** The baseline from healthy results' figures: a range per figure with enough captures behind it. */
export function buildBaseline(results: Partial<Record<BaselineFigure, number>>[]): Baseline {
  const out: Baseline = {};
  for (const key of Object.keys(WORDS) as BaselineFigure[]) {
    const v = results.map((r) => r[key]).filter((x): x is number => x !== undefined && Number.isFinite(x));
    if (v.length < BASELINE_MIN_CAPTURES) continue;
    out[key] = { low: quantile(v, 0.1), high: quantile(v, 0.9), captures: v.length };
  }
  return out;
}

/** "Cranking speed 152 rpm; healthy captures of this engine in your shop: 188–214 rpm (12 captures), below them." */
export function baselineSentences(r: Pick<AnalysisResult, 'crankingRpm' | 'speedSwing' | 'rawUnit' | 'cylinders'>, b: Baseline): string[] {
  const now = baselineFigures(r);
  const out: string[] = [];
  for (const key of Object.keys(WORDS) as BaselineFigure[]) {
    const range = b[key];
    const value = now[key];
    if (!range || value === undefined) continue;
    const w = WORDS[key];
    const f = (v: number) => v.toFixed(w.digits);
    const where = value < range.low ? ', below them' : value > range.high ? ', above them' : ', within them';
    out.push(`${w.label} ${f(value)}${w.unit}; healthy captures of this engine in your shop: ${f(range.low)}–${f(range.high)}${w.unit} (${range.captures} captures)${where}.`);
  }
  return out;
}
