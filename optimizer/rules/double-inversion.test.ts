// double-inversion: valid cases (no finding) and invalid ones (finding, message id, data, part
// delta), across hierarchy and at gate level; NOR and NAND gates whose other inputs are tied to
// rails; margins that fail; the savings property; the doc's examples run as tests.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { NetlistBuilder } from '../netlist/build';
import type { FlatNetlist } from '../netlist/ir';
import { extractLogic } from '../extract';
import { constantInput } from './constant-input';
import { doubleInversion } from './double-inversion';
import { runRules } from './run-rules';
import { verifyProposal } from './scan';
import { deckNetlist, docExamples, pick, runOne, savingsProperty, scanOne } from './support/rule-test-kit';
import type { Rule } from './types';

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

/**
 * A register bit whose data and clear inputs are tied to 0 V rails: QEN inverts LD onto ENB, and
 * Q = NOR(D, ENB, CLR) = !ENB, read by nothing but a 100k load to ground (an output pin).
 *
 *   LD ─RBEN─┤QEN├─ ENB ─RBE─┤QE ├─┐
 *              D (0 V) ─RBD─┤QD ├─┼─ Q ─RL─ 0     (RCQ from VCC to Q, RCEN from VCC to ENB)
 *            CLR (0 V) ─RBC─┤QCLR├┘
 */
function tiedBit(o: { enbLoad?: boolean; spare?: boolean } = {}): FlatNetlist {
  const b = rtl().rail('D', 0).rail('CLR', 0);
  b.resistor('RBEN', 'LD', 'BEN', 470).npn('QEN', 'ENB', 'BEN', '0', { model: 'QN' }).resistor('RCEN', 'VCC', 'ENB', 640);
  b.resistor('RBD', 'D', 'BD', 470).npn('QD', 'Q', 'BD', '0', { model: 'QN' });
  b.resistor('RBE', 'ENB', 'BE', 470).npn('QE', 'Q', 'BE', '0', { model: 'QN' });
  b.resistor('RBC', 'CLR', 'BC', 1000).npn('QCLR', 'Q', 'BC', '0', { model: 'QN' });
  b.resistor('RCQ', 'VCC', 'Q', 640).resistor('RL', 'Q', '0', 100000);
  if (o.enbLoad) rtlNor(b, 'S', 'ENB', 'K', 'S');
  // a spare input pin with only a pull-down: a net a wrong rewrite could take Q's loads to
  if (o.spare) b.resistor('RSP', 'SPARE', '0', 10000);
  return b.build();
}
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
    name: 'inverter feeding a NOR whose other input is tied high (constant output)',
    nl: () => { const b = rtl(); rtlInv(b, '1', 'A', 'X'); rtlNor(b, '2', 'X', 'VCC', 'Y'); return b.build(); },
  },
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
  {
    name: 'RTL NOR whose other inputs are tied to 0 V as the second inverter: named by QE, its tied parts go too',
    nl: () => tiedBit(),
    messageId: 'pairTied',
    data: { first: 'QEN', second: 'QE', input: 'LD', middle: 'ENB', output: 'Q', loads: 1, place: 'the top level', tied: 'QD on D, QCLR on CLR', tiedParts: 4 },
    // QEN, RBEN, RCEN; QE, RBE, RCQ; and the never-conducting QD, RBD, QCLR, RBC
    delta: { transistors: 4, resistors: 6, diodes: 0, gates: 0 },
  },
  {
    name: 'the same NOR when ENB has another load: only its gate goes, tied parts with it',
    nl: () => tiedBit({ enbLoad: true }),
    messageId: 'secondOnlyTied',
    data: { first: 'QEN', second: 'QE', input: 'LD', middle: 'ENB', output: 'Q', loads: 1, place: 'the top level', tied: 'QD on D, QCLR on CLR', tiedParts: 4 },
    delta: { transistors: 3, resistors: 4, diodes: 0, gates: 0 },
  },
  {
    name: 'CMOS NAND with one input on VDD as the second inverter',
    nl: () => { const b = cmos(); cmosInv(b, '1', 'A', 'X'); cmosNand(b, '2', 'X', 'VDD', 'Y'); cmosNand(b, '3', 'Y', 'C', 'Z'); return b.build(); },
    messageId: 'pairTied',
    data: { first: 'P1', second: 'PA2', input: 'A', middle: 'X', output: 'Y', loads: 1, place: 'the top level', tied: 'NB2 on VDD, PB2 on VDD', tiedParts: 2 },
    delta: { transistors: 6, resistors: 0, diodes: 0, gates: 0 },
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

  it('the scan compares the output whose loads move onto a primary input, and refutes a wrong target', async () => {
    // Q is read by no stage (an output pin), and LD by none in the proof's region: Q is still
    // compared, as the net it was merged into.
    const nl = tiedBit({ spare: true });
    const s = await scanOne(doubleInversion, nl);
    const sp = s.findings[0].proposals[0];
    expect(sp.verification).toMatchObject({ status: 'proved', compared: expect.arrayContaining(['Q']) });
    const edit = { ...sp.proposal.edit, mergeNets: [{ keep: 'SPARE', remove: 'Q' }] };
    const wrong = verifyProposal({ nl, view: extractLogic(nl) }, { ...sp.proposal, edit }, []);
    expect(wrong.status).toBe('refuted');
    expect(wrong.counterexample!.LD).not.toBe(wrong.counterexample!.SPARE);
  });

  it('agrees with constant-input on the tied-off parts: its proposal takes them too, and the two overlap', async () => {
    const nl = tiedBit();
    const r = await runRules(nl, extractLogic(nl), { rules: { [doubleInversion.id]: doubleInversion, [constantInput.id]: constantInput } as Record<string, Rule> });
    expect(r.ruleErrors).toEqual([]);
    const byRule = Object.fromEntries(r.findings.map((f) => [f.ruleId, f]));
    const tiedOff = ['QD', 'RBD', 'QCLR', 'RBC'];
    expect([...byRule['constant-input'].proposals[0].edit.removeDevices].sort()).toEqual([...tiedOff].sort());
    expect(byRule['double-inversion'].proposals[0].edit.removeDevices).toEqual(expect.arrayContaining(tiedOff));
    expect(r.overlaps.edges).toHaveLength(1);
    expect([...r.overlaps.edges[0].devices].sort()).toEqual([...tiedOff].sort());
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
