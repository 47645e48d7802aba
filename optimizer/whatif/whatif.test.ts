// The explorer's engine: stored margins recompute to themselves, each setting moves the checks it
// should by the formula's amount, part totals add up, and bad input is refused with a clear error.
import { describe, expect, it } from 'vitest';
import { InputError } from '../errors';
import { forcedBeta, loadBaseCurrent, loadedHighLevel, sinkCurrent, stackedLowLevel, diodeSteeredLowLevel } from '../margins/bipolar';
import { DEFAULT_MARGIN_SETTINGS as S } from '../margins/defaults';
import { fanOut, lineCapacitance, riseTime, staticPower } from '../margins/line';
import type { MarginResult } from '../margins/corners';
import { recomputeMargin } from './recompute';
import { defaultSettings } from './settings';
import type { WhatIfInputs } from './types';
import { runWhatIf } from './whatif';

/** A JSON round trip, as the margins come back from the database and over HTTP. */
const stored = <T>(x: T): T => JSON.parse(JSON.stringify(x)) as T;

const every: MarginResult[] = stored([
  sinkCurrent({ vcc: 5, pullUps: [1000, 1000, 1000, 1000] }, S),
  forcedBeta({ vcc: 5, pullUps: [1000, 1000], baseResistor: 4700, betaMin: 50 }, S),
  loadedHighLevel({ vcc: 5, rc: 640, rb: 450, loads: 4, receiver: 'rtl' }, S),
  loadBaseCurrent({ vcc: 5, rc: 640, rb: 450, loads: 4, loadPullUp: 640, betaMin: 30 }, S),
  stackedLowLevel({ vcc: 5, stack: 2, receiver: 'rtl' }, S),
  diodeSteeredLowLevel({ vcc: 5, receiver: 'dtl' }, S),
  riseTime({ vcc: 5, pullUp: 2200, capacitance: lineCapacitance(4, S), clockPeriod: 1e-6, loads: 4 }, S),
  staticPower({ vcc: 5, pullUps: [2200] }, S),
  fanOut({ loads: 4, family: 'rtl' }, S),
]);

const totals = (t: number, r: number, cost: number) => ({ transistors: t, resistors: r, diodes: 0, capacitors: 0, gates: 0, areaMm2: t * 30 + r * 25, cost });

const inputs: WhatIfInputs = stored({
  baseline: totals(96, 120, 7.2),
  currency: 'EUR',
  proposals: [
    { id: 'p-share', ruleId: 'shared-control-driver', title: 'one enable driver', savings: totals(7, 7, 0.49), margins: every.slice(0, 4), overlapsWith: ['p-merge'] },
    { id: 'p-bus', ruleId: 'tristate-slim', title: 'open-collector bus', savings: totals(8, -1, 0.47), margins: every.slice(6, 8), overlapsWith: [] },
    { id: 'p-merge', ruleId: 'merge-duplicate-logic', title: 'merge', savings: totals(2, 2, 0.14), margins: [every[8]], overlapsWith: ['p-share'] },
  ],
});

describe('recomputeMargin', () => {
  it('gives back every stored check unchanged when no setting moves', () => {
    for (const m of every) {
      const r = recomputeMargin(m, {}, S);
      expect(r.recomputed, m.name).toBe(true);
      expect(stored(r)).toEqual({ ...m, recomputed: true });
    }
  });

  it('keeps a result with no stored inputs as scanned', () => {
    const { inputs: _dropped, ...bare } = every[0];
    expect(recomputeMargin(bare, { supplyVolts: 9 }, S)).toEqual({ ...bare, recomputed: false });
  });

  it('scales rise time with the pull-up: t_r = ln 9 · R(1 + tol) · C', () => {
    // Elmore 1948 / Rubinstein, Penfield, Horowitz 1983: 10–90 % rise of one RC is ln 9 · RC ≈ 2.2 RC.
    const r = recomputeMargin(every[6], { pullUpOhms: 10_000 }, S);
    const c = S.lineCapacitance + 4 * S.loadCapacitance;
    expect(r.value).toBeCloseTo(Math.log(9) * 10_000 * 1.05 * c, 15);
  });

  it('turns rise time from pass to fail when the clock period shrinks below 4·t_r', () => {
    const before = recomputeMargin(every[6], {}, S);
    expect(before.status).toBe('pass');
    const after = recomputeMargin(every[6], { clockPeriod: before.value * 2 }, S);
    expect(after.status).toBe('fail');
    expect(after.limit).toBeCloseTo(before.value * 2 * S.riseFraction, 15);
  });

  it('recomputes line capacitance from the load count', () => {
    const r = recomputeMargin(every[6], { loads: 10 }, S);
    expect(r.value).toBeCloseTo(Math.log(9) * 2200 * 1.05 * (S.lineCapacitance + 10 * S.loadCapacitance), 15);
  });

  it('fails forced β when β_min drops below I_C/I_B', () => {
    const ok = recomputeMargin(every[1], {}, S);
    expect(ok.status).not.toBe('fail');
    const low = recomputeMargin(every[1], { betaMin: Math.floor(ok.value) - 1 }, S);
    expect(low.status).toBe('fail');
    expect(low.value).toBeCloseTo(ok.value, 12);
  });

  it('sizes the sunk lines from the load count at the pull-up setting', () => {
    const r = recomputeMargin(every[0], { loads: 10, pullUpOhms: 500 }, S);
    // Σ (V_CC − V_CE(sat))/R at V_CC +5 %, R −5 % (circuit law).
    expect(r.value).toBeCloseTo((10 * (5.25 - S.vceSat)) / (500 * 0.95), 12);
    expect(r.status).toBe('fail');
  });

  it('lowers the loaded high level as loads are added and with a lower supply', () => {
    const base = recomputeMargin(every[2], {}, S).value;
    expect(recomputeMargin(every[2], { loads: 8 }, S).value).toBeLessThan(base);
    expect(recomputeMargin(every[2], { supplyVolts: 3.3 }, S).value).toBeLessThan(base);
  });
});

describe('runWhatIf', () => {
  it('with nothing toggled keeps the design as it is', () => {
    const r = runWhatIf(inputs, {}, []);
    expect(r.parts.after).toEqual(inputs.baseline);
    expect(r.status).toBe('pass');
    expect(r.counts).toEqual({ pass: 0, warn: 0, fail: 0 });
    expect(r.worstRiseTime).toBeNull();
  });

  it('subtracts the savings of the toggled proposals', () => {
    const r = runWhatIf(inputs, {}, ['p-share', 'p-bus']);
    expect(r.parts.saved.transistors).toBe(15);
    expect(r.parts.saved.resistors).toBe(6);
    expect(r.parts.after.transistors).toBe(81);
    expect(r.parts.after.resistors).toBe(114);
    expect(r.parts.after.cost).toBeCloseTo(7.2 - 0.96, 9);
    expect(r.enabled).toEqual(['p-share', 'p-bus']);
    expect(r.counts.pass + r.counts.warn + r.counts.fail).toBe(6);
  });

  it('reports the worst rise time among the toggled proposals and its status', () => {
    const r = runWhatIf(inputs, { pullUpOhms: 4700 }, ['p-bus']);
    expect(r.worstRiseTime?.proposalId).toBe('p-bus');
    expect(r.worstRiseTime?.value).toBeCloseTo(Math.log(9) * 4700 * 1.05 * (S.lineCapacitance + 4 * S.loadCapacitance), 15);
    const slow = runWhatIf(inputs, { pullUpOhms: 4700, clockPeriod: 1e-7 }, ['p-bus']);
    expect(slow.worstRiseTime?.status).toBe('fail');
    expect(slow.status).toBe('fail');
  });

  it('names toggled proposals that overlap', () => {
    expect(runWhatIf(inputs, {}, ['p-share', 'p-merge']).conflicts).toEqual([['p-merge', 'p-share']]);
    expect(runWhatIf(inputs, {}, ['p-share']).conflicts).toEqual([]);
  });

  it('never changes its inputs', () => {
    const before = JSON.stringify(inputs);
    runWhatIf(inputs, { supplyVolts: 3, loads: 12, betaMin: 10 }, ['p-share', 'p-bus', 'p-merge']);
    expect(JSON.stringify(inputs)).toBe(before);
  });

  it('refuses settings no circuit has and proposals it does not know', () => {
    expect(() => runWhatIf(inputs, { supplyVolts: 0 }, [])).toThrow(InputError);
    expect(() => runWhatIf(inputs, { loads: 2.5 }, [])).toThrow(/whole number/);
    expect(() => runWhatIf(inputs, { pullUpOhms: Number.NaN }, [])).toThrow(/positive number/);
    expect(() => runWhatIf(inputs, {}, ['nope'])).toThrow(/no proposal nope/);
  });
});

describe('defaultSettings', () => {
  it('opens the sliders on the scanned figures', () => {
    const d = defaultSettings(inputs);
    expect(d.settings).toEqual({ betaMin: 50, pullUpOhms: 1000, supplyVolts: 5, clockPeriod: 1e-6, loads: 4 });
    for (const r of Object.values(d.ranges)) expect(r.min).toBeLessThan(r.max);
  });
});
