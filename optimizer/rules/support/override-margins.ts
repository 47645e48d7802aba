// Margin checks of one override transistor pulling several lines low through steering diodes:
// the current it sinks (each line's pull-up and each diode-input receiver, less the diode drop),
// its forced β, and the lines' diode-steered low level against their receivers' V_IL.
import { diodeSteeredLowLevel, forcedBetaWorst } from '../../margins/bipolar';
import { corners, describeCorner, round, statusAtMost, worstCorner, type MarginResult } from '../../margins/corners';
import type { MarginSettings } from '../../margins/defaults';
import type { MapFamily } from '../../logic/family-parts';

export interface SteeredLoad {
  /** Pull-up resistors of the steered lines, Ω. */
  linePullUps: number[];
  /** Pull-ups of diode-input (DTL) receivers on the lines, Ω: they feed the line while it is low. */
  inputPullUps: number[];
}

/**
 * Current into the common override transistor: every line sits at V_CE(sat) + V_D, so each line
 * pull-up carries (V_CC − V_CE(sat) − V_D)/R and each DTL input (V_CC − V_CE(sat) − 2·V_D)/R_P
 * (circuit law; its input diode adds one more drop).
 */
export function steeredCurrentAt(vcc: number, load: SteeredLoad, s: MarginSettings, rScale = 1): number {
  const line = load.linePullUps.reduce((sum, r) => sum + Math.max(0, vcc - s.vceSat - s.vDiode) / (r * rScale), 0);
  const input = load.inputPullUps.reduce((sum, r) => sum + Math.max(0, vcc - s.vceSat - 2 * s.vDiode) / (r * rScale), 0);
  return line + input;
}

export function steeredSinkCurrent(input: { vcc: number; load: SteeredLoad; limit?: number }, s: MarginSettings): MarginResult {
  const points = corners(input.vcc, ['R_pull-up'] as const, s);
  const w = worstCorner(points, (p) => steeredCurrentAt(p.supply, input.load, s, p.r['R_pull-up']), 'high');
  const limit = input.limit ?? s.maxCollectorCurrent;
  const n = input.load.linePullUps.length;
  return {
    name: 'sink current',
    value: w.value,
    limit,
    unit: 'A',
    status: statusAtMost(w.value, limit, s),
    corner: describeCorner(w.point, s),
    note: `Σ (V_CC − V_CE(sat) − V_D)/R over ${n} steered line(s)${input.load.inputPullUps.length ? ` and ${input.load.inputPullUps.length} diode input(s)` : ''} (circuit law); limit from the settings — check the transistor's data sheet`,
  };
}

/** Forced β = I_C/I_B of the common override transistor, base fed through `baseResistor`. */
export function steeredForcedBeta(
  input: { vcc: number; load: SteeredLoad; baseResistor: number; driveVolts?: number; betaMin: number },
  s: MarginSettings,
): MarginResult {
  return {
    ...forcedBetaWorst(input, (supply, rPullUp) => steeredCurrentAt(supply, input.load, s, rPullUp), s),
    note: `I_C/I_B ≤ ${s.forcedBetaTarget} is hard saturation (common practice); above β_min = ${round(input.betaMin)} the override leaves saturation and the lines' low level rises`,
  };
}

/**
 * Diode-steered low level against the receivers that read the lines: the lowest V_IL among
 * them decides (a plain RTL input turns on near 0.5 V; a DTL input with two level-shift diodes
 * only near V_D + V_BE ≈ 1.4 V — common practice).
 */
export function steeredLowLevel(vcc: number, receivers: readonly MapFamily[], s: MarginSettings): MarginResult {
  const results = [...new Set(receivers)].map((r) => ({ r, m: diodeSteeredLowLevel({ vcc, receiver: r }, s) }));
  const worst = results.reduce((w, x) => (x.m.limit < w.m.limit ? x : w));
  return { ...worst.m, note: `${worst.m.note}; receiver ${worst.r.toUpperCase()} (V_IL ${worst.m.limit} V)` };
}
