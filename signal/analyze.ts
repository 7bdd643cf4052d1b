/**
 * The analysis: picks the method for the channels present, runs it (and the other one as a cross-check when
 * both current and crank channels exist), and turns the fit into per-cylinder results, a verdict and warnings.
 */
import { checkFiringOrder, firingIntervals } from './engine/firing';
import { CaptureError } from './errors';
import { type MethodOutcome, type MethodRun, runCurrentMethod } from './methods/current';
import { runCrankSpeedMethod, runSpeedChannelMethod } from './methods/crank-speed';
import { describePattern } from './steps/pattern';
import { summarize } from './steps/summarize';
import { runFit } from './steps/run-fit';
import { type QualityWarning, THIN_EVIDENCE, warning } from './steps/warnings';
import type { AnalysisResult, AnalysisSettings, CaptureColumns, CylinderStatus, Method, MethodResult } from './types';
import { ENGINE_VERSION } from './version';

const MIN_RPM = 100;
const MAX_RPM = 400;
const MIN_CYCLES = 3;
const MIN_FIT = 0.6;

/** Analyses decoded capture columns. Throws CaptureError only for bad settings; a bad capture gives `uncertain`. */
export function analyzeCapture(columns: CaptureColumns, settings: AnalysisSettings, importWarnings: QualityWarning[] = []): AnalysisResult {
  const setup = settings.engine;
  checkFiringOrder(setup.firingOrder, setup.cylinders);
  firingIntervals(setup);
  const lowLimit = settings.lowLimitPercent ?? 90;
  const spreadLimit = settings.spreadLimitPercent ?? 10;
  if (!(lowLimit > 0 && lowLimit < 100)) throw new CaptureError('BAD_SETTINGS', 'The low limit must be a percentage between 0 and 100.');
  if (!(spreadLimit > 0 && spreadLimit < 100)) throw new CaptureError('BAD_SETTINGS', 'The spread limit must be a percentage between 0 and 100.');
  const rotation = Math.trunc(settings.rotation ?? 0);
  const choice = settings.method ?? 'auto';
  const hasCurrent = !!(columns.current && columns.time);
  const hasCrank = !!(columns.toothTimes || (columns.crank && columns.time) || (columns.rpm && columns.time));

  const runMethod = (method: Method): MethodOutcome => {
    if (method === 'current') {
      if (!hasCurrent) return { ok: false, warnings: [warning('NO_USABLE_CHANNEL', 'The starter-current method needs a current channel (A) and a time column; map them or choose the crank-speed method.')] };
      return runCurrentMethod(columns.time!, columns.current!, columns.sync, setup, rotation, settings.window);
    }
    if (!hasCrank) return { ok: false, warnings: [warning('NO_USABLE_CHANNEL', 'The crank-speed method needs crank tooth times, a crank sensor channel or an engine-speed channel; map one or choose the starter-current method.')] };
    if (!columns.toothTimes && !columns.crank) return runSpeedChannelMethod(columns.time!, columns.rpm!, setup, rotation, settings.window);
    return runCrankSpeedMethod(
      { toothTimes: columns.toothTimes, time: columns.time, crank: columns.crank, sync: columns.sync, sensor: settings.sensor, teeth: settings.teeth },
      setup,
      rotation,
      settings.window,
    );
  };

  const primary: Method = choice === 'auto' ? (hasCrank ? 'crank-speed' : 'current') : choice;
  const outcome = runMethod(primary);
  const result = toMethodResult(primary, outcome, settings, lowLimit, spreadLimit, importWarnings);

  let crossCheck: AnalysisResult['crossCheck'];
  if (choice === 'auto' && hasCurrent && hasCrank) {
    const other = toMethodResult('current', runMethod('current'), settings, lowLimit, spreadLimit, importWarnings);
    if (other.fitQuality > 0) {
      let maxDifference = 0;
      for (let c = 0; c < result.cylinders.length; c++) {
        maxDifference = Math.max(maxDifference, Math.abs(result.cylinders[c].relativePercent - other.cylinders[c].relativePercent));
      }
      const sameLow = result.cylinders.every((c, i) => (c.status === 'low') === (other.cylinders[i].status === 'low'));
      const agree = sameLow && maxDifference <= 8;
      crossCheck = {
        method: 'current',
        cylinders: other.cylinders.map((c) => ({ cylinder: c.cylinder, relativePercent: c.relativePercent, status: c.status })),
        agree,
        maxDifference: Math.round(maxDifference * 10) / 10,
      };
      if (!agree) {
        result.warnings.push(warning('METHODS_DISAGREE', `The starter-current and crank-speed methods differ by up to ${crossCheck.maxDifference} points; check both probes and the firing order before trusting either.`));
      }
    }
  }

  const statuses = result.cylinders.map((c) => c.status);
  const verdict: CylinderStatus = statuses.includes('uncertain') ? 'uncertain' : statuses.includes('low') ? 'low' : 'ok';
  const pattern = describePattern(setup, result.cylinders, verdict === 'uncertain');
  return {
    engineVersion: ENGINE_VERSION,
    ...result,
    verdict,
    pattern,
    settings: {
      method: choice,
      cylinders: setup.cylinders,
      firingOrder: setup.firingOrder,
      lowLimitPercent: lowLimit,
      spreadLimitPercent: spreadLimit,
      rotation,
      teeth: settings.teeth ? `${settings.teeth.count}-${settings.teeth.missing}` : undefined,
    },
    crossCheck,
  };
}

function toMethodResult(
  method: Method,
  outcome: MethodOutcome,
  settings: AnalysisSettings,
  lowLimit: number,
  spreadLimit: number,
  importWarnings: QualityWarning[],
): MethodResult {
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
        cylinder: i + 1, relativePercent: 0, status: 'uncertain' as const, events: 0, rejected: 0, spreadPercent: 0, plainPercent: 0, raw: 0, perCycle: [],
      })),
      events: [],
      rawUnit: method === 'current' ? 'A' : 'rpm',
      spreadPercent: 0,
      fitQuality: 0,
      warnings,
    };
  }
  const run: MethodRun = outcome.run;
  warnings.push(...run.warnings);
  const half = Math.min(...firingIntervals(setup)) / 2;
  const isCurrent = method === 'current';
  let fit = run.fit;
  let summary = summarize(run.motion, fit, n, half, isCurrent, lowLimit);
  if (summary.rejectedKeys.size > 0) {
    const refit = runFit(run.motion, setup, run.identity === 'sync', Math.trunc(settings.rotation ?? 0), summary.rejectedKeys);
    if (refit) {
      fit = refit;
      const again = summarize(run.motion, fit, n, half, isCurrent, lowLimit);
      // Keep the first pass's rejected set: the refit leaves those events out.
      summary = { ...again, rejectedKeys: summary.rejectedKeys };
    }
    warnings.push(warning('EVENTS_REJECTED', `${summary.rejectedKeys.size} compression event(s) looked malformed (a spike or dropout) and were left out.`));
  }

  const rpm = Math.round(run.rpm * 10) / 10;
  if (rpm < MIN_RPM) warnings.push(warning('CRANKING_TOO_SLOW', `Cranking averaged ${rpm.toFixed(0)} rpm, below the ${MIN_RPM} rpm needed; charge or replace the battery and check the starter, then record again.`));
  if (rpm > MAX_RPM) warnings.push(warning('CRANKING_TOO_FAST', `The crank turned at ${rpm.toFixed(0)} rpm, faster than cranking (${MAX_RPM} rpm); the engine may have started. Disable fuel as the service information directs and record again.`));
  const cycles = Math.min(...summary.cylinders.map((c) => c.events));
  if (cycles < MIN_CYCLES) warnings.push(warning('TOO_FEW_CYCLES', `Only ${cycles} complete engine cycle(s) per cylinder were usable; crank for 5–10 s so at least ${MIN_CYCLES} are recorded.`));
  if (fit.r2 < MIN_FIT && !warnings.some((w) => w.code === 'FIRING_ORDER_MISMATCH')) warnings.push(warning('FIRING_ORDER_MISMATCH', `The compression events do not follow ${n} cylinders firing ${setup.firingOrder.join('-')}; check the cylinder count, firing order and intervals against the service information.`));
  if (run.identity === 'assumed' && !warnings.some((w) => w.code === 'SYNC_NOT_FOUND')) {
    warnings.push(warning('NO_SYNC', `Without a cylinder 1 sync channel, the numbers assume the first event is cylinder ${setup.firingOrder[0]}; rotate the assignment if you know better, or record again with sync on cylinder 1.`));
  }
  const thin = warnings.some((w) => THIN_EVIDENCE.has(w.code));
  const inconsistent: number[] = [];
  for (const c of summary.cylinders) {
    if (thin || c.events < MIN_CYCLES) c.status = 'uncertain';
    else if (c.relativePercent < lowLimit) c.status = 'low';
    if (c.spreadPercent > spreadLimit) inconsistent.push(c.cylinder);
  }
  if (inconsistent.length) {
    warnings.push(warning('INCONSISTENT_CYCLES', `Cylinder${inconsistent.length > 1 ? 's' : ''} ${inconsistent.join(', ')} varied by more than ${spreadLimit} points from cycle to cycle; look at the trace for misfiring probes or an unsteady crank.`));
  }
  if (summary.spreadPercent > spreadLimit && !thin) {
    warnings.push(warning('SPREAD_HIGH', `The strongest and weakest cylinders differ by ${summary.spreadPercent} points, more than the ${spreadLimit}-point spread limit.`));
  }
  return {
    method,
    crankingRpm: rpm,
    identity: run.identity,
    window: { startS: round3(run.window.startS), endS: round3(run.window.endS) },
    cylinders: summary.cylinders,
    events: summary.events.map((e) => ({ ...e, timeS: round3(e.timeS) })),
    rawUnit: isCurrent ? 'A' : 'rpm',
    spreadPercent: summary.spreadPercent,
    fitQuality: Math.round(fit.r2 * 1000) / 1000,
    warnings,
  };
}

function round3(v: number): number {
  return Math.round(v * 1000) / 1000;
}
