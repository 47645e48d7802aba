// Flattening: hierarchical names and paths, shared globals and ground, rails, and limits checked
// before any device is copied.
import { describe, expect, it } from 'vitest';
import { InputError } from '@/optimizer/errors';
import { readSpice } from '@/optimizer/formats/spice/read';
import type { Design } from './ir';
import { flatten } from './flatten';
import { readerNumbering } from './read-numbering';

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

describe('flatten with the reader’s net numbering', () => {
  // Instances before and between devices, so the reader meets the nets in another order than
  // flatten numbers them (ports, device terminals, then instance connections).
  const mixed = [
    'mixed order',
    '.global VCC',
    'VCC VCC 0 5',
    '.subckt INV a y',
    'X1 a m BUF',
    'RC VCC y 1k',
    'Q1 y m 0 QN',
    'X2 y z BUF',
    'RZ z 0 1k',
    '.ends',
    '.subckt BUF a y',
    'RB a b 1k',
    'RC VCC y 1k',
    'Q1 y b 0 QN',
    '.ends',
    'XA in out INV',
    'RL out 0 10k',
    'XB out out2 INV',
    'VIN in 0 PULSE(0 5 0 1n 1n 1u 2u)',
    'RL2 out2 0 10k',
    '.model QN NPN',
  ].join('\n');

  /** The same design as plain data with no numbering beside its cells (as a JSON round trip gives). */
  const bare = (d: Design): Design => JSON.parse(JSON.stringify(d)) as Design;
  /** Everything a flat netlist says, for comparing two of them. */
  const flatData = (d: Design) => {
    const f = flatten(d);
    return { devices: f.devices, nets: f.nets, rails: f.rails, ports: f.ports };
  };

  it('leaves a numbering beside every cell it read', () => {
    const d = readSpice(mixed, 'm.cir').design;
    for (const cell of Object.values(d.cells)) expect(readerNumbering(cell)).toBeDefined();
    expect(readerNumbering(bare(d).cells.INV)).toBeUndefined();
  });

  it('flattens a design as read exactly as the same design without the numbering', () => {
    const d = readSpice(mixed, 'm.cir').design;
    expect(flatData(d)).toEqual(flatData(bare(d)));
    const flat = flatten(readSpice(deck, 'h.cir').design);
    expect(flat.devices).toEqual(flatten(bare(readSpice(deck, 'h.cir').design)).devices);
    expect(flat.nets).toEqual(flatten(bare(readSpice(deck, 'h.cir').design)).nets);
  });

  it('reads a numbering kept in several chunks', () => {
    // 3000 resistors, 6000 terminals: the reader's chunks of numbers start at 1024 entries.
    const lines = ['chain', 'V1 N0 0 5'];
    for (let i = 0; i < 3000; i++) lines.push(`R${i} N${i} N${i + 1} 1k`);
    const d = readSpice(lines.join('\n'), 'c.cir').design;
    expect(flatData(d)).toEqual(flatData(bare(d)));
    d.cells['(top)'].devices[2999].terminals[1] = 'N0';
    expect(flatData(d)).toEqual(flatData(bare(d)));
  });

  // A design edited after reading: the numbering no longer describes the cell and is not used.
  // (Deck names are read in capitals, so the edits name nets in capitals to reach existing ones.)
  const edits: [string, (d: Design) => void][] = [
    ['a device added', (d) => d.cells.INV.devices.push({ name: 'RN', kind: 'resistor', terminals: ['NEW', 'Y'], value: 1, params: {} })],
    ['a device removed', (d) => d.cells.INV.devices.splice(1, 1)],
    ['a terminal moved to a new net', (d) => (d.cells.BUF.devices[0].terminals[1] = 'ELSEWHERE')],
    ['a terminal moved to another net of the cell', (d) => (d.cells.BUF.devices[2].terminals[1] = 'A')],
    ['a substrate terminal added', (d) => d.cells.BUF.devices[2].terminals.push('0')],
    ['two terminals swapped', (d) => d.cells.INV.devices[1].terminals.reverse()],
    ['an instance connection changed', (d) => (d.cells.INV.instances[1].connections[1] = 'M')],
    ['an instance removed', (d) => d.cells.INV.instances.pop()],
    ['an instance added', (d) => d.cells['(top)'].instances.push({ name: 'XC', cell: 'BUF', connections: ['IN', 'FRESH'], params: {} })],
    ['a port renamed with its uses', (d) => {
      d.cells.BUF.ports[0] = 'P';
      d.cells.BUF.devices[0].terminals[0] = 'P';
    }],
    ['the ports reordered', (d) => d.cells.BUF.ports.reverse()],
    ['a device replaced by an equal copy', (d) => (d.cells.INV.devices[1] = { ...d.cells.INV.devices[1], terminals: [...d.cells.INV.devices[1].terminals] })],
  ];
  it.each(edits)('flattens a design with %s as it would without the numbering', (_, edit) => {
    const read = readSpice(mixed, 'm.cir').design;
    const copy = bare(read);
    edit(read);
    edit(copy);
    expect(flatData(read)).toEqual(flatData(copy));
  });

  it('still refuses a port listed twice after an edit', () => {
    const d = readSpice(mixed, 'm.cir').design;
    d.cells.BUF.ports[1] = 'A';
    expect(() => flatten(d)).toThrow('port A is listed twice in BUF');
  });
});
