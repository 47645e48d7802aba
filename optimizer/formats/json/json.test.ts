// JSON netlist: round trip, syntax errors located at line:col, schema errors at the offending value.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { InputError, formatDiagnostic } from '@/optimizer/errors';
import { readSpice } from '@/optimizer/formats/spice/read';
import { readJson } from './read';
import { writeJson } from './write';
import { findJsonSyntaxError, locatePath, posToLineCol } from './locate';

const fixtures = path.resolve(__dirname, '../../../tests/fixtures/netlists');

function errorsOf(text: string): string[] {
  try {
    readJson(text, 'n.json');
  } catch (e) {
    if (e instanceof InputError) return e.diagnostics.map(formatDiagnostic);
    throw e;
  }
  throw new Error('expected an InputError');
}

describe('JSON netlist', () => {
  it('round-trips a hierarchical design exactly', () => {
    const design = readSpice(readFileSync(path.join(fixtures, 'wren8-bus.cir'), 'utf8'), 'w.cir').design;
    const text = writeJson(design);
    expect(JSON.parse(text)).toMatchObject({ format: 'trimwire-netlist', version: 1 });
    expect(readJson(text, 'w.json').design).toEqual(design);
  });

  it('locates a syntax error at its line and column', () => {
    expect(errorsOf('{\n  "format": "trimwire-netlist",\n  "version": 1,\n  "design": {,}\n}')).toEqual([
      `n.json:4:14: invalid JSON: expected a "key", found ','`,
    ]);
    expect(errorsOf('{"a": [1, 2,]}')).toEqual([`n.json:1:13: invalid JSON: unexpected ']'`]);
    expect(errorsOf('{"a": 1,}')).toEqual([`n.json:1:9: invalid JSON: expected a "key", found '}'`]);
    expect(errorsOf('')).toEqual(['n.json:1:1: invalid JSON: unexpected end of JSON']);
  });

  it('locates schema problems at the offending value', () => {
    const doc = {
      format: 'trimwire-netlist',
      version: 1,
      design: {
        title: 't',
        format: 'spice',
        top: 'T',
        cells: { T: { name: 'T', ports: [], devices: [{ name: 'Q1', kind: 'npn', terminals: ['c', 'b'], params: {} }], instances: [] } },
      },
    };
    const text = JSON.stringify(doc, null, 2);
    const errs = errorsOf(text);
    const line = text.split('\n').findIndex((l) => l.includes('"terminals"')) + 1;
    expect(errs).toEqual([`n.json:${line}:26: design.cells.T.devices.0.terminals: Q1 (npn) needs 3 or 4 terminals, found 2`]);
  });

  it('reports a wrong format tag and structural errors', () => {
    expect(errorsOf('{"format":"other","version":1,"design":{}}')[0]).toMatch(/^n\.json:1:11: format: /);
    const doc = {
      format: 'trimwire-netlist',
      version: 1,
      design: { title: 't', format: 'spice', top: 'T', cells: { T: { name: 'T', ports: [], devices: [], instances: [{ name: 'X1', cell: 'NOPE', connections: [] }] } } },
    };
    expect(errorsOf(JSON.stringify(doc))).toEqual(['n.json:1:51: unknown subcircuit NOPE (used by X1)']);
  });
});

describe('locate helpers', () => {
  it('finds values by path in nested objects and arrays', () => {
    const text = '{"a": {"b": [10, {"c": true}]}, "d": "x"}';
    expect(text.slice(locatePath(text, ['a', 'b', 1, 'c']))).toMatch(/^true/);
    expect(text.slice(locatePath(text, ['d']))).toMatch(/^"x"/);
    expect(posToLineCol('ab\ncd', 4)).toEqual({ line: 2, col: 2 });
  });
  it('accepts what JSON.parse accepts', () => {
    for (const t of ['{}', '[]', '[1,{"a":[null,true,false,-1.5e3,"\\"q"]}]', ' "s" ']) expect(findJsonSyntaxError(t)).toBeNull();
  });
  it('survives deep nesting', () => {
    expect(findJsonSyntaxError('['.repeat(200_000))?.message).toBe('unexpected end of JSON');
  });
});
