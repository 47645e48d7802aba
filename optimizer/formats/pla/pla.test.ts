// PLA files: reading with located errors, writing back, and the bridge to gate-level designs.
import { describe, expect, it } from 'vitest';
import { InputError, formatDiagnostic } from '@/optimizer/errors';
import { countParts } from '@/optimizer/netlist/counts';
import { designToPla, plaToDesign } from './design';
import { readPla, writePla } from './pla';

const XOR = ['# two-input xor', '.i 2', '.o 1', '.ilb a b', '.ob y', '.p 2', '01 1', '10 1', '.e'].join('\n');

function errorsOf(text: string): string[] {
  try {
    readPla(text, 'f.pla');
  } catch (e) {
    if (e instanceof InputError) return e.diagnostics.map(formatDiagnostic);
    throw e;
  }
  throw new Error('expected an InputError');
}

describe('readPla / writePla', () => {
  it('reads names, cubes and type, and writes them back', () => {
    const pla = readPla(XOR, 'x.pla');
    expect(pla).toEqual({ inputs: ['a', 'b'], outputs: ['y'], cubes: [{ in: '01', out: '1' }, { in: '10', out: '1' }], type: 'fd' });
    expect(readPla(writePla(pla), 'back.pla')).toEqual(pla);
  });

  it('accepts cubes without a space and output ~', () => {
    const pla = readPla('.i 3\n.o 2\n.type fr\n1-0~1\n.e\n', 'x.pla');
    expect(pla.cubes).toEqual([{ in: '1-0', out: '~1' }]);
    expect(pla.type).toBe('fr');
    expect(pla.inputs).toEqual(['x0', 'x1', 'x2']);
  });

  it.each([
    ['.i 2\n.o 1\n0x 1\n', "f.pla:3:1: inputs of a cube are 0, 1 or -, found '0x'"],
    ['.i 2\n.o 1\n011 1\n', 'f.pla:3:1: a cube needs 2 input and 1 output characters, found 4'],
    ['01 1\n', 'f.pla:1:1: a cube before .i and .o'],
    ['.i 2\n.o 1\n.p 3\n01 1\n', 'f.pla:3:1: .p says 3 cubes but there are 1'],
    ['.i 2\n.o 1\n.type q\n', 'f.pla:3:1: .type must be f, fd, fr or fdr'],
    ['.i 2\n.o 1\n.phase 1\n', 'f.pla:3:1: unsupported PLA keyword .phase'],
    ['.i two\n.o 1\n', 'f.pla:1:1: .i needs one whole number (0–1024)'],
    ['.i 2\n.o 1\n  .ilb a\n', 'f.pla:3:3: .ilb names 1 inputs but .i is 2'],
    // Two ports of one name would be one net: located at the repeat the file wrote.
    ['.i 2\n.o 1\n.ilb a  a\n11 1\n', 'f.pla:3:9: a names two ports'],
    ['.i 2\n.o 1\n.ilb a b\n.ob b\n11 1\n', 'f.pla:4:5: b names two ports'],
    // An output named like an unnamed input (found by the readers' fuzz test).
    ['.i 2\n.o 1\n.ob x1\n11 1\n', 'f.pla:3:5: x1 names two ports (without .ilb the inputs are named x0, x1, …)'],
    ['.i 1\n.o 1\n.ilb f0\n1 1\n', 'f.pla:3:6: f0 names two ports (without .ob the outputs are named f0, f1, …)'],
  ])('%j → %s', (text, message) => {
    expect(errorsOf(text)).toContain(message);
  });
});

describe('PLA ↔ gate-level design', () => {
  it('builds one AND per cube, one OR per output and shared input inverters', () => {
    const d = plaToDesign(readPla(XOR, 'x.pla'));
    expect(countParts(d).gates).toBe(2 + 1 + 2);
    const ops = d.cells[d.top].devices.map((x) => x.op).sort();
    expect(ops).toEqual(['and', 'and', 'not', 'not', 'or']);
  });

  it('evaluates a design back to the same truth table', () => {
    // Majority of three, mathematics: true when two or more inputs are 1.
    const maj = readPla('.i 3\n.o 1\n.ilb a b c\n.ob m\n11- 1\n1-1 1\n-11 1\n.e\n', 'm.pla');
    const table = designToPla(plaToDesign(maj));
    expect(table.cubes.map((c) => c.in)).toEqual(['011', '101', '110', '111']);
  });

  it('evaluates long gate chains without recursion (a 100,000-buffer chain is the identity)', () => {
    const n = 100_000;
    const devices = Array.from({ length: n }, (_, k) => ({ name: `b${k}`, kind: 'gate' as const, op: 'buf' as const, terminals: [k === n - 1 ? 'y' : `n${k + 1}`, k === 0 ? 'a' : `n${k}`], params: {} }));
    const design = {
      title: 'chain', format: 'verilog' as const, top: 'c', models: {}, globals: [], params: {}, extraCards: [],
      cells: { c: { name: 'c', ports: ['a', 'y'], directions: { a: 'input' as const, y: 'output' as const }, devices, instances: [] } },
    };
    expect(designToPla(design).cubes).toEqual([{ in: '1', out: '1' }]);
  });

  it('keeps inner nets apart from ports that bear their names', () => {
    // Inputs named like the inverted-input, cube and constant nets the bridge makes.
    const text = '.i 3\n.o 2\n.ilb a a_N CUBE0\n.ob CONST1 CONST0\n0-1 10\n-0- 10\n1-- 00\n.e\n';
    const pla = readPla(text, 'n.pla');
    const table = designToPla(plaToDesign(pla));
    // Truth table by hand: CONST1 = a'·CUBE0 + a_N'; CONST0 is always 0.
    const expected = [];
    for (let m = 0; m < 8; m++) {
      const [a, aN, c] = [(m >> 2) & 1, (m >> 1) & 1, m & 1];
      if ((!a && c) || !aN) expected.push(m.toString(2).padStart(3, '0'));
    }
    expect(table.cubes.map((c) => c.in)).toEqual(expected);
    expect(table.cubes.every((c) => c.out === '10')).toBe(true);
  });

  it('handles constant outputs', () => {
    const pla = readPla('.i 1\n.o 2\n.ob one zero\n- 10\n.e\n', 'c.pla');
    const table = designToPla(plaToDesign(pla));
    expect(table.cubes).toEqual([
      { in: '0', out: '10' },
      { in: '1', out: '10' },
    ]);
  });
});
