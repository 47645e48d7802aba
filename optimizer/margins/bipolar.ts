// First-order bipolar margin checks for shared drivers, switches and control lines (DESIGN.md §4):
// sink current, forced β, loaded high level, load base currents, stacked and diode-steered low
// levels. Formulas are circuit laws (REFERENCES.md); limits are common practice unless named.
import type { MapFamily } from '../logic/family-parts';
import { corners, describeCorner, type MarginInputs, type MarginResult, type MarginStatus, round, statusAtLeast, statusAtMost, worstCorner } from './corners';
import { type MarginSettings, thresholdsFor } from './defaults';

/** I = Σ (V_CC − V_CE(sat)) / R_pull-up,i — the current one pull-down sinks from N pulled-up lines. */
export function sinkCurrentAt(vcc: number, pullUps: number[], s: MarginSettings, rScale = 1): number {
  return pullUps.reduce((sum, r) => sum + (vcc - s.vceSat) / (r * rScale), 0);
}

/** V_OH = V_BE + (V_CC − V_BE)·(R_B/N)/(R_C + R_B/N): a pulled-up line driving N bases. */
export function loadedHighLevelAt(vcc: number, rc: number, rb: number, loads: number, s: MarginSettings): number {
  if (loads === 0) return vcc;
  const rbN = rb / loads;
  return s.vbe + ((vcc - s.vbe) * rbN) / (rc + rbN);
}

export function sinkCurrent(
  input: { vcc: number; pullUps: number[]; limit?: number },
  s: MarginSettings,
): MarginResult {
  const points = corners(input.vcc, ['R_pull-up'] as const, s);
  const w = worstCorner(points, (p) => sinkCurrentAt(p.supply, input.pullUps, s, p.r['R_pull-up']), 'high');
  const limit = input.limit ?? s.maxCollectorCurrent;
  return {
    name: 'sink current',
    value: w.value,
    limit,
    unit: 'A',
    status: statusAtMost(w.value, limit, s),
    corner: describeCorner(w.point, s),
    note: `Σ (V_CC − V_CE(sat)) / R over ${input.pullUps.length} pulled-up line(s); limit from the settings — check the transistor's data sheet`,
    inputs: { check: 'sink-current', ...input, pullUps: [...input.pullUps] },
  };
}

function forcedBetaStatus(forced: number, betaMin: number, s: MarginSettings): MarginStatus {
  if (forced > betaMin) return 'fail';
  return forced > s.forcedBetaTarget ? 'warn' : 'pass';
}

/**
 * Forced β = I_C / I_B of a driver sinking `pullUps`, its base fed through `baseResistor` from a
 * drive level (default the supply) that moves with the supply. Hard saturation wants ≤ 10
 * (common practice); above β_min the transistor leaves saturation (fail).
 */
export function forcedBeta(
  input: { vcc: number; pullUps: number[]; baseResistor: number; driveVolts?: number; betaMin: number },
  s: MarginSettings,
): MarginResult {
  return {
    ...forcedBetaWorst(input, (supply, rPullUp) => sinkCurrentAt(supply, input.pullUps, s, rPullUp), s),
    note: `I_C/I_B ≤ ${s.forcedBetaTarget} is hard saturation (common practice); above β_min = ${round(input.betaMin)} the driver leaves saturation`,
    inputs: { check: 'forced-beta', ...input, pullUps: [...input.pullUps] },
  };
}

/**
 * The worst-corner forced β of a transistor whose collector current at a corner is
 * `collectorCurrentAt(supply, pull-up factor)`, its base fed through `baseResistor` from a drive
 * level (default the supply) that moves with the supply. Shared by every driver-sizing check.
 */
export function forcedBetaWorst(
  input: { vcc: number; baseResistor: number; driveVolts?: number; betaMin: number },
  collectorCurrentAt: (supply: number, rPullUp: number) => number,
  s: MarginSettings,
): Omit<MarginResult, 'note'> {
  const drive = input.driveVolts ?? input.vcc;
  const points = corners(input.vcc, ['R_pull-up', 'R_B'] as const, s);
  const at = (p: (typeof points)[number]) => {
    const ic = collectorCurrentAt(p.supply, p.r['R_pull-up']);
    const ib = Math.max(0, (drive * (p.supply / input.vcc) - s.vbe) / (input.baseResistor * p.r.R_B));
    return ib === 0 ? Infinity : ic / ib;
  };
  const w = worstCorner(points, at, 'high');
  return {
    name: 'forced β',
    value: w.value,
    limit: input.betaMin,
    unit: '',
    status: forcedBetaStatus(w.value, input.betaMin, s),
    corner: describeCorner(w.point, s, input.betaMin),
  };
}

export function loadedHighLevel(
  input: { vcc: number; rc: number; rb: number; loads: number; receiver: MapFamily },
  s: MarginSettings,
): MarginResult {
  const points = corners(input.vcc, ['R_C', 'R_B'] as const, s);
  const w = worstCorner(points, (p) => loadedHighLevelAt(p.supply, input.rc * p.r.R_C, input.rb * p.r.R_B, input.loads, s), 'low');
  const limit = thresholdsFor(input.receiver, w.point.supply, s).vih;
  return {
    name: 'loaded high level',
    value: w.value,
    limit,
    unit: 'V',
    status: statusAtLeast(w.value, limit, s),
    corner: describeCorner(w.point, s),
    note: `V_OH = V_BE + (V_CC − V_BE)·(R_B/N)/(R_C + R_B/N) with N = ${input.loads} (circuit law), against the receiver's V_IH`,
    inputs: { check: 'loaded-high-level', ...input },
  };
}

/**
 * Base current each of N loads gets from a pulled-up line, against what it needs to saturate
 * its own collector load: I_B ≥ I_C,load / β_min (fail below), ≥ I_C,load / 10 (pass).
 */
export function loadBaseCurrent(
  input: { vcc: number; rc: number; rb: number; loads: number; loadPullUp: number; betaMin: number },
  s: MarginSettings,
): MarginResult {
  const points = corners(input.vcc, ['R_C', 'R_B', 'R_load'] as const, s);
  const at = (p: (typeof points)[number]) => {
    const voh = loadedHighLevelAt(p.supply, input.rc * p.r.R_C, input.rb * p.r.R_B, input.loads, s);
    const ib = Math.max(0, (voh - s.vbe) / (input.rb * p.r.R_B));
    const ic = (p.supply - s.vceSat) / (input.loadPullUp * p.r.R_load);
    return { ib, ic, forced: ib === 0 ? Infinity : ic / ib };
  };
  const w = worstCorner(points, (p) => at(p).forced, 'high');
  const { ib, ic } = at(w.point);
  return {
    name: 'load base current',
    value: ib,
    limit: ic / input.betaMin,
    unit: 'A',
    status: forcedBetaStatus(w.value, input.betaMin, s),
    corner: describeCorner(w.point, s, input.betaMin),
    note: `each of ${input.loads} bases gets (V_OH − V_BE)/R_B; it needs I_C/β_min to saturate and I_C/${s.forcedBetaTarget} for hard saturation (forced β ${round(w.value)})`,
    inputs: { check: 'load-base-current', ...input },
  };
}

function lowLevel(name: string, value: number, vcc: number, receiver: MapFamily, s: MarginSettings, note: string, inputs: MarginInputs): MarginResult {
  const limit = thresholdsFor(receiver, vcc * (1 - s.supplyTolerance), s).vil;
  return {
    name,
    value,
    limit,
    unit: 'V',
    status: statusAtMost(value, limit, s),
    corner: { supply: round(vcc * (1 - s.supplyTolerance)), resistors: 'nominal' },
    note,
    inputs,
  };
}

/** Low level of `stack` saturated transistors in series: stack · V_CE(sat),max against V_IL. */
export function stackedLowLevel(input: { vcc: number; stack: number; receiver: MapFamily }, s: MarginSettings): MarginResult {
  return lowLevel(
    'stacked low level',
    input.stack * s.vceSatMax,
    input.vcc,
    input.receiver,
    s,
    `${input.stack} saturated transistor(s) in series at V_CE(sat) ${s.vceSatMax} V each, against the receiver's V_IL`,
    { check: 'stacked-low-level', ...input },
  );
}

/** Low level through steering diodes: stack · V_CE(sat),max + diodes · V_D,max against V_IL. */
export function diodeSteeredLowLevel(
  input: { vcc: number; receiver: MapFamily; stack?: number; diodes?: number },
  s: MarginSettings,
): MarginResult {
  const stack = input.stack ?? 1;
  const diodes = input.diodes ?? 1;
  return lowLevel(
    'diode-steered low level',
    stack * s.vceSatMax + diodes * s.vDiodeMax,
    input.vcc,
    input.receiver,
    s,
    `V_CE(sat) + V_D ≈ 0.8–0.9 V sits above a plain RTL input's turn-on (common practice; confirm with a circuit simulator)`,
    { check: 'diode-steered-low-level', ...input },
  );
}
