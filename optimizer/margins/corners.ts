// Worst-case corner search and the margin result shape. Each check is a first-order formula that
// is monotonic in the supply and each resistor, so its extremes lie on the corners: supply at
// −tol/nominal/+tol and every resistor role at ±tol; the worst value over them is reported.
import type { MapFamily } from '../logic/family-parts';
import type { MarginSettings } from './defaults';

export type MarginStatus = 'pass' | 'warn' | 'fail';

export interface Corner {
  /** Supply voltage used, V. */
  supply: number;
  /** Resistor deviations used, e.g. "R_C +5 %, R_B −5 %" (or "nominal"). */
  resistors: string;
  /** β used (β_min), when the check depends on it. */
  beta?: number;
}

export interface MarginResult {
  name: string;
  value: number;
  limit: number;
  unit: string;
  status: MarginStatus;
  corner: Corner;
  note: string;
  /** What the check was computed from, so a what-if can recompute it with other settings. */
  inputs?: MarginInputs;
}

/**
 * The inputs of each margin check, tagged by check. Stored with the result (JSON) so a stored
 * proposal's margins can be recomputed with other supply, pull-up, β_min, clock or load figures.
 */
export type MarginInputs =
  | { check: 'sink-current'; vcc: number; pullUps: number[]; limit?: number }
  | { check: 'forced-beta'; vcc: number; pullUps: number[]; baseResistor: number; driveVolts?: number; betaMin: number }
  | { check: 'loaded-high-level'; vcc: number; rc: number; rb: number; loads: number; receiver: MapFamily }
  | { check: 'load-base-current'; vcc: number; rc: number; rb: number; loads: number; loadPullUp: number; betaMin: number }
  | { check: 'stacked-low-level'; vcc: number; stack: number; receiver: MapFamily }
  | { check: 'diode-steered-low-level'; vcc: number; receiver: MapFamily; stack?: number; diodes?: number }
  | { check: 'rise-time'; vcc: number; pullUp: number; capacitance: number; clockPeriod: number; loads?: number; lineCapacitance?: number }
  | { check: 'static-power'; vcc: number; pullUps: number[] }
  | { check: 'fan-out'; loads: number; family: MapFamily }
  | { check: 'pull-up-min'; vcc: number; pullUp: number; volMax: number; iolMax: number; iilPerLoad: number; loads: number }
  | { check: 'pull-up-max'; vcc: number; pullUp: number; family: MapFamily; leakPerDriver: number; drivers: number; iihPerLoad: number; loads: number };

export type Sign = -1 | 0 | 1;

export interface CornerPoint<R extends string> {
  supply: number;
  /** Resistor multiplier per role (1 ± tolerance). */
  r: Record<R, number>;
  signs: Record<R, Sign>;
  supplySign: Sign;
}

/**
 * Corner tables by content (supply, tolerances, roles): every check asks for the same few tables
 * over and over while a scan sizes shared drivers, so each is built once. Frozen, since callers
 * share them; bounded so a long-running server cannot grow it without end.
 */
const cornerTables = new Map<string, readonly CornerPoint<string>[]>();
const CORNER_TABLES_MAX = 4096;

/** Every corner for a nominal supply and resistor roles (a shared, frozen table). */
export function corners<R extends string>(vcc: number, roles: readonly R[], s: MarginSettings): CornerPoint<R>[] {
  const key = `${vcc}|${s.supplyTolerance}|${s.resistorTolerance}|${roles.join('|')}`;
  const hit = cornerTables.get(key);
  if (hit) return hit as CornerPoint<R>[];
  const out: CornerPoint<R>[] = [];
  for (const supplySign of [-1, 0, 1] as Sign[]) {
    for (let mask = 0; mask < 2 ** roles.length; mask++) {
      const r = {} as Record<R, number>;
      const signs = {} as Record<R, Sign>;
      roles.forEach((role, i) => {
        const sign: Sign = (mask >> i) & 1 ? 1 : -1;
        signs[role] = sign;
        r[role] = 1 + sign * s.resistorTolerance;
      });
      out.push(Object.freeze({ supply: vcc * (1 + supplySign * s.supplyTolerance), r: Object.freeze(r), signs: Object.freeze(signs), supplySign }));
    }
  }
  if (cornerTables.size >= CORNER_TABLES_MAX) cornerTables.clear();
  cornerTables.set(key, Object.freeze(out) as readonly CornerPoint<string>[]);
  return out;
}

function pct(sign: Sign, tol: number): string {
  if (sign === 0) return 'nominal';
  return `${sign > 0 ? '+' : '−'}${Math.round(tol * 100)} %`;
}

export function describeCorner<R extends string>(p: CornerPoint<R>, s: MarginSettings, beta?: number): Corner {
  const roles = Object.keys(p.signs) as R[];
  return {
    supply: round(p.supply),
    resistors: roles.length === 0 ? 'nominal' : roles.map((role) => `${role} ${pct(p.signs[role], s.resistorTolerance)}`).join(', '),
    ...(beta !== undefined ? { beta: round(beta) } : {}),
  };
}

/** The corner where `value` is worst: largest when `worse` is 'high', smallest when 'low'. */
export function worstCorner<R extends string>(
  points: CornerPoint<R>[],
  value: (p: CornerPoint<R>) => number,
  worse: 'high' | 'low',
): { point: CornerPoint<R>; value: number } {
  let best = points[0];
  let bestValue = value(best);
  for (let i = 1; i < points.length; i++) {
    const p = points[i];
    const v = value(p);
    if (worse === 'high' ? v > bestValue : v < bestValue) {
      best = p;
      bestValue = v;
    }
  }
  return { point: best, value: bestValue };
}

/** Status of a value that must stay at or below `limit` (warn within the band below it). */
export function statusAtMost(value: number, limit: number, s: MarginSettings): MarginStatus {
  if (value > limit) return 'fail';
  return value > limit * (1 - s.warnBand) ? 'warn' : 'pass';
}

/** Status of a value that must stay at or above `limit` (warn within the band above it). */
export function statusAtLeast(value: number, limit: number, s: MarginSettings): MarginStatus {
  if (value < limit) return 'fail';
  return value < limit * (1 + s.warnBand) ? 'warn' : 'pass';
}

/** Math.min / Math.max over a list of any length (spreading a long list overflows the call stack). */
export function minOf(xs: readonly number[]): number {
  let m = Infinity;
  for (const x of xs) m = Math.min(m, x);
  return m;
}

export function maxOf(xs: readonly number[]): number {
  let m = -Infinity;
  for (const x of xs) m = Math.max(m, x);
  return m;
}

export function round(x: number, digits = 4): number {
  if (x === 0 || !Number.isFinite(x)) return x;
  const scale = 10 ** (digits - 1 - Math.floor(Math.log10(Math.abs(x))));
  return Math.round(x * scale) / scale;
}

export function formatCorner(c: Corner): string {
  return `V_CC ${c.supply} V, ${c.resistors}${c.beta !== undefined ? `, β ${c.beta}` : ''}`;
}

/** The worst of several results: fail over warn over pass (first one on ties). */
export function worstOf(results: MarginResult[]): MarginResult | undefined {
  const rank: Record<MarginStatus, number> = { pass: 0, warn: 1, fail: 2 };
  return results.reduce<MarginResult | undefined>((w, r) => (!w || rank[r.status] > rank[w.status] ? r : w), undefined);
}
