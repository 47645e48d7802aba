// Flattening: hierarchical names and paths, shared globals and ground, rails, and limits checked
// before any device is copied.
import { describe, expect, it } from 'vitest';
import { InputError } from '@/optimizer/errors';
import { readSpice } from '@/optimizer/formats/spice/read';
import type { Design } from './ir';
import { flatten } from './flatten';

const deck = [
  'two-level hierarchy',
  '.global VCC',
  'VCC VCC 0 5',
  'VEE 0 VEE 5',
  '.subckt INV a y',
  'RB a b 1k',
  'RC VCC y 1k',
  'Q1 y b 0 QN',
  '.ends',
  '.subckt PAIR a y',
  'X1 a m INV',
  'X2 m y INV',
  '.ends',
  'XP in out PAIR',
  'RL out VEE 10k',
  'VIN in 0 PULSE(0 5 0 1n 1n 1u 2u)',
  '.model QN NPN',
].join('\n');

describe('flatten', () => {
  const flat = flatten(readSpice(deck, 'h.cir').design);

  it('names devices by instance path and keeps the path', () => {
    const q = flat.devices.filter((d) => d.kind === 'npn');
    expect(q.map((d) => d.name)).toEqual(['XP.X1.Q1', 'XP.X2.Q1']);
    expect(q[1].path).toEqual(['XP', 'X2']);
    expect(q[1].cell).toBe('INV');
    expect(q[1].loc).toMatchObject({ file: 'h.cir', line: 8 });
  });

  it('names internal nets hierarchically and maps ports to the parent net', () => {
    const q2 = flat.devices.find((d) => d.name === 'XP.X2.Q1')!;
    expect(flat.nets[q2.terminals[0]].name).toBe('OUT');
    expect(flat.nets[q2.terminals[1]].name).toBe('XP.X2.B');
    const rb2 = flat.devices.find((d) => d.name === 'XP.X2.RB')!;
    expect(flat.nets[rb2.terminals[0]].name).toBe('XP.M');
  });

  it('shares ground and globals across the hierarchy', () => {
    const vccId = flat.netByName.get('VCC')!;
    const rcs = flat.devices.filter((d) => d.name.endsWith('.RC'));
    expect(rcs.map((d) => d.terminals[0])).toEqual([vccId, vccId]);
    expect(flat.devices.find((d) => d.name === 'XP.X1.Q1')!.terminals[2]).toBe(0);
  });

  it('solves rails from DC sources (negative supplies included), not from waveform sources', () => {
    const byName = Object.fromEntries(flat.rails.map((r) => [flat.nets[r.net].name, r.volts]));
    expect(byName).toEqual({ '0': 0, VCC: 5, VEE: -5 });
    expect(flat.rails.find((r) => flat.nets[r.net].name === 'VCC')!.source).toBe('VCC');
  });

  it('refuses a design whose flattened size exceeds the limit without flattening it', () => {
    // 12 levels of 10 instances each of a one-resistor leaf: 10^12 devices.
    const cells: Design['cells'] = {
      L0: { name: 'L0', ports: ['a'], devices: [{ name: 'R1', kind: 'resistor', terminals: ['a', '0'], value: 1, params: {} }], instances: [] },
    };
    for (let i = 1; i <= 12; i++) {
      cells[`L${i}`] = {
        name: `L${i}`,
        ports: ['a'],
        devices: [],
        instances: Array.from({ length: 10 }, (_, k) => ({ name: `X${k}`, cell: `L${i - 1}`, connections: ['a'], params: {} })),
      };
    }
    cells.TOP = { name: 'TOP', ports: [], devices: [], instances: [{ name: 'XT', cell: 'L12', connections: ['n'], params: {} }] };
    const huge: Design = { title: 'huge', format: 'spice', top: 'TOP', cells, models: {}, globals: [], params: {}, extraCards: [] };
    const started = performance.now();
    expect(() => flatten(huge)).toThrow(/1,000,000,000,000 devices after flattening; the limit is 4,000,000/);
    expect(performance.now() - started).toBeLessThan(1000);
  });

  it('refuses hierarchies deeper than the limit', () => {
    expect(() => flatten(readSpice(deck, 'h.cir').design, { maxDepth: 2 })).toThrow(/3 levels deep; the limit is 2/);
  });

  it('reports shorted rails inside subcircuits as located errors', () => {
    const d = readSpice('t\n.global VCC\nVCC VCC 0 5\n.subckt S a\nV2 VCC 0 3\nR1 a VCC 1k\n.ends\nX1 n S\nR2 n 0 1k\n', 's.cir').design;
    try {
      flatten(d);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      expect((e as InputError).message).toBe('s.cir:5:1: shorted rails: net VCC is held at 5 V by VCC and at 3 V by X1.V2');
    }
  });
});

it('refuses a cell that lists a port twice', () => {
  const d: Design = {
    title: 't', format: 'json', top: 'T', models: {}, globals: [], params: {}, extraCards: [],
    cells: {
      T: { name: 'T', ports: [], devices: [], instances: [{ name: 'X1', cell: 'S', connections: ['a', 'b'], params: {} }] },
      S: { name: 'S', ports: ['p', 'p'], devices: [{ name: 'R1', kind: 'resistor', terminals: ['p', '0'], value: 1, params: {} }], instances: [] },
    },
  };
  expect(() => flatten(d)).toThrow('port p is listed twice in S');
});
