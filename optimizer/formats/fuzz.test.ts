// Property tests on every reader: random text and mutated fixtures (characters and lines deleted,
// inserted, duplicated) give a design or an InputError whose diagnostics are located — never any
// other exception. Runs are bounded (numRuns) to keep each file to a few seconds.
import { readFileSync, readdirSync } from 'node:fs';
import path from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InputError } from '@/optimizer/errors';
import { flatten } from '@/optimizer/netlist/flatten';
import type { Format } from '@/optimizer/netlist/ir';
import { readDesign, writeDesign } from './index';
import { writeJson } from './json/write';

const fixtures = path.resolve(__dirname, '../../tests/fixtures/netlists');
const byFormat: Record<Format, string[]> = { spice: [], verilog: [], json: [], pla: [] };
for (const f of readdirSync(fixtures)) {
  const text = readFileSync(path.join(fixtures, f), 'utf8');
  if (f.endsWith('.cir')) byFormat.spice.push(text);
  if (f.endsWith('.v')) byFormat.verilog.push(text);
}
byFormat.json = byFormat.spice.slice(0, 3).map((t) => writeJson(readDesign(t, { file: 'f.cir' }).design));
byFormat.pla = ['.i 3\n.o 2\n.ilb a b c\n.ob x y\n.type fd\n.p 3\n11- 10\n-01 01\n0-0 1-\n.e\n'];

/** Reads, and flattens what reads; anything but a located InputError fails the property. */
function readsCleanly(text: string, format: Format): boolean {
  try {
    const { design } = readDesign(text, { file: 'fuzz', format });
    flatten(design, { maxDevices: 100_000 });
    for (const f of ['spice', 'verilog', 'json', 'pla'] as const) {
      try {
        writeDesign(design, f);
      } catch (e) {
        if (!(e instanceof InputError)) throw e;
      }
    }
    return true;
  } catch (e) {
    if (!(e instanceof InputError)) throw e;
    expect(e.diagnostics.length).toBeGreaterThan(0);
    for (const d of e.diagnostics.filter((x) => x.severity === 'error')) {
      if (d.code.startsWith('limits.') || d.code === 'netlist.no-top' || d.code.startsWith('pla.write')) continue;
      expect(d.loc, `${d.code}: ${d.message}`).toBeDefined();
      expect(d.loc!.line).toBeGreaterThanOrEqual(1);
      expect(d.loc!.col).toBeGreaterThanOrEqual(1);
    }
    return false;
  }
}

type Edit = { kind: 'delChar' | 'insChar' | 'dupChar' | 'delLine' | 'dupLine' | 'swapLines'; at: number; ch: string };

const edit = fc.record({
  kind: fc.constantFrom<Edit['kind']>('delChar', 'insChar', 'dupChar', 'delLine', 'dupLine', 'swapLines'),
  at: fc.nat(),
  ch: fc.constantFrom(' ', '\n', '(', ')', '=', '{', '}', '[', ']', ';', ',', '.', '+', '*', '"', "'", '\\', '0', '1', 'x', 'Q', '/', '-', '~'),
});

function mutate(text: string, edits: Edit[]): string {
  let t = text;
  for (const e of edits) {
    if (e.kind.endsWith('Char')) {
      const i = t.length === 0 ? 0 : e.at % t.length;
      if (e.kind === 'delChar') t = t.slice(0, i) + t.slice(i + 1);
      else if (e.kind === 'insChar') t = t.slice(0, i) + e.ch + t.slice(i);
      else t = t.slice(0, i) + t.slice(i, i + 1) + t.slice(i);
    } else {
      const lines = t.split('\n');
      const i = e.at % lines.length;
      if (e.kind === 'delLine') lines.splice(i, 1);
      else if (e.kind === 'dupLine') lines.splice(i, 0, lines[i]);
      else {
        const j = (i + 1) % lines.length;
        [lines[i], lines[j]] = [lines[j], lines[i]];
      }
      t = lines.join('\n');
    }
  }
  return t;
}

describe.each<Format>(['spice', 'verilog', 'json', 'pla'])('%s reader under fuzzing', (format) => {
  const seeds = byFormat[format];

  it('mutated fixtures give a design or located errors', () => {
    fc.assert(
      fc.property(fc.nat({ max: seeds.length - 1 }), fc.array(edit, { minLength: 1, maxLength: 6 }), (k, edits) => {
        readsCleanly(mutate(seeds[k], edits), format);
      }),
      { numRuns: 300 },
    );
  });

  it('random text gives a design or located errors', () => {
    fc.assert(
      fc.property(fc.string({ maxLength: 400, unit: 'grapheme-ascii' }), (text) => {
        readsCleanly(text, format);
      }),
      { numRuns: 300 },
    );
  });

  it('random lines of the format\'s own words give a design or located errors', () => {
    const words: Record<Format, string[]> = {
      spice: ['R1', 'Q1', 'M1', 'D1', 'X1', 'V1', 'a', 'b', '0', 'gnd', '1k', 'QN', '.model', 'NPN', 'D', '.subckt', '.ends', 'S', '.param', 'p=1', '{p}', '.global', 'PULSE(0', '5)', '.end', '+', '.control', '.endc', 'DC'],
      verilog: ['module', 'm', 'endmodule', '(', ')', ';', ',', 'input', 'output', 'wire', '[3:0]', 'a', 'b', 'y', 'and', 'not', 'assign', '=', '&', '|', '~', '?', ':', "1'bz", '.a(', 'm', 'u1', 'pullup', 'tri', 'constructor', '__proto__', 'toString'],
      json: ['{', '}', '[', ']', ',', ':', '"format"', '"trimwire-netlist"', '"version"', '1', '"design"', '"cells"', '"top"', '"T"', 'null', 'true', '"constructor"', '"__proto__"'],
      pla: ['.i', '.o', '2', '1', '01', '1-', '~', '.ilb', 'a', 'b', '.ob', 'y', '.p', '.type', 'fr', '.e', '#'],
    };
    const line = fc.array(fc.constantFrom(...words[format]), { maxLength: 8 }).map((w) => w.join(' '));
    fc.assert(
      fc.property(fc.array(line, { maxLength: 20 }), (lines) => {
        readsCleanly((format === 'spice' ? 'title\n' : '') + lines.join('\n'), format);
      }),
      { numRuns: 300 },
    );
  });
});

describe('names that are also Object.prototype properties', () => {
  const json = (cellKey: string, ref: string) =>
    JSON.stringify({
      format: 'trimwire-netlist',
      version: 1,
      design: {
        title: 't',
        format: 'verilog',
        top: 'T',
        cells: {
          T: { name: 'T', ports: [], devices: [], instances: [{ name: 'X1', cell: ref, connections: [] }] },
          [cellKey]: { name: cellKey, ports: [], devices: [], instances: [] },
        },
      },
    });
  it.each([
    ['S', 'constructor'],
    ['S', 'toString'],
    ['S', '__proto__'],
    ['__proto__', '__proto__'],
  ])('a JSON instance of %s referring to %s is a located error, not a crash', (key, ref) => {
    expect(readsCleanly(json(key, ref), 'json')).toBe(false);
  });
  it.each(['constructor', '__proto__', 'hasOwnProperty'])('a Verilog module and nets called %s read and flatten', (name) => {
    const text = `module ${name} (${name}, y);\n input ${name}; output y;\n tri ${name}_t;\n not g (y, ${name});\nendmodule\n`;
    expect(readsCleanly(text, 'verilog')).toBe(true);
    const { design } = readDesign(text, { file: 'p.v' });
    expect(design.top).toBe(name);
    expect(writeDesign(design, 'verilog')).toContain(`input ${name};`);
  });
});
