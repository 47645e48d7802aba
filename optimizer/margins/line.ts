// Margin checks of a pulled-up line as a whole: rise time against the clock period, static power
// of pull-ups held low, and fan-out. Rise time of one RC: t_r(10–90 %) = ln 9 · RC ≈ 2.2 RC
// (Elmore 1948; Rubinstein, Penfield, Horowitz 1983); power (V_CC − V_CE(sat))²/R is a circuit law.
import type { MapFamily } from '../logic/family-parts';
import { corners, describeCorner, type MarginResult, minOf, round, statusAtMost, worstCorner } from './corners';
import type { MarginSettings } from './defaults';

export const RISE_FACTOR = Math.log(9);

/** Capacitance of a line with N loads, from the settings when the design gives no figure. */
export function lineCapacitance(loads: number, s: MarginSettings, given?: number): number {
  return given ?? s.lineCapacitance + loads * s.loadCapacitance;
}

export function riseTime(
  input: { vcc: number; pullUp: number; capacitance: number; clockPeriod: number; loads?: number; lineCapacitance?: number },
  s: MarginSettings,
): MarginResult {
  const points = corners(input.vcc, ['R_pull-up'] as const, s);
  const w = worstCorner(points, (p) => RISE_FACTOR * input.pullUp * p.r['R_pull-up'] * input.capacitance, 'high');
  const limit = s.riseFraction * input.clockPeriod;
  return {
    name: 'rise time',
    value: w.value,
    limit,
    unit: 's',
    status: statusAtMost(w.value, limit, s),
    corner: describeCorner(w.point, s),
    note: `t_r ≈ 2.2·R·C with C = ${round(input.capacitance * 1e12)} pF, against ${Math.round(s.riseFraction * 100)} % of the ${round(input.clockPeriod * 1e9)} ns clock period`,
    inputs: { check: 'rise-time', ...input },
  };
}

/** Worst static power in one pull-up held low; warned above the derated rating, failed above it. */
export function staticPower(input: { vcc: number; pullUps: number[] }, s: MarginSettings): MarginResult {
  const points = corners(input.vcc, ['R_pull-up'] as const, s);
  const smallest = minOf(input.pullUps);
  const at = (p: (typeof points)[number]) => (p.supply - s.vceSat) ** 2 / (smallest * p.r['R_pull-up']);
  const w = worstCorner(points, at, 'high');
  const total = input.pullUps.reduce((sum, r) => sum + (w.point.supply - s.vceSat) ** 2 / (r * w.point.r['R_pull-up']), 0);
  const limit = s.resistorRatingW;
  const status = w.value > limit ? 'fail' : w.value > limit * s.powerDerating ? 'warn' : 'pass';
  return {
    name: 'static power',
    value: w.value,
    limit,
    unit: 'W',
    status,
    corner: describeCorner(w.point, s),
    note: `(V_CC − V_CE(sat))²/R in the smallest pull-up held low (circuit law); ${round(total)} W for all ${input.pullUps.length} held low; rating derated to ${Math.round(s.powerDerating * 100)} %`,
    inputs: { check: 'static-power', vcc: input.vcc, pullUps: [...input.pullUps] },
  };
}

export function fanOut(input: { loads: number; family: MapFamily }, s: MarginSettings): MarginResult {
  const limit = s.fanOut[input.family];
  return {
    name: 'fan-out',
    value: input.loads,
    limit,
    unit: 'loads',
    status: input.loads > limit ? 'fail' : input.loads === limit ? 'warn' : 'pass',
    corner: { supply: 0, resistors: 'nominal' },
    note:
      input.family === 'rtl' || input.family === 'dtl'
        ? `typical ${input.family.toUpperCase()} fan-out ${limit} (Mano, Digital Design, from memory)`
        : `family default fan-out ${limit} (common practice; editable)`,
    inputs: { check: 'fan-out', ...input },
  };
}
