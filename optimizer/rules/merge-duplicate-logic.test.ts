// merge-duplicate-logic: valid cases (no finding) and invalid ones (message id, data, part delta),
// the fewest drivers that keep fan-out, hierarchy, gate level, the savings property and the doc's
// examples run as tests.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { NetlistBuilder } from '../netlist/build';
import type { FlatNetlist } from '../netlist/ir';
import { mergeDuplicateLogic } from './merge-duplicate-logic';
import { deckNetlist, docExamples, pick, runOne, savingsProperty, scanOne } from './support/rule-test-kit';

const rtl = () => new NetlistBuilder('Wren-8 test').rail('VCC', 5).model('QN', 'npn', { IS: 1e-14, BF: 100 });
const cmos = () => new NetlistBuilder('Wren-8 test').rail('VDD', 5);
function rtlInv(b: NetlistBuilder, name: string, input: string, out: string, rc = 1000, rb = 4700): void {
  b.resistor(`RB${name}`, input, `B${name}`, rb).npn(`Q${name}`, out, `B${name}`, '0').resistor(`RC${name}`, 'VCC', out, rc);
}
function cmosNand(b: NetlistBuilder, name: string, a: string, c: string, out: string): void {
  b.pmos(`PA${name}`, out, a, 'VDD', { bulk: 'VDD' }).pmos(`PB${name}`, out, c, 'VDD', { bulk: 'VDD' });
  b.nmos(`NA${name}`, out, a, `M${name}`).nmos(`NB${name}`, `M${name}`, c, '0');
}
/** Slices XS0..XS(n−1), each inverting the shared /LOAD strobe and driving `loads` RTL bases. */
function strobeSlices(n: number, loads: number): FlatNetlist {
  const b = rtl();
  for (let k = 0; k < n; k++) {
    b.within([`XS${k}`], () => {
      rtlInv(b, '1', '/LOAD', 'LDN');
      for (let j = 0; j < loads; j++) {
        // a NOR of the strobe and a per-load data bit: distinct functions, so only the strobe repeats
        rtlInv(b, `L${j}`, 'LDN', `Y${j}`);
        b.resistor(`RD${j}`, `/D${k}_${j}`, `BD${j}`, 4700).npn(`QD${j}`, `Y${j}`, `BD${j}`, '0');
      }
    });
  }
  return b.build();
}

interface Case {
  name: string;
  nl: () => FlatNetlist;
  assumptions?: string[];
}
interface Invalid extends Case {
  messageId: string;
  data: Record<string, string | number>;
  delta: Record<string, number>;
}

const valid: Case[] = [
  { name: 'one gate', nl: () => { const b = cmos(); cmosNand(b, '1', 'A', 'B', 'Y'); return b.build(); } },
  { name: 'same function of different nets', nl: () => { const b = cmos(); cmosNand(b, '1', 'A', 'B', 'Y'); cmosNand(b, '2', 'A', 'C', 'Z'); return b.build(); } },
  { name: 'different functions of the same nets', nl: () => new NetlistBuilder('g').gate('U1', 'nand', ['Y', 'A', 'B']).gate('U2', 'nor', ['Z', 'A', 'B']).build() },
  {
    name: 'a duplicate named in an assumption stays',
    assumptions: ['!(Z & C)'],
    nl: () => new NetlistBuilder('g').gate('U1', 'and', ['Y', 'A', 'B']).gate('U2', 'and', ['Z', 'B', 'A']).build(),
  },
];

const invalid: Invalid[] = [
  {
    name: 'CMOS NAND twice, operands swapped',
    nl: () => { const b = cmos(); cmosNand(b, '1', 'A', 'B', 'Y'); cmosNand(b, '2', 'B', 'A', 'Z'); return b.build(); },
    messageId: 'merge',
    data: { count: 2, fn: '!(A & B)', inputs: 'A and B', places: 'the top level', kept: 'Y', removed: 'Z', drivers: 1, loads: 0 },
    delta: { transistors: 4, resistors: 0, diodes: 0, gates: 0 },
  },
  {
    name: 'RTL strobe inverter in four slices, one load each',
    nl: () => strobeSlices(4, 1),
    messageId: 'merge',
    data: {
      count: 4,
      fn: '!LOAD',
      inputs: 'LOAD',
      places: 'bit 0 of slice XS0, bit 1 of slice XS1, bit 2 of slice XS2 and 1 more',
      kept: 'XS0.LDN',
      removed: 'XS1.LDN, XS2.LDN and XS3.LDN',
      drivers: 1,
      loads: 4,
    },
    // Mano, Digital Design (from memory): an RTL inverter is 1 transistor + 2 resistors
    delta: { transistors: 3, resistors: 6, diodes: 0, gates: 0 },
  },
  {
    name: 'eight slices: one driver of eight loads fails RTL fan-out 5, two drivers of four pass',
    nl: () => strobeSlices(8, 1),
    messageId: 'split',
    data: {
      count: 8,
      fn: '!LOAD',
      inputs: 'LOAD',
      places: 'bit 0 of slice XS0, bit 1 of slice XS1, bit 2 of slice XS2 and 5 more',
      kept: 'XS0.LDN and XS1.LDN',
      removed: 'XS2.LDN, XS3.LDN, XS4.LDN, XS5.LDN and 2 more',
      drivers: 2,
      loads: 8,
    },
    delta: { transistors: 6, resistors: 12, diodes: 0, gates: 0 },
  },
  {
    name: 'gate level: the same AND twice',
    nl: () => new NetlistBuilder('g').gate('U1', 'and', ['Y', 'A', 'B']).gate('U2', 'and', ['Z', 'B', 'A']).gate('U3', 'nor', ['W', 'Y', 'Z']).build(),
    messageId: 'merge',
    data: { count: 2, fn: 'A & B', inputs: 'A and B', places: 'the top level', kept: 'Y', removed: 'Z', drivers: 1, loads: 2 },
    // static CMOS: AND-2 = NAND-2 (4) + inverter (2) (Weste & Harris, from memory)
    delta: { transistors: 6, resistors: 0, diodes: 0, gates: 1 },
  },
];

describe('merge-duplicate-logic: valid (no finding)', () => {
  it.each(valid)('$name', async (c) => {
    const r = await runOne(mergeDuplicateLogic, c.nl(), { assumptions: c.assumptions });
    expect(r.ruleErrors).toEqual([]);
    expect(r.findings).toEqual([]);
  });
});

describe('merge-duplicate-logic: invalid (finding)', () => {
  it.each(invalid)('$name', async (c) => {
    const nl = c.nl();
    const r = await runOne(mergeDuplicateLogic, nl, { assumptions: c.assumptions });
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
    expect(p.margins.filter((m) => m.status === 'fail')).toEqual([]);
  });

  it('scan proves every merge and marks it ready', async () => {
    for (const c of invalid) {
      const s = await scanOne(mergeDuplicateLogic, c.nl());
      expect(s.findings[0].proposals[0].verification.status, c.name).toBe('proved');
      expect(s.findings[0].proposals[0].verdict, c.name).toBe('ready');
    }
  });

  it('when no smaller set of drivers keeps margins, the merge is reported failing', async () => {
    // two slices whose strobe inverters carry 4 loads each: 8 on one driver fails RTL fan-out 5
    const nl = strobeSlices(2, 4);
    const s = await scanOne(mergeDuplicateLogic, nl);
    expect(s.findings).toHaveLength(1);
    expect(s.findings[0].finding.messageId).toBe('failing');
    expect(s.findings[0].proposals[0].verdict).toBe('failing-margins');
    expect(s.findings[0].proposals[0].margins.find((m) => m.name === 'fan-out')).toMatchObject({ value: 8, limit: 5, status: 'fail' });
  });
});

describe('merge-duplicate-logic: doc examples', () => {
  const examples = docExamples(readFileSync(path.join(__dirname, 'merge-duplicate-logic.md'), 'utf8'));
  it('has examples', () => expect(examples.length).toBeGreaterThanOrEqual(2));
  it.each(examples)('$name', async (ex) => {
    const s = await scanOne(mergeDuplicateLogic, deckNetlist(ex.deck, `${ex.name}.cir`), { assumptions: ex.assumptions });
    expect(s.ruleErrors).toEqual([]);
    expect(s.findings).toHaveLength(ex.findings);
    if (ex.message) expect(s.findings[0].finding.messageId).toBe(ex.message);
    if (ex.verdict) expect(s.findings[0].proposals[0].verdict).toBe(ex.verdict);
  });
});
