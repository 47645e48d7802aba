// tristate-slim: valid cases (no finding) and invalid ones (message id, data, part delta) on CMOS
// and gate-level buses across slice instances; the one-hot assumption proved and listed, or its
// absence refuted with a counterexample; pull-up sizing inside the window; the savings property;
// the doc's examples run as tests.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { marginSettings } from '../margins/defaults';
import { NetlistBuilder } from '../netlist/build';
import type { FlatNetlist } from '../netlist/ir';
import { deckNetlist, docExamples, pick, runOne, savingsProperty, scanOne } from './support/rule-test-kit';
import { seriesValues, sizePullUp, tristateSlim } from './tristate-slim';

/** CMOS bus of n slices XB0.., each a tri-state inverter of D_k with enable EN_k (ENB made inside). */
function cmosBus(n: number, reader = true): FlatNetlist {
  const b = new NetlistBuilder('Wren-8 data bus').rail('VDD', 5);
  for (let k = 0; k < n; k++) {
    b.within([`XB${k}`], () => {
      b.pmos('PI', 'ENB', `/EN${k}`, 'VDD', { bulk: 'VDD' }).nmos('NI', 'ENB', `/EN${k}`, '0');
      b.pmos('P1', 'M1', `/D${k}`, 'VDD', { bulk: 'VDD' }).pmos('P2', '/BUS', 'ENB', 'M1', { bulk: 'VDD' });
      b.nmos('N2', '/BUS', `/EN${k}`, 'M2').nmos('N1', 'M2', `/D${k}`, '0');
    });
  }
  if (reader) b.pmos('PR', 'Q', 'BUS', 'VDD', { bulk: 'VDD' }).nmos('NR', 'Q', 'BUS', '0');
  return b.build();
}
const gateBus = (ops: ('bufif1' | 'notif1' | 'bufif0')[]) => {
  const b = new NetlistBuilder('g');
  ops.forEach((op, k) => b.gate(`T${k}`, op, ['BUS', `D${k}`, `E${k}`]));
  return b.gate('U9', 'not', ['Q', 'BUS']).build();
};

describe('tristate-slim: valid (no finding)', () => {
  it.each([
    { name: 'one stage on its own line', nl: () => cmosBus(1) },
    { name: 'a plain CMOS inverter', nl: () => new NetlistBuilder('c').rail('VDD', 5).pmos('P', 'Y', 'A', 'VDD', { bulk: 'VDD' }).nmos('N', 'Y', 'A', '0').build() },
    { name: 'gate level: one bufif1', nl: () => gateBus(['bufif1']) },
  ])('$name', async (c) => {
    const r = await runOne(tristateSlim, c.nl(), { assumptions: ['!(EN0 & EN1)'] });
    expect(r.ruleErrors).toEqual([]);
    expect(r.findings).toEqual([]);
  });
});

describe('tristate-slim: invalid (finding)', () => {
  it('CMOS bus of two slices under a one-hot assumption: PMOS stacks and enable inverters go, one pull-up comes', async () => {
    const nl = cmosBus(2);
    const r = await runOne(tristateSlim, nl, { assumptions: ['!(EN0 & EN1)', 'D0 | !D0'] });
    expect(r.ruleErrors).toEqual([]);
    expect(r.findings).toHaveLength(1);
    const f = r.findings[0];
    expect(f.messageId).toBe('slim');
    // one reader: C = 20 pF + 5 pF; R ≤ 0.25·1 µs / (2.2 · 25 pF · 1.05) ≈ 4.33 kΩ → 4.3 kΩ (E24)
    expect(f.data).toEqual({ bus: 'BUS', drivers: 2, places: 'bit 0 of slice XB0 and bit 1 of slice XB1', resistor: '4.3 kΩ', relies: 'A1' });
    expect(f.location.instances).toEqual(['XB0', 'XB1']);
    const p = f.proposals[0];
    expect(p.assumptions).toEqual(['A1']);
    const { stated, actual } = savingsProperty(nl, p);
    // per stage: 2 PMOS of the tri-state inverter + the 2-transistor enable inverter (Weste & Harris, from memory)
    expect(pick(stated)).toEqual({ transistors: 8, resistors: -1, diodes: 0, capacitors: 0, gates: 0 });
    expect(actual).toEqual(pick(stated));
    expect(p.margins.map((m) => [m.name, m.status])).toEqual([
      ['pull-up against sink limit', 'pass'],
      ['pull-up against high level', 'pass'],
      ['rise time', 'warn'],
      ['static power', 'pass'],
    ]);
  });

  it('without a one-hot assumption the finding says so and gives the counterexample', async () => {
    const r = await runOne(tristateSlim, cmosBus(2));
    const f = r.findings[0];
    expect(f.messageId).toBe('needsOneHot');
    expect(f.proposals[0].assumptions).toEqual([]);
    // two enables on together with data disagreeing (EN0=EN1=1, D0≠D1)
    const cex = Object.fromEntries(String(f.data.cex).split(', ').map((kv) => kv.split('=')));
    expect([cex.EN0, cex.EN1]).toEqual(['1', '1']);
    expect(cex.D0).not.toBe(cex.D1);
    expect([f.data.before, f.data.after]).toEqual([1, 0]);
  });

  it('the scan refutes the slimmed line when nothing keeps the enables one-hot', async () => {
    const s = await scanOne(tristateSlim, cmosBus(2));
    expect(s.findings[0].proposals[0].verdict).toBe('refuted');
  });

  it('gate level: each bufif1 becomes an open-drain NAND on the line, plus one pullup', async () => {
    const nl = gateBus(['bufif1', 'notif1', 'bufif0']);
    const r = await runOne(tristateSlim, nl, { assumptions: ['!(E0 & E1) & !(E0 & !E2) & !(E1 & !E2)'] });
    const f = r.findings[0];
    expect(f.messageId).toBe('slim');
    const p = f.proposals[0];
    expect(p.edit.addDevices.map((d) => `${d.op}(${d.terminals.join(',')})`)).toEqual([
      'nand(BUS,E0,T0_N)',
      'not(T0_N,D0)',
      'nand(BUS,E1,D1)',
      'or(BUS,E2,D2)',
      'pullup(BUS)',
    ]);
    const { stated, actual } = savingsProperty(nl, p);
    expect(actual).toEqual(pick(stated));
  });

  it('finds one line per bus across eight slices', async () => {
    const r = await runOne(tristateSlim, cmosBus(8), { assumptions: ['!(EN0 & EN1)'] });
    expect(r.findings).toHaveLength(1);
    expect(r.findings[0].data.drivers).toBe(8);
    expect(r.findings[0].location.instances).toHaveLength(8);
  });
});

describe('pull-up sizing', () => {
  const o = tristateSlim.meta.defaultOptions;
  const s = marginSettings();
  it('picks the largest E24 value inside the window and under the rise-time limit', () => {
    const { resistor, margins } = sizePullUp({ margins: s, clockPeriod: 1e-6 }, o, { vcc: 5, loads: 2, drivers: 2, family: 'cmos' });
    expect(seriesValues('E24')).toContain(resistor);
    // t_r ≈ 2.2·R·C (Elmore 1948; Rubinstein, Penfield, Horowitz 1983) with C = 20 pF + 2·5 pF at R +5 %
    const limit = (0.25 * 1e-6) / (Math.log(9) * 30e-12 * 1.05);
    expect(resistor).toBeLessThanOrEqual(limit);
    const next = seriesValues('E24').find((r) => r > resistor)!;
    expect(next).toBeGreaterThan(limit);
    // static power (V_CC − V_CE(sat))²/R at +5 % supply, −5 % R (circuit law)
    expect(margins.find((m) => m.name === 'static power')!.value).toBeCloseTo((5.25 - 0.2) ** 2 / (resistor * 0.95), 6);
  });
  it('a clock too fast for any legal pull-up fails rise time', () => {
    const { margins } = sizePullUp({ margins: s, clockPeriod: 20e-9 }, o, { vcc: 5, loads: 2, drivers: 2, family: 'cmos' });
    expect(margins.find((m) => m.name === 'rise time')!.status).toBe('fail');
    expect(margins.find((m) => m.name === 'pull-up against sink limit')!.status).not.toBe('fail');
  });
});

describe('tristate-slim: doc examples', () => {
  const examples = docExamples(readFileSync(path.join(__dirname, 'tristate-slim.md'), 'utf8'));
  it('has examples', () => expect(examples.length).toBeGreaterThanOrEqual(2));
  it.each(examples)('$name', async (ex) => {
    const r = await runOne(tristateSlim, deckNetlist(ex.deck, `${ex.name}.cir`), { assumptions: ex.assumptions, clockPeriod: ex.clockPeriod });
    expect(r.ruleErrors).toEqual([]);
    expect(r.findings).toHaveLength(ex.findings);
    if (ex.message) expect(r.findings[0].messageId).toBe(ex.message);
  });
});
