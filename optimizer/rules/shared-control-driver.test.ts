// shared-control-driver: valid cases (no finding) and invalid cases (findings with the message id,
// data and part delta), every family, hierarchy, the fewest-drivers split, and the doc's examples.
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { NetlistBuilder } from '../netlist/build';
import type { FlatNetlist } from '../netlist/ir';
import { sharedControlDriver } from './shared-control-driver';
import { checkDeckExample, countDelta, deckExamples, deckNetlist, runOne } from './support/rule-test-kit';
import { sliceInverters } from './test-helpers';
import type { Rule } from './types';

const rule = sharedControlDriver as unknown as Rule;

/**
 * RTL slices: each has its own inverter of a strobe (RC from VCC, RB from the strobe) whose
 * output LDN feeds `loads` load transistors through RBL, each with its own collector pull-up RL.
 *
 *   STROBE ─RB─ Q1 ─┬─ LDN ─RBL─ QLj ─ OUTj ─RL─ VCC
 *                  RC
 */
function rtlSlices(o: { slices: number; loads: number; rc?: number; rb?: number; rbl?: number; rl?: number; strobe?: (k: number) => string }): FlatNetlist {
  const b = new NetlistBuilder('Wren-8 register load strobes');
  b.rail('VCC', 5);
  b.model('QN', 'npn', { IS: 1e-14, BF: 100 });
  for (let k = 0; k < o.slices; k++) {
    b.within([`XS${k}`], () => {
      b.resistor('RC', 'VCC', 'LDN', o.rc ?? 1000);
      b.resistor('RB', `/${o.strobe ? o.strobe(k) : 'LOAD'}`, 'B', 4700);
      b.npn('Q1', 'LDN', 'B', '0');
      for (let j = 0; j < o.loads; j++) {
        b.resistor(`RBL${j}`, 'LDN', `BL${j}`, o.rbl ?? 4700);
        b.npn(`QL${j}`, `OUT${j}`, `BL${j}`, '0');
        b.resistor(`RL${j}`, 'VCC', `OUT${j}`, o.rl ?? 4700);
      }
    });
  }
  return b.build();
}

function cmosSlices(n: number): FlatNetlist {
  const b = new NetlistBuilder('Wren-8 bus enable inverters, CMOS');
  b.rail('VDD', 5);
  for (let k = 0; k < n; k++) {
    b.within([`XB${k}`], () => {
      b.pmos('MP', 'ENN', '/EN', 'VDD', { bulk: 'VDD' });
      b.nmos('MN', 'ENN', '/EN', '0');
      b.nmos('MX', 'Y', 'ENN', '0');
      b.pmos('MXP', 'Y', 'ENN', 'VDD', { bulk: 'VDD' });
    });
  }
  return b.build();
}

function gateSlices(n: number): FlatNetlist {
  const b = new NetlistBuilder('Wren-8 clear gating, gate level');
  for (let k = 0; k < n; k++) {
    b.within([`XR${k}`], () => {
      b.gate('U1', 'not', ['CLRN', '/CLR']);
      b.gate('U2', 'and', ['Q', 'CLRN', 'D']);
    });
  }
  return b.build();
}

/** DTL: per slice a one-input DTL inverter of STB driving one two-input DTL NAND's input. */
function dtlSlices(n: number, rd = 2000, rc = 2000): FlatNetlist {
  const b = new NetlistBuilder('Wren-8 DTL strobes');
  b.rail('VCC', 5);
  b.model('QN', 'npn', { IS: 1e-14, BF: 100 });
  b.model('DN', 'd', { IS: 1e-14 });
  const dtl = (name: string, inputs: string[], out: string) => {
    inputs.forEach((inp, i) => b.diode(`D${name}${i}`, `P${name}`, inp));
    b.resistor(`RP${name}`, 'VCC', `P${name}`, rd);
    b.diode(`DS${name}`, `P${name}`, `M${name}`);
    b.diode(`DT${name}`, `M${name}`, `BB${name}`);
    b.resistor(`RBB${name}`, `BB${name}`, '0', 5000);
    b.resistor(`RC${name}`, 'VCC', out, rc);
    b.npn(`Q${name}`, out, `BB${name}`, '0');
  };
  for (let k = 0; k < n; k++) {
    b.within([`XD${k}`], () => {
      dtl('1', ['/STB'], 'STBN');
      dtl('2', ['STBN', 'DATA'], 'Y');
    });
  }
  return b.build();
}

describe('shared-control-driver: valid (no finding)', () => {
  it.each([
    ['one inverter only', rtlSlices({ slices: 1, loads: 1 })],
    ['every slice has its own strobe net', rtlSlices({ slices: 4, loads: 1, strobe: (k) => `LOAD${k}` })],
    ['a single CMOS slice', cmosSlices(1)],
  ])('%s', async (_label, nl) => {
    const r = await runOne(rule, nl);
    expect(r.ruleErrors).toEqual([]);
    expect(r.findings).toEqual([]);
  });

  it('gates of the same nets but different functions are not shared', async () => {
    const b = new NetlistBuilder('inverter and NOR on the same strobe');
    b.rail('VCC', 5);
    b.resistor('RC1', 'VCC', 'Y1', 1000).resistor('RB1', 'LOAD', 'B1', 4700).npn('Q1', 'Y1', 'B1', '0');
    // NOR of LOAD and CLR: a second transistor on another input
    b.resistor('RC2', 'VCC', 'Y2', 1000).resistor('RB2', 'LOAD', 'B2', 4700).npn('Q2', 'Y2', 'B2', '0');
    b.resistor('RB3', 'CLR', 'B3', 4700).npn('Q3', 'Y2', 'B3', '0');
    const r = await runOne(rule, b.build());
    expect(r.findings).toEqual([]);
  });

  it('does not count copies below minCopies', async () => {
    const r = await runOne(rule, sliceInverters(3), { options: { minCopies: 4 } });
    expect(r.findings).toEqual([]);
  });
});

describe('shared-control-driver: invalid (findings)', () => {
  it('four RTL strobe inverters become one driver (3 transistors, 6 resistors saved)', async () => {
    const nl = sliceInverters(4);
    const r = await runOne(rule, nl);
    expect(r.findings).toHaveLength(1);
    const f = r.findings[0];
    expect(f.messageId).toBe('share');
    expect(f.data).toMatchObject({ count: 4, function: '!LOAD', inputs: 'LOAD', drivers: 1, loads: 0 });
    expect(f.data.where).toBe('bit 0 of slice XS0, bit 1 of slice XS1, bit 2 of slice XS2, bit 3 of slice XS3');
    expect(f.location.instances).toEqual(['XS0', 'XS1', 'XS2', 'XS3']);
    const p = f.proposals[0];
    expect(p.edit.mergeNets).toEqual([1, 2, 3].map((k) => ({ keep: 'XS0.LDN', remove: `XS${k}.LDN` })));
    expect(p.assumptions).toEqual([]);
    expect(countDelta(nl, p)).toEqual({ actual: { transistors: 3, resistors: 6, diodes: 0 }, stated: { transistors: 3, resistors: 6, diodes: 0 } });
  });

  it('eight loads fail one RTL driver (fan-out 5) and pass as two drivers of four', async () => {
    // Mano, Digital Design (from memory): typical RTL fan-out 5.
    const nl = rtlSlices({ slices: 8, loads: 1 });
    const r = await runOne(rule, nl);
    const f = r.findings[0];
    expect(f.messageId).toBe('split');
    expect(f.data).toMatchObject({ count: 8, drivers: 2, loads: 8, failed: 'fan-out' });
    const p = f.proposals[0];
    expect(p.edit.mergeNets.map((m) => m.keep)).toEqual([...Array(3).fill('XS0.LDN'), ...Array(3).fill('XS4.LDN')]);
    const byName = Object.fromEntries(p.margins.map((m) => [m.name, m]));
    expect(byName['fan-out']).toMatchObject({ value: 4, limit: 5, status: 'pass' });
    expect(byName['loaded high level'].status).toBe('pass');
    expect(byName['load base current'].status).toBe('pass');
    expect(countDelta(nl, p).actual).toEqual({ transistors: 6, resistors: 12, diodes: 0 });
    expect(countDelta(nl, p).actual).toEqual(countDelta(nl, p).stated);
  });

  it('marks the one-driver rewrite failing when no sharing keeps the margins', async () => {
    // A weak pull-up (2.2k) feeding 8 bases through 2.2k, each load sinking 150 Ω: the shared
    // line cannot saturate them (load base current), and 8 loads exceed RTL fan-out 5.
    const nl = rtlSlices({ slices: 2, loads: 4, rc: 2200, rbl: 2200, rl: 150 });
    const f = (await runOne(rule, nl)).findings[0];
    expect(f.messageId).toBe('failing');
    expect(f.data.drivers).toBe(1);
    const failing = f.proposals[0].margins.filter((m) => m.status === 'fail').map((m) => m.name);
    expect(failing).toEqual(expect.arrayContaining(['fan-out', 'load base current']));
    expect(f.message).toMatch(/keeping them separate/);
  });

  it('shares CMOS inverters (2 transistors per copy saved)', async () => {
    const nl = cmosSlices(4);
    const f = (await runOne(rule, nl)).findings[0];
    expect(f.messageId).toBe('share');
    expect(f.data).toMatchObject({ count: 4, function: '!EN', loads: 8 });
    expect(countDelta(nl, f.proposals[0]).actual).toEqual({ transistors: 6, resistors: 0, diodes: 0 });
    expect(f.proposals[0].margins.map((m) => m.name)).toEqual(['fan-out']);
  });

  it('shares gate-level inverters', async () => {
    const nl = gateSlices(3);
    const f = (await runOne(rule, nl)).findings[0];
    expect(f.data).toMatchObject({ count: 3, function: '!CLR' });
    expect(f.proposals[0].edit.removeDevices).toEqual(['XR1.U1', 'XR2.U1']);
  });

  it('shares DTL inverters and checks the sink current of the diode inputs they pull low', async () => {
    const nl = dtlSlices(4);
    const f = (await runOne(rule, nl)).findings[0];
    expect(f.messageId).toBe('share');
    expect(f.data).toMatchObject({ count: 4, function: '!STB' });
    const names = f.proposals[0].margins.map((m) => m.name);
    expect(names).toEqual(['fan-out', 'sink current', 'forced β']);
    // Circuit law: (5.25 − 0.2)·(1/1900 + 4/1900) at the high-supply, low-resistor corner.
    expect(f.proposals[0].margins[1].value).toBeCloseTo((5.05 * 5) / 1900, 6);
    const d = countDelta(nl, f.proposals[0]);
    expect(d.actual).toEqual({ transistors: 3, resistors: 9, diodes: 9 });
    expect(d.actual).toEqual(d.stated);
  });

  it('finds the copies inside every instance of a slice subcircuit read from a deck', async () => {
    const deck = [
      'Wren-8 ALU slices',
      '.subckt SLICE EN A Y VCC',
      'RC VCC ENN 1k',
      'RB EN B 4.7k',
      'Q1 ENN B 0 QN',
      'RB2 ENN B2 4.7k',
      'RB3 A B2 4.7k',
      'Q2 Y B2 0 QN',
      'RY VCC Y 1k',
      '.ends',
      'VCC VCC 0 DC 5',
      ...[0, 1, 2, 3].map((k) => `XSLICE${k} EN A${k} Y${k} VCC SLICE`),
      '.model QN NPN (IS=1e-14 BF=100)',
      '.end',
    ].join('\n');
    const nl = deckNetlist(deck);
    const f = (await runOne(rule, nl)).findings[0];
    expect(f.data.where).toBe('bit 0 of slice XSLICE0, bit 1 of slice XSLICE1, bit 2 of slice XSLICE2, bit 3 of slice XSLICE3');
    expect(f.data.count).toBe(4);
    expect(countDelta(nl, f.proposals[0]).actual).toEqual({ transistors: 3, resistors: 6, diodes: 0 });
  });
});

describe('shared-control-driver: doc examples', () => {
  const examples = deckExamples(path.join(__dirname, 'shared-control-driver.md'));
  it('has examples', () => expect(examples.length).toBeGreaterThanOrEqual(3));
  it.each(examples.map((e) => [e.label, e] as const))('%s', (_l, ex) => checkDeckExample(rule, ex));
});
