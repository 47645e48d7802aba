// Proves the mapped networks compute their covers and cost the textbook part counts per family.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { cubeFromString, type MultiCover } from './cubes';
import { gateParts } from './family-parts';
import { evaluateNetwork, mapCover } from './map-family';
import { minimiseQm } from './quine-mccluskey';
import { fromMinterms, getBit } from './truth-table';

const cover = (inputs: string[], outs: Record<string, string[]>): MultiCover => ({
  inputs,
  outputs: Object.entries(outs).map(([name, cubes]) => ({ name, cover: cubes.map((c) => cubeFromString(c, inputs.length)) })),
});

describe('gate part counts per family', () => {
  it('RTL NOR-n: n transistors, n + 1 resistors; inverter 1 + 2', () => {
    // Mano, Digital Design, digital integrated circuits chapter (from memory).
    for (const n of [2, 3, 4]) expect(gateParts('rtl', 'nor', n)).toMatchObject({ transistors: n, resistors: n + 1, diodes: 0 });
    expect(gateParts('rtl', 'not', 1)).toMatchObject({ transistors: 1, resistors: 2 });
  });
  it('DTL NAND-n: 1 transistor, n + 2 diodes, 3 resistors', () => {
    // Mano, Digital Design, digital integrated circuits chapter (from memory).
    for (const n of [2, 3, 4]) expect(gateParts('dtl', 'nand', n)).toMatchObject({ transistors: 1, diodes: n + 2, resistors: 3 });
  });
  it('CMOS NAND-n and NOR-n: 2n transistors; inverter 2', () => {
    // Weste & Harris, CMOS VLSI Design (from memory).
    for (const n of [2, 3]) {
      expect(gateParts('cmos', 'nand', n).transistors).toBe(2 * n);
      expect(gateParts('cmos', 'nor', n).transistors).toBe(2 * n);
    }
    expect(gateParts('cmos', 'not', 1).transistors).toBe(2);
  });
});

describe('mapping single gates', () => {
  it("maps a'b'c' to one RTL NOR-3 (3 transistors, 4 resistors)", () => {
    // Mano (from memory): RTL NOR-3 = 3 transistors, 4 resistors.
    const net = mapCover(cover(['a', 'b', 'c'], { F: ['000'] }), 'rtl');
    expect(net.gates).toEqual([{ op: 'nor', inputs: ['a', 'b', 'c'], output: 'F' }]);
    expect(net.parts).toMatchObject({ transistors: 3, resistors: 4, diodes: 0 });
  });
  it("maps a' + b' + c' to one DTL NAND-3 (1 transistor, 5 diodes, 3 resistors)", () => {
    // Mano (from memory): DTL NAND-3 = 1 transistor, 5 diodes, 3 resistors.
    const net = mapCover(cover(['a', 'b', 'c'], { F: ['0--', '-0-', '--0'] }), 'dtl');
    expect(net.gates).toEqual([{ op: 'nand', inputs: ['a', 'b', 'c'], output: 'F' }]);
    expect(net.parts).toMatchObject({ transistors: 1, diodes: 5, resistors: 3 });
  });
  it('maps CMOS XOR as NAND–NAND with two shared input inverters (16 transistors)', () => {
    // Weste & Harris (from memory): 2 inverters × 2 + 3 NAND-2 × 4 = 16.
    const net = mapCover(cover(['a', 'b'], { F: ['01', '10'] }), 'cmos');
    expect(net.invertedInputs).toEqual(['a', 'b']);
    expect(net.parts.transistors).toBe(16);
  });
  it('shares input inverters across outputs', () => {
    // F = a'b + ac and G = a'c + ab both need a': one inverter (2) + 6 NAND-2 (24) = 26.
    const net = mapCover(cover(['a', 'b', 'c'], { F: ['01-', '1-1'], G: ['0-1', '11-'] }), 'cmos');
    expect(net.invertedInputs).toEqual(['a']);
    expect(net.parts.transistors).toBe(26);
    expect(net.gates.filter((g) => g.op === 'not' && g.inputs[0] === 'a')).toHaveLength(1);
  });
  it('needs no inverter for a complement that already exists as a net', () => {
    const net = mapCover(cover(['a', 'b'], { F: ['01', '10'] }), 'cmos', { freeComplements: new Set(['a', 'b']) });
    expect(net.parts.transistors).toBe(12);
  });
  it('takes the complement cover when it is cheaper in NOR–NOR', () => {
    // F = a + b in RTL: from its own cover NOR-2 + inverter (3 T, 5 R); F' = a'b' gives the same.
    // F = ab (cover of F' = a' + b'): NOR of a', b' needs two inverters; the complement path wins.
    const f = cover(['a', 'b'], { F: ['11'] });
    const fBar = cover(['a', 'b'], { F: ['0-', '-0'] });
    const plain = mapCover(f, 'rtl');
    const both = mapCover(f, 'rtl', { complement: fBar });
    expect(plain.parts.transistors).toBe(4); // two input inverters + NOR-2
    expect(both.parts.transistors).toBeLessThanOrEqual(plain.parts.transistors);
    for (const a of [false, true]) for (const b of [false, true]) expect(evaluateNetwork(both, { a, b }).F).toBe(a && b);
  });
  it('maps constants and wires to no parts', () => {
    const net = mapCover(cover(['a', 'b'], { one: ['--'], zero: [], same: ['1-'] }), 'dtl');
    expect(net.parts).toMatchObject({ transistors: 0, resistors: 0, diodes: 0 });
    expect(net.outputs.map((o) => o.form)).toEqual(['constant', 'constant', 'wire']);
  });
});

describe('mapped networks compute their functions', () => {
  it('for every family, on random functions of up to 5 inputs', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 5 }).chain((n) =>
          fc.tuple(fc.constant(n), fc.array(fc.constantFrom(0, 1, 2), { minLength: 2 ** n, maxLength: 2 ** n })),
        ),
        fc.constantFrom('rtl', 'dtl', 'cmos', 'nmos', 'gate' as const),
        ([n, cells], family) => {
          const inputs = Array.from({ length: n }, (_, i) => `i${i}`);
          const on = cells.flatMap((c, m) => (c === 1 ? [m] : []));
          const dc = cells.flatMap((c, m) => (c === 2 ? [m] : []));
          const off = cells.flatMap((c, m) => (c === 0 ? [m] : []));
          const t = fromMinterms(inputs, [{ name: 'F', on, dc }]);
          const tc = fromMinterms(inputs, [{ name: 'F', on: off, dc }]);
          const net = mapCover(minimiseQm(t).cover, family, { complement: minimiseQm(tc).cover });
          for (let m = 0; m < 2 ** n; m++) {
            if (getBit(t.outputs[0].dc, m)) continue;
            const values = Object.fromEntries(inputs.map((x, i) => [x, ((m >> (n - 1 - i)) & 1) === 1]));
            expect(evaluateNetwork(net, values).F).toBe(getBit(t.outputs[0].on, m));
          }
        },
      ),
      { numRuns: 300 },
    );
  });
});
