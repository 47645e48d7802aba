// Recomputes one stored margin result from the inputs stored with it, with the learner's settings
// replacing supply, pull-up, β_min, clock period and load count where the check uses them. The
// formulas are the scan's own (optimizer/margins), so equal settings give equal numbers.
import { diodeSteeredLowLevel, forcedBeta, loadBaseCurrent, loadedHighLevel, sinkCurrent, stackedLowLevel } from '../margins/bipolar';
import { type MarginInputs, type MarginResult, round, statusAtLeast, statusAtMost } from '../margins/corners';
import { type MarginSettings, thresholdsFor } from '../margins/defaults';
import { fanOut, lineCapacitance, riseTime, staticPower } from '../margins/line';
import type { RecomputedMargin, WhatIfSettings } from './types';

/**
 * Pulled-up lines a shared part sinks, after the settings: each at the pull-up setting (else as
 * stored); with a load count, that many lines, each at the smallest stored value (the worst case).
 */
function lines(stored: number[], w: WhatIfSettings): number[] {
  const n = w.loads ?? stored.length;
  const each = w.pullUpOhms ?? Math.min(...stored);
  if (w.pullUpOhms === undefined && w.loads === undefined) return [...stored];
  return Array.from({ length: n }, () => each);
}

/** The check's inputs with the settings applied. */
export function applySettings(i: MarginInputs, w: WhatIfSettings): MarginInputs {
  const vcc = 'vcc' in i ? (w.supplyVolts ?? i.vcc) : undefined;
  switch (i.check) {
    case 'sink-current':
    case 'static-power':
      return { ...i, vcc: vcc!, pullUps: lines(i.pullUps, w) };
    case 'forced-beta':
      // The base drive follows the supply when it came from the supply.
      return { ...i, vcc: vcc!, pullUps: lines(i.pullUps, w), betaMin: w.betaMin ?? i.betaMin };
    case 'loaded-high-level':
      return { ...i, vcc: vcc!, rc: w.pullUpOhms ?? i.rc, loads: w.loads ?? i.loads };
    case 'load-base-current':
      return { ...i, vcc: vcc!, rc: w.pullUpOhms ?? i.rc, loads: w.loads ?? i.loads, betaMin: w.betaMin ?? i.betaMin };
    case 'stacked-low-level':
    case 'diode-steered-low-level':
      return { ...i, vcc: vcc! };
    case 'rise-time':
      return { ...i, vcc: vcc!, pullUp: w.pullUpOhms ?? i.pullUp, clockPeriod: w.clockPeriod ?? i.clockPeriod, loads: w.loads ?? i.loads };
    case 'fan-out':
      return { ...i, loads: w.loads ?? i.loads };
    case 'pull-up-min':
    case 'pull-up-max':
      return { ...i, vcc: vcc!, pullUp: w.pullUpOhms ?? i.pullUp, loads: w.loads ?? i.loads };
  }
}

/** Evaluates a check from its inputs (the same functions and limits the scan used). */
export function evaluateCheck(i: MarginInputs, s: MarginSettings): MarginResult {
  switch (i.check) {
    case 'sink-current':
      return sinkCurrent({ vcc: i.vcc, pullUps: i.pullUps, ...(i.limit !== undefined ? { limit: i.limit } : {}) }, s);
    case 'forced-beta': {
      const { check: _c, ...input } = i;
      return forcedBeta(input, s);
    }
    case 'loaded-high-level': {
      const { check: _c, ...input } = i;
      return loadedHighLevel(input, s);
    }
    case 'load-base-current': {
      const { check: _c, ...input } = i;
      return loadBaseCurrent(input, s);
    }
    case 'stacked-low-level': {
      const { check: _c, ...input } = i;
      return stackedLowLevel(input, s);
    }
    case 'diode-steered-low-level': {
      const { check: _c, ...input } = i;
      return diodeSteeredLowLevel(input, s);
    }
    case 'rise-time': {
      // A line whose C came from its load count gets a new C when the count moves.
      const c = i.loads !== undefined ? lineCapacitance(i.loads, s, i.lineCapacitance) : i.capacitance;
      const { check: _c, ...input } = i;
      return riseTime({ ...input, capacitance: c }, s);
    }
    case 'static-power':
      return staticPower({ vcc: i.vcc, pullUps: i.pullUps }, s);
    case 'fan-out':
      return fanOut({ loads: i.loads, family: i.family }, s);
    case 'pull-up-min':
      return pullUpMin(i, s);
    case 'pull-up-max':
      return pullUpMax(i, s);
  }
}

/** R ≥ (V_CC,max − V_OL,max)/(I_OL,max − Σ I_IL), as tristate-slim sizes its pull-up (common practice). */
function pullUpMin(i: Extract<MarginInputs, { check: 'pull-up-min' }>, s: MarginSettings): MarginResult {
  const vccMax = i.vcc * (1 + s.supplyTolerance);
  const sink = i.iolMax - i.loads * i.iilPerLoad;
  const limit = sink > 0 ? (vccMax - i.volMax) / sink : Infinity;
  const value = i.pullUp * (1 - s.resistorTolerance);
  return {
    name: 'pull-up against sink limit',
    value,
    limit,
    unit: 'Ω',
    status: statusAtLeast(value, limit, s),
    corner: { supply: round(vccMax), resistors: `R_pull-up −${Math.round(s.resistorTolerance * 100)} %` },
    note: `R ≥ (V_CC,max − V_OL,max)/(I_OL,max − Σ I_IL) with V_OL,max ${i.volMax} V, I_OL,max ${round(i.iolMax * 1e3)} mA, ${i.loads} load(s) (common practice; use the driver's data sheet)`,
    inputs: i,
  };
}

/** R ≤ (V_CC,min − V_IH,min)/(Σ I_leak + Σ I_IH) (common practice). */
function pullUpMax(i: Extract<MarginInputs, { check: 'pull-up-max' }>, s: MarginSettings): MarginResult {
  const vccMin = i.vcc * (1 - s.supplyTolerance);
  const vih = thresholdsFor(i.family, vccMin, s).vih;
  const leak = i.drivers * i.leakPerDriver + i.loads * i.iihPerLoad;
  const limit = leak > 0 ? (vccMin - vih) / leak : Infinity;
  const value = i.pullUp * (1 + s.resistorTolerance);
  return {
    name: 'pull-up against high level',
    value,
    limit,
    unit: 'Ω',
    status: statusAtMost(value, limit, s),
    corner: { supply: round(vccMin), resistors: `R_pull-up +${Math.round(s.resistorTolerance * 100)} %` },
    note: `R ≤ (V_CC,min − V_IH,min)/(Σ I_leak + Σ I_IH) with V_IH ${round(vih)} V, ${i.drivers} driver(s), ${i.loads} load(s) (common practice)`,
    inputs: i,
  };
}

/** The stored result recomputed under the settings; a result without inputs is kept as scanned. */
export function recomputeMargin(m: MarginResult, w: WhatIfSettings, s: MarginSettings): RecomputedMargin {
  if (!m.inputs) return { ...m, recomputed: false };
  return { ...evaluateCheck(applySettings(m.inputs, w), s), recomputed: true };
}
