// constant-input: valid cases (no finding) and invalid ones (message id, data, part delta) on RTL,
// DTL, CMOS and gate-level designs, inputs tied to rails or held by assumptions, across hierarchy;
// the savings property, the scan's proof under the assumptions listed, and the doc's examples.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { NetlistBuilder } from '../netlist/build';
import type { FlatNetlist } from '../netlist/ir';
import { constantInput } from './constant-input';
import { deckNetlist, docExamples, pick, runOne, savingsProperty, scanOne } from './support/rule-test-kit';

const rtl = () => new NetlistBuilder('Wren-8 test').rail('VCC', 5).model('QN', 'npn', { IS: 1e-14, BF: 100 });
const cmos = () => new NetlistBuilder('Wren-8 test').rail('VDD', 5);
function cmosNand(b: NetlistBuilder, name: string, ins: string[], out: string): void {
  ins.forEach((a, i) => b.pmos(`P${name}${i}`, out, a, 'VDD', { bulk: 'VDD' }));
  ins.forEach((a, i) => b.nmos(`N${name}${i}`, i === 0 ? out : `M${name}${i}`, a, i === ins.length - 1 ? '0' : `M${name}${i + 1}`));
}
function rtlNor(b: NetlistBuilder, ins: string[], out: string): void {
  b.resistor('RC', 'VCC', out, 1000);
  ins.forEach((a) => b.resistor(`R${a}`, a, `B${a}`, 4700).npn(`Q${a}`, out, `B${a}`, '0'));
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
  relies: string[];
}

const valid: Case[] = [
  { name: 'NAND with free inputs', nl: () => { const b = cmos(); cmosNand(b, '1', ['A', 'B'], 'Y'); return b.build(); } },
  { name: 'NAND input on ground: the output is constant, left alone', nl: () => { const b = cmos(); cmosNand(b, '1', ['A', '0'], 'Y'); return b.build(); } },
  { name: 'an assumption that fixes no input of the gate', assumptions: ['!(A & B)'], nl: () => { const b = cmos(); cmosNand(b, '1', ['A', 'B'], 'Y'); return b.build(); } },
  { name: 'gate-level AND with an input held 0 is constant, left alone', assumptions: ['!T'], nl: () => new NetlistBuilder('g').gate('U1', 'and', ['Y', 'A', 'T']).build() },
];

const invalid: Invalid[] = [
  {
    name: 'CMOS NAND-2 with an input tied to VDD becomes an inverter',
    nl: () => { const b = cmos(); cmosNand(b, '1', ['A', 'VDD'], 'Y'); return b.build(); },
    messageId: 'simplify',
    data: { gate: 'P10', place: 'the top level', inputs: 'input VDD on a 5 V rail', removed: 2 },
    // Weste & Harris (from memory): NAND-2 is 4 transistors, an inverter 2
    delta: { transistors: 2, resistors: 0, diodes: 0, gates: 0 },
    relies: [],
  },
  {
    name: 'CMOS NAND-3 in slice XSLICE5 with C held high by an assumption',
    assumptions: ['C'],
    nl: () => { const b = cmos(); b.within(['XSLICE5'], () => cmosNand(b, '1', ['/A', '/B', '/C'], 'Y')); return b.build(); },
    messageId: 'simplify',
    data: { gate: 'XSLICE5.P10', place: 'bit 5 of slice XSLICE5', inputs: 'input C held at 1 by A1', removed: 2 },
    delta: { transistors: 2, resistors: 0, diodes: 0, gates: 0 },
    relies: ['A1'],
  },
  {
    name: 'RTL NOR-3 with TEST held low: its transistor and base resistor go',
    assumptions: ['!TEST'],
    nl: () => { const b = rtl(); rtlNor(b, ['A', 'B', 'TEST'], 'Y'); return b.build(); },
    messageId: 'simplify',
    data: { gate: 'QA', place: 'the top level', inputs: 'input TEST held at 0 by A1', removed: 2 },
    // Mano (from memory): RTL NOR-n = n transistors, n + 1 resistors
    delta: { transistors: 1, resistors: 1, diodes: 0, gates: 0 },
    relies: ['A1'],
  },
  {
    name: 'RTL NOR-3 with its first two inputs strapped to a 0 V rail: named by the transistor that stays',
    // the strapped base resistors are read as the bases' bleeds; the rail is still the reason
    nl: () => { const b = rtl().rail('D', 0).rail('K', 0); rtlNor(b, ['D', 'K', 'A'], 'Y'); return b.build(); },
    messageId: 'simplify',
    data: { gate: 'QA', place: 'the top level', inputs: 'input D on a 0 V rail and input K on a 0 V rail', removed: 4 },
    delta: { transistors: 2, resistors: 2, diodes: 0, gates: 0 },
    relies: [],
  },
  {
    name: 'RTL summed-base NOR with one input held low: its base resistor goes',
    assumptions: ['!TEST'],
    nl: () => rtl().resistor('RC', 'VCC', 'Y', 1000).resistor('RA', 'A', 'BQ', 10e3).resistor('RT', 'TEST', 'BQ', 10e3).npn('Q1', 'Y', 'BQ', '0').build(),
    messageId: 'simplify',
    data: { gate: 'Q1', place: 'the top level', inputs: 'input TEST held at 0 by A1', removed: 1 },
    delta: { transistors: 0, resistors: 1, diodes: 0, gates: 0 },
    relies: ['A1'],
  },
  {
    name: 'DTL NAND-3 with an input diode on VCC: the diode goes',
    nl: () =>
      rtl()
        .resistor('RP', 'VCC', 'P', 2000)
        .diode('DA', 'P', 'A')
        .diode('DB', 'P', 'B')
        .diode('DC', 'P', 'VCC')
        .diode('DS1', 'P', 'X')
        .diode('DS2', 'X', 'BASE')
        .resistor('RB', 'BASE', '0', 5000)
        .npn('Q1', 'Y', 'BASE', '0')
        .resistor('RC', 'VCC', 'Y', 2000)
        .build(),
    messageId: 'simplify',
    data: { gate: 'Q1', place: 'the top level', inputs: 'input VCC on a 5 V rail', removed: 1 },
    delta: { transistors: 0, resistors: 0, diodes: 1, gates: 0 },
    relies: [],
  },
  {
    name: 'gate level: NAND-3 with an input on the supply becomes NAND-2',
    nl: () => new NetlistBuilder('g').rail('VDD', 5).gate('U1', 'nand', ['Y', 'A', 'B', 'VDD']).gate('U2', 'not', ['Z', 'Y']).build(),
    messageId: 'gate',
    data: { gate: 'U1', place: 'the top level', inputs: 'input VDD on a 5 V rail', result: 'nand(A, B)' },
    delta: { transistors: 2, resistors: 0, diodes: 0, gates: 0 },
    relies: [],
  },
  {
    name: 'gate level: AND with an input held high is a wire',
    assumptions: ['EN'],
    nl: () => new NetlistBuilder('g').gate('U1', 'and', ['Y', 'A', 'EN']).gate('U2', 'nor', ['Z', 'Y', 'B']).build(),
    messageId: 'gate',
    data: { gate: 'U1', place: 'the top level', inputs: 'input EN held at 1 by A1', result: 'a wire from A' },
    delta: { transistors: 6, resistors: 0, diodes: 0, gates: 1 },
    relies: ['A1'],
  },
  {
    name: 'gate level: XOR with an input held high is an inverter',
    assumptions: ['INV'],
    nl: () => new NetlistBuilder('g').gate('U1', 'xor', ['Y', 'A', 'INV']).build(),
    messageId: 'gate',
    data: { gate: 'U1', place: 'the top level', inputs: 'input INV held at 1 by A1', result: 'not(A)' },
    delta: { transistors: 14, resistors: 0, diodes: 0, gates: 0 },
    relies: ['A1'],
  },
];

describe('constant-input: valid (no finding)', () => {
  it.each(valid)('$name', async (c) => {
    const r = await runOne(constantInput, c.nl(), { assumptions: c.assumptions });
    expect(r.ruleErrors).toEqual([]);
    expect(r.findings).toEqual([]);
  });
});

describe('constant-input: invalid (finding)', () => {
  it.each(invalid)('$name', async (c) => {
    const nl = c.nl();
    const r = await runOne(constantInput, nl, { assumptions: c.assumptions });
    expect(r.ruleErrors).toEqual([]);
    expect(r.findings).toHaveLength(1);
    const f = r.findings[0];
    expect(f.messageId).toBe(c.messageId);
    expect(f.data).toEqual(c.data);
    const p = f.proposals[0];
    expect(p.assumptions).toEqual(c.relies);
    const { stated, actual } = savingsProperty(nl, p);
    expect(pick(stated)).toMatchObject(c.delta);
    // property: applying the proposal changes part counts by exactly its stated savings
    expect(actual).toEqual(pick(stated));
  });

  it('the scan proves each rewrite under exactly the assumptions it lists', async () => {
    for (const c of invalid) {
      const s = await scanOne(constantInput, c.nl(), { assumptions: c.assumptions });
      const sp = s.findings[0].proposals[0];
      expect(sp.verification.status, c.name).toBe('proved');
      expect(sp.verification.assumptions, c.name).toEqual(c.relies);
      expect(sp.verdict, c.name).toBe('ready');
    }
  });

  it('without the assumption the held input is free and nothing is proposed', async () => {
    const nl = invalid[2].nl();
    expect((await runOne(constantInput, nl)).findings).toEqual([]);
  });
});

describe('constant-input: the same tie-off in every instance of a slice', () => {
  // Four instances of one NAND-3 slice whose third input is strapped to VDD; the last slice's
  // output also drives a bus inverter, so its fan-out margin differs and it is its own finding.
  const deck = [
    'Wren-8 decode slices with a strapped input',
    '.global VDD',
    'VDD VDD 0 DC 5',
    '.subckt DEC A B Y',
    'MP1 Y A VDD VDD PM',
    'MP2 Y B VDD VDD PM',
    'MP3 Y VDD VDD VDD PM',
    'MN1 Y A M1 0 NM',
    'MN2 M1 B M2 0 NM',
    'MN3 M2 VDD 0 0 NM',
    '.ends DEC',
    'X0 A0 B Y0 DEC',
    'X1 A1 B Y1 DEC',
    'X2 A2 B Y2 DEC',
    'X3 A3 B Y3 DEC',
    'MPB Z Y3 VDD VDD PM',
    'MNB Z Y3 0 0 NM',
    '.model NM NMOS (VTO=0.7 KP=50u)',
    '.model PM PMOS (VTO=-0.7 KP=20u)',
    '.end',
  ].join('\n');

  it('reports identical copies as one finding whose proposal takes the parts of every copy', async () => {
    const nl = deckNetlist(deck, 'dec.cir');
    const r = await runOne(constantInput, nl);
    expect(r.ruleErrors).toEqual([]);
    const each = r.findings.find((f) => f.messageId === 'simplifyEach')!;
    expect(each.data).toMatchObject({ count: 3, cell: 'DEC', removed: 2, total: 6, inputs: 'input VDD on a 5 V rail' });
    expect(each.location.instances).toEqual(['X0', 'X1', 'X2']);
    expect([...each.proposals[0].edit.removeDevices].sort()).toEqual(['X0.MN3', 'X0.MP3', 'X1.MN3', 'X1.MP3', 'X2.MN3', 'X2.MP3']);
    // the copy with another load stays on its own
    const alone = r.findings.filter((f) => f.messageId === 'simplify');
    expect(alone.map((f) => f.location.instances)).toEqual([['X3']]);
    const { stated, actual } = savingsProperty(nl, each.proposals[0]);
    // Weste & Harris (from memory): a NAND-3 that becomes a NAND-2 loses one transistor of each kind
    expect(pick(stated)).toMatchObject({ transistors: 6 });
    expect(actual).toEqual(pick(stated));
  });

  it('the scan proves the grouped rewrite', async () => {
    const s = await scanOne(constantInput, deckNetlist(deck, 'dec.cir'));
    expect(s.findings.map((f) => f.proposals[0].verification.status)).toEqual(['proved', 'proved']);
  });
});

describe('constant-input: doc examples', () => {
  const examples = docExamples(readFileSync(path.join(__dirname, 'constant-input.md'), 'utf8'));
  it('has examples', () => expect(examples.length).toBeGreaterThanOrEqual(2));
  it.each(examples)('$name', async (ex) => {
    const s = await scanOne(constantInput, deckNetlist(ex.deck, `${ex.name}.cir`), { assumptions: ex.assumptions });
    expect(s.ruleErrors).toEqual([]);
    expect(s.findings).toHaveLength(ex.findings);
    if (ex.message) expect(s.findings[0].finding.messageId).toBe(ex.message);
    if (ex.verdict) expect(s.findings[0].proposals[0].verdict).toBe(ex.verdict);
  });
});
