// The command line: exit codes, located error lines, count JSON shape, atomic export, and the
// real process (npm run trimwire) exiting with the documented codes.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { nodeIo, runCli, type CliIo } from './cli';
import { readVerilog } from './formats/verilog/read';

const root = path.resolve(__dirname, '..');
const fx = (f: string) => path.join(root, 'tests/fixtures/netlists', f);

function fakeIo(files: Record<string, string> = {}) {
  const out: string[] = [];
  const err: string[] = [];
  const written: Record<string, string> = {};
  const io: CliIo = {
    readFile: (p) => {
      if (p in files) return new TextEncoder().encode(files[p]);
      return readFileSync(p);
    },
    writeFile: (p, t) => {
      written[p] = t;
    },
    stdout: (t) => out.push(t),
    stderr: (t) => err.push(t),
  };
  return { io, out, err, written };
}

describe('trimwire cli', () => {
  it('check: exit 0 and a one-line summary for a clean design', () => {
    const { io, out, err } = fakeIo();
    expect(runCli(['check', fx('rtl-nor3.cir')], io)).toBe(0);
    expect(out.join('')).toMatch(/rtl-nor3\.cir: ok \(spice\) — .*3 transistors, 4 resistors, 0 diodes, 0 capacitors, 0 gates\n$/);
    expect(err).toEqual([]);
  });

  it('check: exit 0 with warnings on stderr', () => {
    const { io, err } = fakeIo({ 'w.cir': 't\nV1 a 0 5\nR1 a b 1k\n' });
    expect(runCli(['check', 'w.cir'], io)).toBe(0);
    expect(err.join('')).toBe('w.cir:3:1: warning: net B in (top) touches only one terminal\n');
  });

  it('check: exit 2 with one FILE:LINE:COL line per error', () => {
    const { io, out, err } = fakeIo({ 'bad.cir': 't\nQ7 a b QN\n.foo\n.model QN NPN\n' });
    expect(runCli(['check', 'bad.cir'], io)).toBe(2);
    expect(err.join('')).toBe('bad.cir:2:1: Q7 needs 3 or 4 nodes, found 2\nbad.cir:3:1: unsupported card .foo\n');
    expect(out).toEqual([]);
  });

  it('check: --format overrides the extension', () => {
    const { io } = fakeIo({ 'odd.txt': 'module m (a, y);\n input a; output y; not g (y, a);\nendmodule\n' });
    expect(runCli(['check', 'odd.txt', '--format', 'verilog'], io)).toBe(0);
    expect(runCli(['check', 'odd.txt', '--format', 'spice'], io)).toBe(2);
  });

  it('count --json gives totals and per-subcircuit counts', () => {
    const { io, out } = fakeIo();
    expect(runCli(['count', fx('wren8-bus.cir'), '--json'], io)).toBe(0);
    const c = JSON.parse(out.join(''));
    expect(c).toMatchObject({ transistors: 32, resistors: 56, diodes: 0, capacitors: 0, gates: 0 });
    expect(c.bySubcircuit.SLICE.instances).toBe(8);
  });

  it('export writes the converted text through the atomic writer', () => {
    const { io, written } = fakeIo();
    expect(runCli(['export', fx('wren8-alu-bit.v'), '--to', 'verilog', '--out', 'o.v'], io)).toBe(0);
    const back = readVerilog(written['o.v'], 'o.v').design;
    expect(back.top).toBe('alu4');
  });

  it('usage errors exit 1', () => {
    const { io, err } = fakeIo();
    expect(runCli(['export', fx('rtl-nor3.cir')], io)).toBe(1);
    expect(err.join('')).toMatch(/export needs --to/);
    expect(runCli(['frobnicate'], io)).toBe(1);
    expect(runCli(['check', 'a', 'b'], io)).toBe(1);
    expect(runCli(['check', fx('rtl-nor3.cir'), '--bogus'], io)).toBe(1);
  });

  it('refuses binary input and unreadable files with exit 2', () => {
    const { io, err } = fakeIo();
    const bin = { ...io, readFile: () => new Uint8Array([0x7f, 0x45, 0x4c, 0x46, 0, 1, 2]) };
    expect(runCli(['check', 'a.out'], bin)).toBe(2);
    expect(err.join('')).toMatch(/a\.out:1:1: this is a binary file, not a netlist/);
    expect(runCli(['check', path.join(root, 'no-such-file.cir')], io)).toBe(2);
    expect(err.join('')).toMatch(/cannot read the file: ENOENT/);
  });

  it('the atomic writer leaves no temporary file behind', () => {
    const dir = mkdtempSync(path.join(tmpdir(), 'tw-cli-'));
    nodeIo.writeFile(path.join(dir, 'x.cir'), 'text');
    expect(readdirSync(dir)).toEqual(['x.cir']);
    expect(() => nodeIo.writeFile(path.join(dir, 'missing-dir', 'x.cir'), 'text')).toThrow();
    expect(readdirSync(dir)).toEqual(['x.cir']);
  });

  it('runs as a process with the documented exit codes', () => {
    const ok = spawnSync('npm', ['run', '--silent', 'trimwire', '--', 'check', fx('cmos-nand2.cir')], { cwd: root, encoding: 'utf8' });
    expect(ok.status).toBe(0);
    expect(ok.stdout).toMatch(/4 transistors/);
    const bad = spawnSync('npm', ['run', '--silent', 'trimwire', '--', 'check', fx('wren8-alu-bit.v'), '--format', 'spice'], { cwd: root, encoding: 'utf8' });
    expect(bad.status).toBe(2);
    expect(bad.stderr).toMatch(/wren8-alu-bit\.v:\d+:\d+: /);
  }, 120_000);
});
