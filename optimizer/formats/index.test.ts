// readDesign: format detection, refusal of binary / non-UTF-8 / oversized input, dispatch.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { InputError, formatDiagnostic } from '@/optimizer/errors';
import { formatFromName, readDesign, sniffFormat, writeDesign } from './index';

const fixtures = path.resolve(__dirname, '../../tests/fixtures/netlists');

function errorOf(f: () => unknown): string {
  try {
    f();
  } catch (e) {
    if (e instanceof InputError) return e.diagnostics.map(formatDiagnostic).join('\n');
    throw e;
  }
  throw new Error('expected an InputError');
}

describe('readDesign', () => {
  it('takes the format from the extension', () => {
    expect(formatFromName('a/b/deck.SP')).toBe('spice');
    expect(formatFromName('x.net')).toBe('spice');
    expect(formatFromName('x.v')).toBe('verilog');
    expect(formatFromName('x.json')).toBe('json');
    expect(formatFromName('x.pla')).toBe('pla');
    expect(formatFromName('x.txt')).toBeUndefined();
  });

  it('sniffs the format from the content when the name does not say', () => {
    expect(sniffFormat('  {"format": "trimwire-netlist"}')).toBe('json');
    expect(sniffFormat('// adder\nmodule add (a);\nendmodule')).toBe('verilog');
    expect(sniffFormat('# table\n.i 2\n.o 1\n01 1\n')).toBe('pla');
    expect(sniffFormat('RTL gate\nR1 a 0 1k\n')).toBe('spice');
    expect(readDesign(readFileSync(path.join(fixtures, 'wren8-alu-bit.v')), { file: 'upload' }).design.format).toBe('verilog');
  });

  it('reads every format and writes it back', () => {
    const pla = readDesign('.i 2\n.o 1\n.ilb a b\n.ob y\n11 1\n.e\n', { file: 'and.pla' }).design;
    expect(pla.cells[pla.top].devices.map((d) => d.op)).toEqual(['and', 'buf']);
    expect(writeDesign(pla, 'pla')).toContain('11 1');
    const json = writeDesign(pla, 'json');
    expect(readDesign(json, { file: 'and.json' }).design).toEqual(pla);
  });

  it('refuses binary input', () => {
    expect(errorOf(() => readDesign(new Uint8Array([0x4d, 0x5a, 0x00, 0x90]), { file: 'x.exe' }))).toBe('x.exe:1:1: this is a binary file, not a netlist (it contains NUL bytes)');
    expect(errorOf(() => readDesign('t\nR1 a b\0 1k\n', { file: 'n.cir' }))).toBe('n.cir:2:7: this is a binary file, not a netlist (it contains NUL bytes)');
  });

  it('refuses text that is not UTF-8', () => {
    expect(errorOf(() => readDesign(new Uint8Array([0x74, 0x0a, 0xff, 0xfe, 0x41]), { file: 'l.cir' }))).toBe('l.cir:1:1: the file is not UTF-8 text');
    expect(errorOf(() => readDesign('t\nR1 a \uFFFD 1k\n', { file: 'r.cir' }))).toBe('r.cir:2:6: the file is not valid UTF-8 text');
  });

  it('refuses files over the size limit before parsing', () => {
    const big = 't\n' + 'R1 a b 1k\n'.repeat(200);
    expect(errorOf(() => readDesign(big, { file: 'big.cir', limits: { maxFileBytes: 1024 } }))).toBe('big.cir:1:1: the file is 2 KiB; the limit is 1 KiB');
  });

  it('strips a byte-order mark', () => {
    const d = readDesign('\uFEFFBOM title\nR1 a 0 1k\nV1 a 0 1\n', { file: 'b.cir' }).design;
    expect(d.title).toBe('BOM title');
  });
});
