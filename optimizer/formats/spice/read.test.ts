// Deck reader: the trade's syntax rules, each error located, warnings beside the design.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { InputError, formatDiagnostic } from '@/optimizer/errors';
import { readSpice, SPICE_TOP } from './read';
import { parseSpiceNumber } from './numbers';
import { validateDesign } from '@/optimizer/netlist/validate';

const fixtures = path.resolve(__dirname, '../../../tests/fixtures/netlists');

/** The InputError reading `text` raises (any other outcome fails the test). */
function refusal(text: string, file = 'd.cir'): InputError {
  try {
    readSpice(text, file);
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error('expected an InputError');
}

function errorsOf(text: string): string[] {
  return refusal(text).diagnostics.filter((d) => d.severity === 'error').map(formatDiagnostic);
}

describe('parseSpiceNumber', () => {
  // Suffix table as in ngspice's manual ("scale factors"), common practice.
  it.each([
    ['10k', 10e3],
    ['10kOhm', 10e3],
    ['1uF', 1e-6],
    ['4.7meg', 4.7e6],
    ['2MEG', 2e6],
    ['3m', 3e-3],
    ['1F', 1e-15],
    ['5p', 5e-12],
    ['1n', 1e-9],
    ['2g', 2e9],
    ['1t', 1e12],
    ['1mil', 25.4e-6],
    ['1e3', 1000],
    ['-2.5', -2.5],
    ['.5', 0.5],
    ['5V', 5],
  ])('%s = %d', (text, value) => {
    expect(parseSpiceNumber(text)).toBeCloseTo(value, 20);
    expect(parseSpiceNumber(text)! / value).toBeCloseTo(1, 12);
  });
  it.each(['abc', '1x.5', '', '--1', '1..2', 'k10'])('%j is not a number', (text) => {
    expect(parseSpiceNumber(text)).toBeUndefined();
  });
});

describe('readSpice', () => {
  it('reads the title, elements, models and kept cards of an RTL inverter', () => {
    const { design, diagnostics } = readSpice(readFileSync(path.join(fixtures, 'rtl-inverter.cir'), 'utf8'), 'rtl.cir');
    expect(design.title).toBe('RTL inverter: one transistor, base and collector resistors');
    expect(diagnostics).toEqual([]);
    const top = design.cells[design.top];
    expect(design.top).toBe(SPICE_TOP);
    expect(top.devices.map((d) => `${d.name}:${d.kind}`)).toEqual(['VCC:vsource', 'VIN:vsource', 'RB:resistor', 'RC:resistor', 'Q1:npn']);
    expect(top.devices.find((d) => d.name === 'RC')!.value).toBe(640);
    expect(top.devices.find((d) => d.name === 'Q1')).toMatchObject({ terminals: ['Y', 'B1', '0'], model: 'QN', loc: { file: 'rtl.cir', line: 7, col: 1 } });
    expect(design.models.QN).toMatchObject({ type: 'npn', params: { IS: 1e-14, BF: 100 } });
    expect(design.extraCards.map((c) => c.text)).toEqual(['.op']);
  });

  it('joins + continuations, drops * and ; comments, ignores case, maps GND to 0', () => {
    const { design } = readSpice(
      ['title', '* comment', 'vcc Vcc gnd', '+ dc 5 ; inline', 'r1 vcc', '* between', '+ out 10KOhm', 'c1 out Gnd 1uF', '.END'].join('\n'),
      'c.cir',
    );
    const devs = design.cells[SPICE_TOP].devices;
    expect(devs.map((d) => [d.name, d.terminals, d.value])).toEqual([
      ['VCC', ['VCC', '0'], 5],
      ['R1', ['VCC', 'OUT'], 10e3],
      ['C1', ['OUT', '0'], 1e-6],
    ]);
  });

  it('substitutes .param values written as {name} or bare names, even before the .param card', () => {
    const { design } = readSpice('t\nR1 a 0 {RLOAD}\nR2 a 0 rload\n.param rload=4.7k\n', 'p.cir');
    expect(design.cells[SPICE_TOP].devices.map((d) => d.value)).toEqual([4700, 4700]);
    expect(design.params).toEqual({ RLOAD: 4700 });
  });

  it('keeps waveform sources as stimulus and DC sources as values', () => {
    const { design } = readSpice('t\nV1 a 0 PULSE(0 5 0 1n 1n 10u 20u)\nV2 b 0 5\nV3 c 0 DC 0 AC 1\nR1 a b 1k\nR2 b c 1k\nR3 c a 1k\n', 's.cir');
    const [v1, v2, v3] = design.cells[SPICE_TOP].devices;
    expect(v1).toMatchObject({ waveform: 'PULSE(0 5 0 1n 1n 10u 20u)' });
    expect(v1.value).toBeUndefined();
    expect(v2.value).toBe(5);
    expect(v3).toMatchObject({ value: 0, params: { AC: '1' } });
  });

  it('reads subcircuits, instances and globals', () => {
    const { design, diagnostics } = readSpice(readFileSync(path.join(fixtures, 'wren8-bus.cir'), 'utf8'), 'w.cir');
    expect(diagnostics).toEqual([]);
    expect(design.cells.SLICE.ports).toEqual(['D', 'Q', 'LOAD', 'CLR']);
    expect(design.cells[SPICE_TOP].instances).toHaveLength(8);
    expect(design.globals).toEqual(['VCC']);
    expect(design.cells.SLICE.devices.find((d) => d.name === 'RBEN')!.value).toBe(470);
  });

  it('keeps .control blocks verbatim', () => {
    const { design } = readSpice('t\nR1 a 0 1k\nV1 a 0 1\n.control\nop\nprint v(a)\n.endc\n.end\n', 'k.cir');
    expect(design.extraCards.map((c) => c.text)).toEqual(['.control\nop\nprint v(a)\n.endc']);
  });

  it('warns on a net only one terminal touches, and on text after .end', () => {
    const { diagnostics } = readSpice('t\nV1 a 0 1\nR1 a b 1k\n.end\nR9 x y 1\n', 'w.cir');
    expect(diagnostics.map(formatDiagnostic)).toEqual([
      'w.cir:3:1: warning: net B in (top) touches only one terminal',
      'w.cir:5:1: warning: text after .end is ignored',
    ]);
  });

  it('treats undriven nets as inputs, not errors', () => {
    const { diagnostics } = readSpice('t\nRB IN B 1k\nRC VCC Y 1k\nQ1 Y B 0 QN\nV1 VCC 0 5\nRL Y 0 10k\n.model QN NPN\n', 'i.cir');
    expect(diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
  });

  it.each([
    ['t\nQ7 a b QN\n.model QN NPN\n', 'd.cir:2:1: Q7 needs 3 or 4 nodes, found 2'],
    ['t\nM1 d g s QN\n.model QN NMOS\n', 'd.cir:2:1: M1 needs 4 nodes, found 3'],
    ['t\nQ1 c b e QX\n', 'd.cir:2:10: unknown model QX (used by Q1)'],
    ['t\nD1 a k\n', 'd.cir:2:1: D1 needs 2 nodes, found 1'],
    ['t\nQ1 c b e DN\n.model DN D\n', 'd.cir:2:10: Q1 needs an npn or pnp model; DN is a d model'],
    ['t\nR1 a b 1x.5\n', "d.cir:2:8: R1 value: '1x.5' is not a number or a known .param"],
    ['t\nR1 a b\n', 'd.cir:2:1: R1 needs a value'],
    ['t\nL1 a b 1u\n', 'd.cir:2:1: inductors (L1) are not supported; elements R C D Q M V I X are'],
    ['t\n.foo 1\n', 'd.cir:2:1: unsupported card .foo'],
    ['t\n.include models.lib\n', 'd.cir:2:1: .include is not supported: upload one self-contained deck with the models and subcircuits in it'],
    ['t\n.subckt A x\nR1 x 0 1\n', 'd.cir:2:1: .subckt A has no .ends'],
    ['t\nX1 a b NOPE\n', 'd.cir:2:1: unknown subcircuit NOPE (used by X1)'],
    ['t\n.subckt A x y\nR1 x y 1\n.ends\nX1 a A\n', 'd.cir:5:1: X1 connects 1 net but subcircuit A has 2 ports'],
    ['t\n.subckt A x\nX1 x B\n.ends\n.subckt B y\nX2 y A\n.ends\n', 'd.cir:6:1: recursive instantiation of subcircuit A: A → B → A'],
    ['t\nR1 a 0 1\nr1 a 0 2\n', 'd.cir:3:1: duplicate name R1 in (top)'],
    ['t\nV1 a 0 5\nV2 a 0 3\nR1 a 0 1k\n', 'd.cir:3:1: shorted rails: net A is held at 5 V by V1 and at 3 V by V2'],
    ['t\nV1 0 0 5\n', 'd.cir:2:1: V1 is shorted: both ends are on net 0'],
    ['t\n.param x=abc\n', "d.cir:2:10: .param X: 'abc' is not a plain number"],
    ['t\n.ends\n', 'd.cir:2:1: .ends without a .subckt'],
    ['t\n.control\nop\n', 'd.cir:2:1: .control block has no .endc'],
    ['t\nV1 a 0 PULSE(0 5\n', 'd.cir:2:8: PULSE( has no closing )'],
    ['', 'd.cir:1:1: the deck is empty (its first line is the title)'],
  ])('reports %j as %s', (text, message) => {
    expect(errorsOf(text)).toContain(message);
  });

  it('reports every error of a deck at once, in line order', () => {
    const errs = errorsOf('t\nQ7 a b QN\nR1 a b 1x.5\n.foo\n.model QN NPN\n');
    expect(errs).toEqual([
      'd.cir:2:1: Q7 needs 3 or 4 nodes, found 2',
      "d.cir:3:8: R1 value: '1x.5' is not a number or a known .param",
      'd.cir:4:1: unsupported card .foo',
    ]);
  });

  it('stops after a bounded number of errors on garbage input', () => {
    const text = 't\n' + 'L1 a b\n'.repeat(5000);
    const e = refusal(text, 'g.cir');
    expect(e.diagnostics.length).toBeLessThanOrEqual(201);
  });
});

describe('terminal counts gathered while reading', () => {
  // The reader counts each cell's terminals as it reads them so validation need not walk the
  // cells again; its warnings must be exactly those of a fresh count over the finished design.
  const decks = [
    't\nR1 a b 1k\nR2 b 0 1k\nR3 c 0 1k\n',
    't\nX1 in out mid SUB\n.subckt SUB p q r\nR1 p n1 1k\nQ1 n1 q 0 QN\n.ends\nR9 in lone 1k\n.model QN NPN\nVCC in 0 DC 5\n',
    't\n.global VCC\nVCC VCC 0 DC 5\n.subckt A x y\nR1 x VCC 1k\nR2 y dangling 1k\n.ends A\nX1 s1 s2 A\n.subckt B z\nX2 z z A\n.ends\nX3 s1 B\nR4 s2 0 1k\n',
  ];
  it.each(decks)('agrees with a fresh count on %j', (text) => {
    const r = readSpice(text, 'd.cir');
    const warnings = r.diagnostics.filter((d) => d.code.startsWith('netlist.')).map(formatDiagnostic);
    const fresh = validateDesign(r.design, { cellNoun: 'subcircuit' })
      .filter((d) => d.severity === 'warning')
      .sort((a, b) => (a.loc?.line ?? 0) - (b.loc?.line ?? 0) || (a.loc?.col ?? 0) - (b.loc?.col ?? 0))
      .map(formatDiagnostic);
    expect(warnings.length).toBeGreaterThan(0);
    expect(warnings).toEqual(fresh);
  });

  it('finds repeated device and instance names as it reads, as validation reports them', () => {
    const text = [
      't',
      '.subckt A x',
      'R1 x 0 1',
      'X1 x B',
      'R1 x 0 2',
      'X1 x B',
      'R1 x 0 3',
      '.ends',
      '.subckt B y',
      'R1 y 0 1',
      '.ends',
      'R1 a 0 1',
      'X1 a A',
      'V1 a 0 bogus',
      'V1 a 0 5',
      'r1 a 0 1',
      'X1 a A',
    ].join('\n');
    const e = refusal(text, 'd.cir');
    // the refused V1 joins no cell, so the V1 after it is no repeat; a third R1 repeats the first
    expect(e.diagnostics.filter((d) => d.severity === 'error').map(formatDiagnostic)).toEqual([
      'd.cir:5:1: duplicate name R1 in A',
      'd.cir:6:1: duplicate name X1 in A',
      'd.cir:7:1: duplicate name R1 in A',
      "d.cir:14:8: V1: expected DC value, AC, or a waveform (PULSE PWL SIN EXP SFFM AM TRNOISE TRRANDOM), found 'bogus'",
      'd.cir:16:1: duplicate name R1 in (top)',
      'd.cir:17:1: duplicate name X1 in (top)',
    ]);
  });

  it('does not count the nets of a card that was refused', () => {
    // V1's nets are named before its bad value is found; b must still be a single-terminal net
    const e = refusal('t\nR1 a b 1k\nV1 b 0 bogus\nR2 a 0 1k\n', 'd.cir');
    expect(e.diagnostics.map(formatDiagnostic)).toContain('d.cir:2:1: warning: net B in (top) touches only one terminal');
  });
});
