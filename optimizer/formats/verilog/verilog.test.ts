// Structural Verilog: vectors, primitives, assign operators as gates, instances, round trip and
// located errors for what structural netlists cannot hold.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { InputError, formatDiagnostic } from '@/optimizer/errors';
import { countParts } from '@/optimizer/netlist/counts';
import { flatten } from '@/optimizer/netlist/flatten';
import type { Design } from '@/optimizer/netlist/ir';
import { designToPla } from '../pla/design';
import { readVerilog } from './read';
import { writeVerilog } from './write';

const fixtures = path.resolve(__dirname, '../../../tests/fixtures/netlists');
const alu = readFileSync(path.join(fixtures, 'wren8-alu-bit.v'), 'utf8');

function errorsOf(text: string): string[] {
  try {
    readVerilog(text, 'm.v');
  } catch (e) {
    if (e instanceof InputError) return e.diagnostics.filter((d) => d.severity === 'error').map(formatDiagnostic);
    throw e;
  }
  throw new Error('expected an InputError');
}

const shape = (d: Design) => JSON.parse(JSON.stringify(d, (k, v) => (k === 'loc' ? undefined : v)));

describe('readVerilog', () => {
  const { design, diagnostics } = readVerilog(alu, 'alu.v');

  it('picks the module nothing instantiates as the top and bit-blasts vectors', () => {
    expect(design.top).toBe('alu4');
    expect(design.cells.alu4.ports.slice(0, 4)).toEqual(['a[3]', 'a[2]', 'a[1]', 'a[0]']);
    expect(design.cells.alu4.directions!['sum[0]']).toBe('output');
    expect(design.cells.alu_bit.netKinds).toEqual({ bus: 'tri' });
  });

  it('warns that delays are ignored', () => {
    expect(diagnostics.map(formatDiagnostic)).toEqual(['alu.v:11:7: warning: delays are ignored (the engine is untimed)']);
  });

  it('turns each assign operator into one gate named from its line', () => {
    const gates = design.cells.alu_bit.devices.filter((d) => d.name.startsWith('_a14_'));
    expect(gates.map((g) => g.op)).toEqual(['and', 'or']);
    expect(gates.every((g) => g.loc?.line === 14)).toBe(true);
  });

  it('connects positional and named instances to the same bits', () => {
    const [s0, s1] = design.cells.alu4.instances;
    expect(s0.connections).toEqual(['a[0]', 'b[0]', 'load', 'c[0]', 'sum[0]', 'c[1]', 'bus[0]']);
    expect(s1.connections).toEqual(['a[1]', 'b[1]', 'load', 'c[1]', 'sum[1]', 'c[2]', 'bus[1]']);
  });

  it('computes a 4-bit sum: the adder adds (mathematics, by exhaustion over 2 bits of each operand)', () => {
    const adder = readVerilog(
      'module add2 (input [1:0] a, input [1:0] b, output [2:0] s);\n wire c1;\n assign s[0] = a[0] ^ b[0];\n assign c1 = a[0] & b[0];\n assign s[1] = a[1] ^ b[1] ^ c1;\n assign s[2] = (a[1] & b[1]) | (c1 & (a[1] ^ b[1]));\nendmodule\n',
      'add.v',
    ).design;
    const table = designToPla(adder);
    for (let a = 0; a < 4; a++) {
      for (let b = 0; b < 4; b++) {
        const inBits = ((a << 2) | b).toString(2).padStart(4, '0');
        const cube = table.cubes.find((c) => c.in === inBits);
        const s = cube ? parseInt(cube.out, 2) : 0;
        expect(s).toBe(a + b);
      }
    }
  });

  it('maps ?: with a z branch to a tri-state buffer and a plain ?: to and/or/not', () => {
    const d = readVerilog('module t (input a, input b, input s, output y, output z);\n assign z = s ? a : 1\'bz;\n assign y = s ? a : b;\nendmodule\n', 't.v').design;
    const ops = d.cells.t.devices.map((x) => x.op);
    expect(ops).toEqual(['bufif1', 'not', 'and', 'and', 'or']);
  });

  it('uses supply nets for constants and flattens them to rails', () => {
    const d = readVerilog("module k (input a, output y);\n and g (y, a, 1'b1);\n pullup (y);\nendmodule\n", 'k.v').design;
    const flat = flatten(d);
    expect(flat.rails.map((r) => flat.nets[r.net].name)).toContain("1'b1");
    expect(countParts(d)).toMatchObject({ gates: 1, resistors: 1 });
  });

  it('warns about no net an assign or a constant tie-off makes, however many nets the module has', () => {
    // 40 assigns of three operators each: over 64 nets, so the net numbering grows while counting.
    const body = Array.from({ length: 40 }, (_, i) => ` assign y${i} = (a & ~b) | (b & c${i});`).join('\n');
    const ports = Array.from({ length: 40 }, (_, i) => `c${i}, y${i}`).join(', ');
    const decl = Array.from({ length: 40 }, (_, i) => ` input c${i}; output y${i};`).join('\n');
    const text = `module m (a, b, ${ports});\n input a, b;\n${decl}\n${body}\n and t (y0x, a, 1'b1);\n and u (z, y0x, a);\nendmodule\n`;
    const { diagnostics } = readVerilog(text, 'm.v');
    // z is driven and read by nothing else: the one real single-terminal net.
    expect(diagnostics.map(formatDiagnostic)).toEqual([expect.stringMatching(/^m\.v:\d+:\d+: warning: net z in m touches only one terminal$/)]);
  });
});

describe('writeVerilog', () => {
  it('round-trips a design through text', () => {
    const first = readVerilog(alu, 'alu.v').design;
    const second = readVerilog(writeVerilog(first), 'back.v').design;
    expect(shape(second)).toEqual(shape(first));
  });

  it('refuses transistor-level devices', () => {
    const d: Design = {
      title: 't', format: 'spice', top: 'T', models: {}, globals: [], params: {}, extraCards: [],
      cells: { T: { name: 'T', ports: [], devices: [{ name: 'Q1', kind: 'npn', terminals: ['c', 'b', 'e'], params: {} }], instances: [] } },
    };
    expect(() => writeVerilog(d)).toThrow(/only gate-level devices.*Q1 \(npn\)/);
  });
});

describe('located errors', () => {
  it.each([
    ['module m (a);\n input a;\n reg r;\nendmodule\n', 'm.v:3:2: behavioural code is not supported; structural only'],
    ['module m (a, y);\n input a; output y;\n always @(a) y = a;\nendmodule\n', 'm.v:3:2: behavioural code is not supported; structural only'],
    ['module m (a);\n input a;\n foo u1 (a);\nendmodule\n', 'm.v:3:6: unknown module foo (used by u1)'],
    ['module m (a, y);\n input [3:0] a; output y;\n and g (y, a, a);\nendmodule\n', 'm.v:3:12: a gate terminal must be one bit, found 4'],
    ['module m (a, y);\n input [3:0] a; output [1:0] y;\n assign y = a;\nendmodule\n', 'm.v:3:13: width mismatch: 2 bits against 4 bits'],
    ['module m (a, y);\n input a; output y;\n assign y = a + a;\nendmodule\n', 'm.v:3:15: operator + is not supported in assign; use & | ^ ~ and ?:'],
    ['module m (a);\n input a;\n', 'm.v:1:8: module m has no endmodule'],
    ['module m (a);\nendmodule\n', 'm.v:1:11: port a of module m has no input/output/inout declaration'],
    ['module m (a);\n input [1:0] a;\n buf (y, a[5]);\nendmodule\n', 'm.v:3:10: a[5] is outside the declared range of a'],
    ['module m (a); input a; /* open\nendmodule\n', 'm.v:1:24: unterminated /* comment'],
    ['', 'm.v:1:1: no module found'],
  ])('%j → %s', (text, message) => {
    expect(errorsOf(text)).toContain(message);
  });

  it('refuses expressions nested deeper than the parser allows, without exhausting the stack', () => {
    const deep = `module m (a, y);\n input a; output y;\n assign y = ${'('.repeat(50_000)}a${')'.repeat(50_000)};\nendmodule\n`;
    expect(errorsOf(deep)[0]).toMatch(/^m\.v:3:\d+: expression nested more than 200 deep$/);
    const nots = `module m (a, y);\n input a; output y;\n assign y = ${'~'.repeat(50_000)}a;\nendmodule\n`;
    expect(errorsOf(nots)[0]).toMatch(/expression nested more than 200 deep/);
  });

  it('stops bit-blasting that would exceed the budget with a clear message', () => {
    const wide = 'module m (a, y);\n input [4095:0] a; output [4095:0] y;\n' + ' assign y = a & a & a & a & a;\n'.repeat(10) + 'endmodule\n';
    try {
      readVerilog(wide, 'w.v', 100_000);
      expect.unreachable();
    } catch (e) {
      expect((e as InputError).diagnostics.map(formatDiagnostic)).toContain('w.v:5:17: the design expands to more than 100,000 gates and net bits; the limit is 100,000');
    }
  });

  it('reports recursive instantiation', () => {
    expect(errorsOf('module a (x); inout x; b u (x); endmodule\nmodule b (y); inout y; a v (y); endmodule\n').join('\n')).toMatch(/recursive instantiation of module/);
  });
});
