// double-inversion: valid cases (no finding) and invalid ones (finding, message id, data, part
// delta), across hierarchy and at gate level; margins that fail; the savings property; the doc's
// examples run as tests.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { NetlistBuilder } from '../netlist/build';
import type { FlatNetlist } from '../netlist/ir';
import { doubleInversion } from './double-inversion';
import { deckNetlist, docExamples, pick, runOne, savingsProperty, scanOne } from './support/rule-test-kit';

/** RTL inverter: VCC ─RC─ out, in ─RB─ base, collector out, emitter ground. */
function rtlInv(b: NetlistBuilder, name: string, input: string, out: string, rc = 1000, rb = 4700): void {
  b.resistor(`RB${name}`, input, `B${name}`, rb).npn(`Q${name}`, out, `B${name}`, '0').resistor(`RC${name}`, 'VCC', out, rc);
}
function cmosInv(b: NetlistBuilder, name: string, input: string, out: string): void {
  b.pmos(`P${name}`, out, input, 'VDD', { bulk: 'VDD' }).nmos(`N${name}`, out, input, '0');
}
/** RTL NOR-2, one transistor per input. */
function rtlNor(b: NetlistBuilder, name: string, a: string, c: string, out: string, rb = 4700, rc = 1000): void {
  b.resistor(`RA${name}`, a, `BA${name}`, rb).npn(`QA${name}`, out, `BA${name}`, '0');
  b.resistor(`RK${name}`, c, `BK${name}`, rb).npn(`QK${name}`, out, `BK${name}`, '0').resistor(`RC${name}`, 'VCC', out, rc);
}
function cmosNand(b: NetlistBuilder, name: string, a: string, c: string, out: string): void {
  b.pmos(`PA${name}`, out, a, 'VDD', { bulk: 'VDD' }).pmos(`PB${name}`, out, c, 'VDD', { bulk: 'VDD' });
  b.nmos(`NA${name}`, out, a, `M${name}`).nmos(`NB${name}`, `M${name}`, c, '0');
}
const rtl = () => new NetlistBuilder('Wren-8 test').rail('VCC', 5).model('QN', 'npn', { IS: 1e-14, BF: 100 });
const cmos = () => new NetlistBuilder('Wren-8 test').rail('VDD', 5);

interface Case {
  name: string;
  nl: () => FlatNetlist;
  assumptions?: string[];
  options?: unknown;
}
interface Invalid extends Case {
  messageId: string;
  data: Record<string, string | number>;
  /** Parts the proposal saves (removed minus added). */
  delta: Record<string, number>;
  failing?: string[];
}

const valid: Case[] = [
  { name: 'one inverter alone', nl: () => { const b = rtl(); rtlInv(b, '1', 'A', 'Y'); return b.build(); } },
  {
    name: 'inverter feeding a NOR, not an inverter',
    nl: () => {
      const b = rtl();
      rtlInv(b, '1', 'A', 'X');
      b.resistor('RB2', 'X', 'BX', 4700).resistor('RB3', 'C', 'BC', 4700).npn('Q2', 'Y', 'BX', '0').npn('Q3', 'Y', 'BC', '0').resistor('RC2', 'VCC', 'Y', 1000);
      return b.build();
    },
  },
  {
    name: 'middle net with other loads, second-only turned off',
    options: { secondOnly: false },
    nl: () => { const b = cmos(); cmosInv(b, '1', 'A', 'X'); cmosInv(b, '2', 'X', 'Y'); cmosInv(b, '3', 'X', 'Z'); return b.build(); },
  },
  {
    name: 'output named in an assumption stays',
    assumptions: ['!(Y & C)'],
    nl: () => { const b = cmos(); cmosInv(b, '1', 'A', 'X'); cmosInv(b, '2', 'X', 'Y'); return b.build(); },
  },
];

const invalid: Invalid[] = [
  {
    name: 'RTL pair, flat: 2 transistors and 4 resistors go',
    nl: () => { const b = rtl(); rtlInv(b, '1', 'A', 'X'); rtlInv(b, '2', 'X', 'Y'); rtlNor(b, '3', 'Y', 'C', 'Z'); return b.build(); },
    messageId: 'pair',
    data: { first: 'Q1', second: 'Q2', input: 'A', middle: 'X', output: 'Y', loads: 1, place: 'the top level' },
    delta: { transistors: 2, resistors: 4, diodes: 0, gates: 0 },
  },
  {
    name: 'CMOS pair inside slice XSLICE3',
    nl: () => {
      const b = cmos();
      b.within(['XSLICE3'], () => { cmosInv(b, '1', '/D3', 'X'); cmosInv(b, '2', 'X', 'Y'); cmosNand(b, '3', 'Y', '/OE', '/Q3'); });
      return b.build();
    },
    messageId: 'pair',
    data: { first: 'XSLICE3.P1', second: 'XSLICE3.P2', input: 'D3', middle: 'XSLICE3.X', output: 'XSLICE3.Y', loads: 1, place: 'bit 3 of slice XSLICE3' },
    delta: { transistors: 4, resistors: 0, diodes: 0, gates: 0 },
  },
  {
    name: 'gate level: not feeding not',
    nl: () => new NetlistBuilder('g').gate('U1', 'not', ['X', 'A']).gate('U2', 'not', ['Y', 'X']).gate('U3', 'nand', ['Z', 'Y', 'B']).build(),
    messageId: 'pair',
    data: { first: 'U1', second: 'U2', input: 'A', middle: 'X', output: 'Y', loads: 1, place: 'the top level' },
    // static CMOS mapping of two inverters (Weste & Harris, from memory: inverter = 2 transistors)
    delta: { transistors: 4, resistors: 0, diodes: 0, gates: 2 },
  },
  {
    name: 'middle net has another load: only the second inverter goes',
    nl: () => { const b = cmos(); cmosInv(b, '1', 'A', 'X'); cmosInv(b, '2', 'X', 'Y'); cmosNand(b, '3', 'X', 'C', 'Z'); cmosNand(b, '4', 'Y', 'C', 'W'); return b.build(); },
    messageId: 'secondOnly',
    data: { first: 'P1', second: 'P2', input: 'A', middle: 'X', output: 'Y', loads: 1, place: 'the top level' },
    delta: { transistors: 2, resistors: 0, diodes: 0, gates: 0 },
  },
  {
    name: 'RTL: six loads moved onto a 4.7k-pulled line fail fan-out and loaded high level',
    nl: () => {
      const b = rtl();
      rtlNor(b, '0', 'A', 'E', 'S', 4700, 4700);
      rtlInv(b, '1', 'S', 'X');
      rtlInv(b, '2', 'X', 'Y');
      for (let k = 3; k < 9; k++) rtlNor(b, String(k), 'Y', 'C', `Z${k}`, 1000);
      return b.build();
    },
    messageId: 'pair',
    data: { first: 'Q1', second: 'Q2', input: 'S', middle: 'X', output: 'Y', loads: 6, place: 'the top level' },
    delta: { transistors: 2, resistors: 4, diodes: 0, gates: 0 },
    failing: ['fan-out', 'loaded high level'],
  },
];

describe('double-inversion: valid (no finding)', () => {
  it.each(valid)('$name', async (c) => {
    const r = await runOne(doubleInversion, c.nl(), { assumptions: c.assumptions, options: c.options });
    expect(r.ruleErrors).toEqual([]);
    expect(r.findings).toEqual([]);
  });
});

describe('double-inversion: invalid (finding)', () => {
  it.each(invalid)('$name', async (c) => {
    const nl = c.nl();
    const r = await runOne(doubleInversion, nl, { assumptions: c.assumptions, options: c.options });
    expect(r.ruleErrors).toEqual([]);
    expect(r.findings).toHaveLength(1);
    const f = r.findings[0];
    expect(f.messageId).toBe(c.messageId);
    expect(f.data).toEqual(c.data);
    const p = f.proposals[0];
    const { stated, actual } = savingsProperty(nl, p);
    expect(pick(stated)).toMatchObject(c.delta);
    // property: applying the proposal changes part counts by exactly its stated savings
    expect(actual).toEqual(pick(stated));
    const failing = p.margins.filter((m) => m.status === 'fail').map((m) => m.name);
    expect(failing).toEqual(c.failing ?? []);
  });

  it('every proposal is proved equivalent by the scan, and the failing one is marked so', async () => {
    for (const c of invalid) {
      const s = await scanOne(doubleInversion, c.nl());
      const sp = s.findings[0].proposals[0];
      expect(sp.verification.status, c.name).toBe('proved');
      expect(sp.verdict, c.name).toBe(c.failing ? 'failing-margins' : 'ready');
    }
  });

  it('finds the same pair in every slice instance and names each slice', async () => {
    const b = cmos();
    for (let k = 0; k < 8; k++) b.within([`XSLICE${k}`], () => { cmosInv(b, '1', `/D${k}`, 'X'); cmosInv(b, '2', 'X', 'Y'); cmosNand(b, '3', 'Y', '/OE', `/Q${k}`); });
    const r = await runOne(doubleInversion, b.build());
    expect(r.findings.map((f) => f.data.place)).toEqual(Array.from({ length: 8 }, (_, k) => `bit ${k} of slice XSLICE${k}`));
    expect(r.findings.map((f) => f.location.instances)).toEqual(Array.from({ length: 8 }, (_, k) => [`XSLICE${k}`]));
    expect(r.overlaps.edges).toEqual([]);
  });
});

describe('double-inversion: doc examples', () => {
  const doc = readFileSync(path.join(__dirname, 'double-inversion.md'), 'utf8');
  const examples = docExamples(doc);
  it('has examples', () => expect(examples.length).toBeGreaterThanOrEqual(2));
  it.each(examples)('$name', async (ex) => {
    const nl = deckNetlist(ex.deck, `${ex.name}.cir`);
    const s = await scanOne(doubleInversion, nl, { assumptions: ex.assumptions, clockPeriod: ex.clockPeriod });
    expect(s.ruleErrors).toEqual([]);
    expect(s.findings).toHaveLength(ex.findings);
    if (ex.message) expect(s.findings[0].finding.messageId).toBe(ex.message);
    if (ex.verdict) expect(s.findings[0].proposals[0].verdict).toBe(ex.verdict);
  });
});
