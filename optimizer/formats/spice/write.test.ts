// Deck writer: round trips through the reader, legal names for designs from other formats, gate
// refusal, and ngspice running every written deck unchanged.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { InputError } from '@/optimizer/errors';
import type { Design } from '@/optimizer/netlist/ir';
import { readSpice } from './read';
import { writeSpice } from './write';

const fixtures = path.resolve(__dirname, '../../../tests/fixtures/netlists');
const decks = readdirSync(fixtures).filter((f) => f.endsWith('.cir'));

/** The design without source locations (they differ between a file and its rewrite). */
function shape(d: Design): unknown {
  return JSON.parse(JSON.stringify(d, (k, v) => (k === 'loc' ? undefined : v)));
}

describe('writeSpice round trip', () => {
  it.each(decks)('%s reads back to the same design', (file) => {
    const first = readSpice(readFileSync(path.join(fixtures, file), 'utf8'), file).design;
    const text = writeSpice(first);
    const second = readSpice(text, 'written.cir').design;
    expect(shape(second)).toEqual(shape(first));
  });

  it('makes names from other formats legal and unique, ignoring case', () => {
    const design: Design = {
      title: 'from verilog',
      format: 'verilog',
      top: 'top',
      models: { qn: { name: 'qn', type: 'npn', params: { BF: 100 } } },
      globals: [],
      params: {},
      extraCards: [],
      cells: {
        top: {
          name: 'top',
          ports: ['a[0]'],
          devices: [
            { name: 'u1', kind: 'npn', terminals: ['y', 'a[0]', '0'], model: 'QN', params: {} },
            { name: 'load', kind: 'resistor', terminals: ['y', 'Y'], value: 1000, params: {} },
            { name: 'vcc', kind: 'vsource', terminals: ['Y', '0'], value: 5, params: {} },
          ],
          instances: [],
        },
      },
    };
    const text = writeSpice(design);
    expect(text).toContain('Qu1 y a_0_ 0 qn');
    expect(text).toContain('Rload y Y_2 1000');
    const back = readSpice(text, 'w.cir').design;
    expect(back.cells[back.top].devices.map((d) => d.terminals)).toEqual([
      ['Y', 'A_0_', '0'],
      ['Y', 'Y_2'],
      ['Y_2', '0'],
    ]);
  });

  it('refuses gate-level devices with a message that says what to do', () => {
    const design: Design = {
      title: 'gates',
      format: 'verilog',
      top: 't',
      models: {},
      globals: [],
      params: {},
      extraCards: [],
      cells: { t: { name: 't', ports: [], devices: [{ name: 'g1', kind: 'gate', op: 'nand', terminals: ['y', 'a', 'b'], params: {} }], instances: [] } },
    };
    expect(() => writeSpice(design)).toThrow(InputError);
    expect(() => writeSpice(design)).toThrow(/g1 \(nand\).*export gate-level designs as Verilog or JSON/);
  });

  it('continues long cards with + lines', () => {
    const ports = Array.from({ length: 80 }, (_, i) => `P${i}`);
    const deck = ['t', `.subckt WIDE ${ports.join(' ')}`, ...ports.map((p, i) => `R${i} ${p} 0 1k`), '.ends', `X1 ${ports.join(' ')} WIDE`].join('\n');
    const text = writeSpice(readSpice(deck, 'w.cir').design);
    expect(text.split('\n').every((l) => l.length <= 200)).toBe(true);
    expect(text).toMatch(/\n\+ /);
    expect(readSpice(text, 'back.cir').design.cells.WIDE.ports).toEqual(ports);
  });
});

// ngspice (Debian package, installed by scripts/test.sh): every written deck must run in batch
// mode without errors.
describe('ngspice runs written decks unchanged', () => {
  const dir = mkdtempSync(path.join(tmpdir(), 'tw-spice-'));
  it.each(decks)('%s', (file) => {
    const text = writeSpice(readSpice(readFileSync(path.join(fixtures, file), 'utf8'), file).design);
    const deck = path.join(dir, file);
    writeFileSync(deck, text);
    const out = execFileSync('ngspice', ['-b', deck], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'], timeout: 20_000 });
    expect(out).not.toMatch(/^\s*error/im);
    expect(out).toMatch(/(Node\s+Voltage|No. of Data Rows)/i);
  });
});
