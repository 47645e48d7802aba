// Extraction of textbook gates built with the netlist builder: each test sketches its circuit,
// checks the function by truth table, the kind and family, and the part counts of the group.
import { describe, expect, it } from 'vitest';
import { netlist } from '../netlist/build';
import { evaluate } from '../logic/expr';
import { nodeNamed, sameFunction } from './test-helpers';
import { extractLogic } from './index';
import { BaseResolver } from './bipolar';
import { makeContext } from './context';
import type { LogicView } from './types';

const node = nodeNamed;

const kinds = (view: LogicView, devs: number[], nl: ReturnType<ReturnType<typeof netlist>['build']>) => {
  const out: Record<string, number> = {};
  for (const d of devs) out[nl.devices[d].kind] = (out[nl.devices[d].kind] ?? 0) + 1;
  void view;
  return out;
};

describe('bipolar collector-node groups', () => {
  it('RTL inverter: one transistor, two resistors, Y = !A', () => {
    //  VCC ─RC─ Y ─┐        A ─RB─ B1 ── Q1 base; Q1 collector Y, emitter ground
    const nl = netlist().rail('VCC', 5).resistor('RB', 'A', 'B1', 10e3).npn('Q1', 'Y', 'B1', '0').resistor('RC', 'VCC', 'Y', 1e3).build();
    const view = extractLogic(nl);
    const y = node(view, 'Y');
    expect(sameFunction(y.fn, '!A')).toBe(true);
    expect([y.kind, y.family]).toEqual(['static', 'rtl']);
    // Mano, Digital Design, digital IC chapter (from memory): RTL inverter = 1 transistor + 2 resistors
    expect(kinds(view, y.devices, nl)).toEqual({ npn: 1, resistor: 2 });
    expect(y.pullUp).toMatchObject({ ohms: 1e3, railVolts: 5 });
    expect(view.inputs).toEqual(['A']);
    expect(view.family).toBe('rtl');
  });

  it('RTL NOR-3, one transistor per input: n transistors, n + 1 resistors', () => {
    const b = netlist().rail('VCC', 5).resistor('RC', 'VCC', 'Y', 640);
    for (const i of ['A', 'B', 'C']) b.resistor(`R${i}`, i, `B${i}`, 450).npn(`Q${i}`, 'Y', `B${i}`, '0');
    const nl = b.build();
    const y = node(extractLogic(nl), 'Y');
    expect(sameFunction(y.fn, '!(A | B | C)')).toBe(true);
    // Mano, Digital Design (from memory): RTL NOR-n = n transistors, n + 1 resistors
    expect(kinds(extractLogic(nl), y.devices, nl)).toEqual({ npn: 3, resistor: 4 });
    expect(y.groups).toHaveLength(1);
  });

  it('NAND by a series stack: the stack node is not a gate output', () => {
    //  Y ── Q1(A) ── M ── Q2(B) ── ground
    const nl = netlist()
      .rail('VCC', 5)
      .resistor('RC', 'VCC', 'Y', 1e3)
      .resistor('RA', 'A', 'BA', 4.7e3)
      .resistor('RB', 'B', 'BB', 4.7e3)
      .npn('Q1', 'Y', 'BA', 'M')
      .npn('Q2', 'M', 'BB', '0')
      .build();
    const view = extractLogic(nl);
    expect(sameFunction(node(view, 'Y').fn, '!(A & B)')).toBe(true);
    expect(view.nodes.map((n) => n.name)).toEqual(['Y']);
    expect(node(view, 'Y').groups[0].pullDown?.type).toBe('series');
  });

  it('resistor-summed base: two base resistors into one base are an OR', () => {
    const nl = netlist()
      .rail('VCC', 5)
      .resistor('RC', 'VCC', 'Y', 1e3)
      .resistor('RA', 'A', 'BQ', 10e3)
      .resistor('RB', 'B', 'BQ', 10e3)
      .npn('Q1', 'Y', 'BQ', '0')
      .build();
    const y = node(extractLogic(nl), 'Y');
    expect(sameFunction(y.fn, '!(A | B)')).toBe(true);
    expect(y.groups[0].bases[0].kind).toBe('resistor-sum');
  });

  it('DTL NAND-2: 1 transistor, n + 2 diodes, 3 resistors, family dtl', () => {
    //  VCC ─RP─ P ─|>─ A, P ─|>─ B (input diodes, cathodes at the inputs)
    //  P ─|>─ X ─|>─ BASE (level shift), BASE ─RB─ ground, Q1 collector Y, VCC ─RC─ Y
    const nl = netlist()
      .rail('VCC', 5)
      .resistor('RP', 'VCC', 'P', 2e3)
      .diode('DA', 'P', 'A')
      .diode('DB', 'P', 'B')
      .diode('DS1', 'P', 'X')
      .diode('DS2', 'X', 'BASE')
      .resistor('RB', 'BASE', '0', 5e3)
      .npn('Q1', 'Y', 'BASE', '0')
      .resistor('RC', 'VCC', 'Y', 2e3)
      .build();
    const view = extractLogic(nl);
    const y = node(view, 'Y');
    expect(sameFunction(y.fn, '!(A & B)')).toBe(true);
    expect(y.family).toBe('dtl');
    // Mano, Digital Design (from memory): basic DTL NAND-n = 1 transistor, n + 2 diodes, 3 resistors
    expect(kinds(view, y.devices, nl)).toEqual({ npn: 1, diode: 4, resistor: 3 });
    expect(view.inputs).toEqual(['A', 'B']);
  });

  it('wired-AND of two open-collector outputs with one pull-up elsewhere', () => {
    const b = netlist().rail('VCC', 5).resistor('RP', 'VCC', 'BUS', 1e3);
    for (const [inst, input] of [['XA', 'A'], ['XB', 'B']]) {
      b.within([inst], () => {
        b.resistor('RB', `/${input}`, 'BQ', 10e3).npn('Q1', '/BUS', 'BQ', '0');
      });
    }
    const view = extractLogic(b.build());
    const bus = node(view, 'BUS');
    expect(bus.kind).toBe('wired');
    expect(bus.groups).toHaveLength(2);
    expect(bus.groups.every((g) => g.openCollector)).toBe(true);
    expect(sameFunction(bus.fn, '!A & !B')).toBe(true);
  });

  it('one open-collector output pulled up by another cell is open-collector', () => {
    const b = netlist().rail('VCC', 5).resistor('RP', 'VCC', 'LINE', 2.2e3);
    b.within(['XDRV'], () => b.resistor('RB', '/EN', 'BQ', 10e3).npn('Q1', '/LINE', 'BQ', '0'));
    const line = node(extractLogic(b.build()), 'LINE');
    expect(line.kind).toBe('open-collector');
  });

  it('SR latch from cross-coupled RTL NORs: both nets are state bits, partners of each other', () => {
    //  Q = NOR(R, QB), QB = NOR(S, Q)
    const b = netlist().rail('VCC', 5);
    const nor = (out: string, a: string, c: string) =>
      b
        .resistor(`RC_${out}`, 'VCC', out, 1e3)
        .resistor(`R1_${out}`, a, `B1_${out}`, 4.7e3)
        .resistor(`R2_${out}`, c, `B2_${out}`, 4.7e3)
        .npn(`Q1_${out}`, out, `B1_${out}`, '0')
        .npn(`Q2_${out}`, out, `B2_${out}`, '0');
    nor('Q', 'R', 'QB');
    nor('QB', 'S', 'Q');
    const view = extractLogic(b.build());
    const q = node(view, 'Q');
    const qb = node(view, 'QB');
    expect([q.kind, qb.kind]).toEqual(['latch', 'latch']);
    expect(q.partner).toBe(qb.net);
    expect(view.stateBits.sort()).toEqual(['Q', 'QB']);
    expect(sameFunction(q.fn, '!(R | QB)')).toBe(true);
    expect(view.inputs).toEqual(['R', 'S']);
  });
});

describe('MOS channel-connected components', () => {
  const cmos = () => netlist().rail('VDD', 5);
  it('CMOS inverter, NAND2, NOR2 and AOI21 are static and complementary', () => {
    const b = cmos();
    // inverter
    b.pmos('P0', 'YI', 'A', 'VDD', { bulk: 'VDD' }).nmos('N0', 'YI', 'A', '0');
    // NAND2: parallel PMOS, series NMOS
    b.pmos('P1', 'YN', 'A', 'VDD', { bulk: 'VDD' }).pmos('P2', 'YN', 'B', 'VDD', { bulk: 'VDD' });
    b.nmos('N1', 'YN', 'A', 'm1').nmos('N2', 'm1', 'B', '0');
    // NOR2: series PMOS, parallel NMOS
    b.pmos('P3', 'm2', 'A', 'VDD', { bulk: 'VDD' }).pmos('P4', 'YR', 'B', 'm2', { bulk: 'VDD' });
    b.nmos('N3', 'YR', 'A', '0').nmos('N4', 'YR', 'B', '0');
    // AOI21: Y = !(A & B | C)
    b.pmos('P5', 'm3', 'A', 'VDD', { bulk: 'VDD' }).pmos('P6', 'm3', 'B', 'VDD', { bulk: 'VDD' }).pmos('P7', 'YA', 'C', 'm3', { bulk: 'VDD' });
    b.nmos('N5', 'YA', 'A', 'm4').nmos('N6', 'm4', 'B', '0').nmos('N7', 'YA', 'C', '0');
    const nl = b.build();
    const view = extractLogic(nl);
    const cases: [string, string, number][] = [
      ['YI', '!A', 2],
      ['YN', '!(A & B)', 4],
      ['YR', '!(A | B)', 4],
      ['YA', '!(A & B | C)', 6],
    ];
    for (const [net, fn, count] of cases) {
      const n = node(view, net);
      expect(sameFunction(n.fn, fn), net).toBe(true);
      expect([n.kind, n.family], net).toEqual(['static', 'cmos']);
      // Weste & Harris, CMOS VLSI Design (from memory): inverter 2, NAND-n 2n, NOR-n 2n transistors
      expect(n.devices.length, net).toBe(count);
    }
    expect(view.nodes.map((n) => n.name).sort()).toEqual(['YA', 'YI', 'YN', 'YR']);
    expect(view.family).toBe('cmos');
  });

  it('NMOS NOR with a resistor load', () => {
    const nl = netlist().rail('VDD', 5).resistor('RL', 'VDD', 'Y', 20e3).nmos('N1', 'Y', 'A', '0').nmos('N2', 'Y', 'B', '0').build();
    const y = node(extractLogic(nl), 'Y');
    expect(sameFunction(y.fn, '!(A | B)')).toBe(true);
    expect([y.kind, y.family]).toEqual(['static', 'nmos']);
    expect(y.pullUp).toMatchObject({ kind: 'resistor', ohms: 20e3 });
  });

  it('NMOS inverter with a depletion load', () => {
    const nl = netlist()
      .rail('VDD', 5)
      .model('ND', 'nmos', { VTO: -2 })
      .nmos('ML', 'VDD', 'Y', 'Y', { model: 'ND' })
      .nmos('N1', 'Y', 'A', '0')
      .build();
    const y = node(extractLogic(nl), 'Y');
    expect(sameFunction(y.fn, '!A')).toBe(true);
    expect(y.pullUp?.kind).toBe('depletion');
  });

  it('tri-state inverter: 4 transistors, driven only while enabled', () => {
    //  VDD ─P(ENB)─ m1 ─P(A)─ Y ─N(A)─ m2 ─N(EN)─ ground
    const nl = netlist()
      .rail('VDD', 5)
      .pmos('P1', 'm1', 'ENB', 'VDD', { bulk: 'VDD' })
      .pmos('P2', 'Y', 'A', 'm1', { bulk: 'VDD' })
      .nmos('N2', 'Y', 'A', 'm2')
      .nmos('N1', 'm2', 'EN', '0')
      .build();
    const y = node(extractLogic(nl), 'Y');
    expect(y.kind).toBe('tristate');
    // Weste & Harris (from memory): tri-state inverter = 4 transistors
    expect(y.devices).toHaveLength(4);
    expect(evaluate(y.enable!, { EN: 1, ENB: 0, A: 0 })).toBe(1);
    expect(evaluate(y.enable!, { EN: 1, ENB: 0, A: 1 })).toBe(1);
    expect(evaluate(y.enable!, { EN: 0, ENB: 1, A: 0 })).toBe(0);
    expect(evaluate(y.enable!, { EN: 0, ENB: 1, A: 1 })).toBe(0);
    expect(evaluate(y.fn, { EN: 1, ENB: 0, A: 1 })).toBe(0);
    expect(evaluate(y.fn, { EN: 1, ENB: 0, A: 0 })).toBe(1);
  });

  it('transmission gate from an input onto a read net is a pass node', () => {
    const nl = netlist()
      .rail('VDD', 5)
      .nmos('NT', 'Y', 'S', 'D')
      .pmos('PT', 'Y', 'SB', 'D', { bulk: 'VDD' })
      .pmos('P1', 'Z', 'Y', 'VDD', { bulk: 'VDD' })
      .nmos('N1', 'Z', 'Y', '0')
      .build();
    const view = extractLogic(nl);
    const y = node(view, 'Y');
    expect(y.kind).toBe('pass');
    expect(evaluate(y.fn, { D: 1, S: 1, SB: 0 })).toBe(1);
    expect(evaluate(y.fn, { D: 0, S: 1, SB: 0 })).toBe(0);
    expect(evaluate(y.enable!, { D: 0, S: 0, SB: 1 })).toBe(0);
    expect(view.inputs).toEqual(['D', 'S', 'SB']);
  });
});

describe('gate-level designs', () => {
  it('primitives go straight through; a tri-state bus of two bufif1 has an enable', () => {
    const nl = netlist()
      .gate('G1', 'nand', ['N1', 'A', 'B'])
      .gate('G2', 'not', ['Y', 'N1'])
      .gate('T1', 'bufif1', ['BUS', 'Y', 'E1'])
      .gate('T2', 'bufif1', ['BUS', 'C', 'E2'])
      .build();
    const view = extractLogic(nl);
    expect(sameFunction(node(view, 'N1').fn, '!(A & B)')).toBe(true);
    expect(node(view, 'Y').family).toBe('gate');
    const bus = node(view, 'BUS');
    expect(bus.kind).toBe('tristate');
    expect(sameFunction(bus.enable!, 'E1 | E2')).toBe(true);
    expect(view.family).toBe('gate');
  });
});

describe('base drives read once (BaseResolver.transient)', () => {
  it('gives what the cached drive gives, for resistor-summed and DTL diode bases, and keeps nothing', () => {
    const nl = netlist()
      .rail('VCC', 5)
      // RTL: two base resistors into one base (resistor-summed OR)
      .resistor('RA', 'A', 'B1', 450)
      .resistor('RB', 'B', 'B1', 450)
      .npn('Q1', 'Y', 'B1', '0')
      .resistor('RC', 'VCC', 'Y', 640)
      // DTL: input diodes to a pulled-up node, level shift to the base, bleed to ground
      .resistor('RP', 'VCC', 'P', 2e3)
      .diode('DA', 'P', 'C')
      .diode('DB', 'P', 'D')
      .diode('DS', 'P', 'BASE')
      .resistor('RBL', 'BASE', '0', 5e3)
      .npn('Q2', 'Z', 'BASE', '0')
      .resistor('RC2', 'VCC', 'Z', 2e3)
      .build();
    const q1 = nl.devices.findIndex((d) => d.name === 'Q1');
    const q2 = nl.devices.findIndex((d) => d.name === 'Q2');
    const once = new BaseResolver(makeContext(nl));
    const names = (devs: number[]) => devs.map((d) => nl.devices[d].name).sort();
    // read each transient drive before asking for the next one: its lists are shared scratch
    const t1 = once.transient(q1);
    const seen1 = { kind: t1.kind, on: t1.on, inputs: [...t1.inputs], devices: names(t1.devices) };
    const t2 = once.transient(q2);
    const seen2 = { kind: t2.kind, on: t2.on, inputs: [...t2.inputs], devices: names(t2.devices) };
    const kept = new BaseResolver(makeContext(nl));
    for (const [seen, q] of [
      [seen1, q1],
      [seen2, q2],
    ] as const) {
      const d = kept.drive(q);
      expect(seen).toEqual({ kind: d.kind, on: d.on, inputs: d.inputs, devices: names(d.devices) });
    }
    expect(seen1.kind).toBe('resistor-sum');
    expect(sameFunction(seen1.on, 'A | B')).toBe(true);
    expect(seen2.kind).toBe('diode-and');
    expect(sameFunction(seen2.on, 'C & D')).toBe(true);
    expect(seen2.devices).toEqual(['DA', 'DB', 'DS', 'RBL', 'RP']);
    // nothing was kept: a later read resolves afresh into the same shared scratch lists
    const again = once.transient(q1);
    expect(again.devices).toBe(t2.devices);
    expect(names(again.devices)).toEqual(['RA', 'RB']);
  });
});
