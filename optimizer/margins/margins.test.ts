// Proves the margin formulas give the circuit-law values and pick the worst corner, and that the
// statuses follow the stated limits.
import { describe, expect, it } from 'vitest';
import { diodeSteeredLowLevel, forcedBeta, loadBaseCurrent, loadedHighLevel, loadedHighLevelAt, sinkCurrent, stackedLowLevel } from './bipolar';
import { corners, formatCorner, maxOf, minOf, worstOf } from './corners';
import { betaMinOf, DEFAULT_MARGIN_SETTINGS as S, marginSettings } from './defaults';
import { fanOut, riseTime, staticPower } from './line';

describe('sink current', () => {
  it('sums (V_CC − V_CE(sat))/R over the lines at high supply and low resistors', () => {
    // Circuit law: 4 × (5.25 − 0.2) / (1k × 0.95) = 21.26 mA.
    const r = sinkCurrent({ vcc: 5, pullUps: [1000, 1000, 1000, 1000] }, S);
    expect(r.value).toBeCloseTo((4 * 5.05) / 950, 6);
    expect(r.corner.supply).toBe(5.25);
    expect(r.corner.resistors).toBe('R_pull-up −5 %');
    expect(r.status).toBe('pass');
  });
  it('fails past the collector-current limit', () => {
    expect(sinkCurrent({ vcc: 5, pullUps: Array(30).fill(1000) }, S).status).toBe('fail');
  });
});

describe('forced β', () => {
  it('passes at ≤ 10, warns up to β_min, fails beyond (common practice)', () => {
    // I_C = 4.8 V / 1k ≈ 4.8 mA; R_B = 4.7k from 5 V gives I_B ≈ 0.91 mA: forced β ≈ 5.3.
    expect(forcedBeta({ vcc: 5, pullUps: [1000], baseResistor: 4700, betaMin: 50 }, S).status).toBe('pass');
    // Eight lines on one driver through the same base resistor: forced β ≈ 47 → warn below β_min 50... and fail at β_min 30.
    const eight = forcedBeta({ vcc: 5, pullUps: Array(8).fill(1000), baseResistor: 4700, betaMin: 100 }, S);
    expect(eight.status).toBe('warn');
    expect(forcedBeta({ vcc: 5, pullUps: Array(8).fill(1000), baseResistor: 4700, betaMin: 30 }, S).status).toBe('fail');
    expect(eight.corner.resistors).toBe('R_pull-up −5 %, R_B +5 %');
  });
});

describe('loaded high level', () => {
  it('matches V_OH = V_BE + (V_CC − V_BE)(R_B/N)/(R_C + R_B/N) at nominal values', () => {
    // REFERENCES.md circuit law: 3.6 V RTL, R_C 640 Ω, R_B 450 Ω, N = 5 → 0.7 + 2.9·90/730 = 1.0575 V.
    expect(loadedHighLevelAt(3.6, 640, 450, 5, S)).toBeCloseTo(0.7 + (2.9 * 90) / 730, 9);
  });
  it('reports the low-supply, high-R_C, low-R_B corner and fails below V_IH', () => {
    const r = loadedHighLevel({ vcc: 3.6, rc: 640, rb: 450, loads: 5, receiver: 'rtl' }, S);
    expect(r.corner.supply).toBe(3.42);
    expect(r.corner.resistors).toBe('R_C +5 %, R_B −5 %');
    expect(r.value).toBeCloseTo(0.7 + ((3.42 - 0.7) * (427.5 / 5)) / (672 + 427.5 / 5), 3);
    expect(r.status).toBe('warn'); // ≈ 1.007 V: above V_IH 1.0 V but within the 10 % band
    const eight = loadedHighLevel({ vcc: 3.6, rc: 640, rb: 450, loads: 8, receiver: 'rtl' }, S);
    expect(eight.value).toBeLessThan(1.0);
    expect(eight.status).toBe('fail');
  });
  it('passes with few loads', () => {
    expect(loadedHighLevel({ vcc: 5, rc: 1000, rb: 10000, loads: 2, receiver: 'rtl' }, S).status).toBe('pass');
  });
});

describe('load base current', () => {
  it('fails when the line cannot saturate its loads', () => {
    const weak = loadBaseCurrent({ vcc: 5, rc: 10000, rb: 10000, loads: 8, loadPullUp: 470, betaMin: 30 }, S);
    expect(weak.status).toBe('fail');
    expect(weak.value).toBeLessThan(weak.limit);
    const strong = loadBaseCurrent({ vcc: 5, rc: 470, rb: 4700, loads: 2, loadPullUp: 4700, betaMin: 30 }, S);
    expect(strong.status).toBe('pass');
  });
});

describe('low levels', () => {
  it('two stacked saturated transistors stay below an RTL input threshold; a steering diode does not', () => {
    // Common practice: V_CE(sat) + V_D ≈ 0.8–0.9 V is above a plain RTL input's turn-on.
    expect(stackedLowLevel({ vcc: 5, stack: 1, receiver: 'rtl' }, S).status).toBe('pass');
    const steered = diodeSteeredLowLevel({ vcc: 5, receiver: 'rtl' }, S);
    expect(steered.value).toBeCloseTo(1.05, 9);
    expect(steered.status).toBe('fail');
    expect(diodeSteeredLowLevel({ vcc: 5, receiver: 'dtl' }, S).status).toBe('pass');
  });
});

describe('rise time, static power, fan-out', () => {
  it('t_r = ln 9 · R · C at the high-resistor corner', () => {
    // Elmore 1948 / Rubinstein, Penfield, Horowitz 1983: 10–90 % of one RC = ln 9 · RC ≈ 2.2 RC.
    const r = riseTime({ vcc: 5, pullUp: 1000, capacitance: 100e-12, clockPeriod: 2e-6 }, S);
    expect(r.value).toBeCloseTo(Math.log(9) * 1050 * 100e-12, 12);
    expect(r.status).toBe('pass');
    expect(riseTime({ vcc: 5, pullUp: 10000, capacitance: 100e-12, clockPeriod: 10e-6 }, S).status).toBe('warn');
    expect(riseTime({ vcc: 5, pullUp: 10000, capacitance: 100e-12, clockPeriod: 5e-6 }, S).status).toBe('fail');
  });
  it('static power (V_CC − V_CE(sat))²/R with high supply and low resistor', () => {
    // Circuit law: (5.25 − 0.2)² / 950 = 26.8 mW.
    const r = staticPower({ vcc: 5, pullUps: [1000, 2200] }, S);
    expect(r.value).toBeCloseTo(5.05 ** 2 / 950, 5);
    expect(r.status).toBe('pass');
    expect(staticPower({ vcc: 5, pullUps: [180] }, S).status).toBe('warn');
    expect(staticPower({ vcc: 12, pullUps: [100] }, S).status).toBe('fail');
  });
  it('fan-out limits RTL 5, DTL 8', () => {
    // Mano, Digital Design (from memory): typical fan-out RTL 5, DTL 8.
    expect(fanOut({ loads: 5, family: 'rtl' }, S).status).toBe('warn');
    expect(fanOut({ loads: 6, family: 'rtl' }, S).status).toBe('fail');
    expect(fanOut({ loads: 8, family: 'dtl' }, S).limit).toBe(8);
  });
});

describe('settings and helpers', () => {
  it('derives β_min from a model BF with the derating, else the family default', () => {
    expect(betaMinOf({ name: 'QN', type: 'npn', params: { BF: 100 } }, S)).toEqual({ beta: 50, from: 'model' });
    expect(betaMinOf(undefined, S)).toEqual({ beta: 30, from: 'default' });
  });
  it('merges overrides and reports the worst result', () => {
    const s = marginSettings({ fanOut: { ...S.fanOut, rtl: 3 } });
    expect(s.fanOut.rtl).toBe(3);
    expect(s.fanOut.dtl).toBe(8);
    const worst = worstOf([fanOut({ loads: 2, family: 'rtl' }, s), fanOut({ loads: 4, family: 'rtl' }, s)]);
    expect(worst?.status).toBe('fail');
    expect(formatCorner({ supply: 4.75, resistors: 'R_C +5 %', beta: 50 })).toBe('V_CC 4.75 V, R_C +5 %, β 50');
  });
});

describe('corner tables', () => {
  it('lists supply −/0/+ tolerance by every resistor sign, built once per content and read-only', () => {
    const t = corners(5, ['R_C', 'R_B'] as const, S);
    expect(t).toHaveLength(12);
    expect(t.map((p) => p.supply)).toEqual([4.75, 4.75, 4.75, 4.75, 5, 5, 5, 5, 5.25, 5.25, 5.25, 5.25].map((x) => expect.closeTo(x, 12)));
    expect(t[1]).toMatchObject({ r: { R_C: 1.05, R_B: 0.95 }, signs: { R_C: 1, R_B: -1 }, supplySign: -1 });
    expect(corners(5, ['R_C', 'R_B'] as const, S)).toBe(t);
    expect(Object.isFrozen(t) && Object.isFrozen(t[0].r)).toBe(true);
    // other content, other table
    const wide = corners(5, ['R_C', 'R_B'] as const, marginSettings({ resistorTolerance: 0.1 }));
    expect(wide).not.toBe(t);
    expect(wide[1].r).toEqual({ R_C: 1.1, R_B: 0.9 });
    expect(corners(3.6, ['R_C', 'R_B'] as const, S)[0].supply).toBeCloseTo(3.42, 12);
  });
});

describe('minOf / maxOf', () => {
  it('agree with Math.min / Math.max and take lists too long to spread into a call', () => {
    expect([minOf([3, 1, 2]), maxOf([3, 1, 2]), minOf([]), maxOf([])]).toEqual([1, 3, Infinity, -Infinity]);
    expect(minOf([1, NaN])).toBeNaN();
    const long = Array.from({ length: 500_000 }, (_, i) => 1000 + ((i * 7919) % 100_003));
    long[123_456] = 470;
    expect(minOf(long)).toBe(470);
    expect(maxOf(long)).toBe(1000 + 100_002);
    // and a line of that many pull-ups sizes its static power without overflowing
    expect(staticPower({ vcc: 5, pullUps: long }, S).inputs).toMatchObject({ check: 'static-power' });
  });
});
