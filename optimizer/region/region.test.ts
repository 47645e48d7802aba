// Proves region extraction: the highlighted parts are exactly the edit's removed (before) and added
// (after) parts, one ring of neighbours is kept and no more, every part and net appears once,
// rails are marked, and whole-design / subcircuit graphs pick the right devices.
import { describe, expect, it } from 'vitest';
import { NetlistBuilder } from '../netlist/build';
import { sliceInverters } from '../rules/test-helpers';
import { emptyEdit, type Edit } from '../rules/types';
import { designGraph, subcircuitGraph, terminalNames } from './graph';
import { extractRegion, MAX_RING } from './region';

/** Share slice 0's inverter: slices 1..3 lose theirs and their LDN nets merge into XS0.LDN. */
function shareDriver(slices = 4): Edit {
  const edit = emptyEdit();
  for (let k = 1; k < slices; k++) {
    edit.removeDevices.push(`XS${k}.Q1`, `XS${k}.RC`, `XS${k}.RB`);
    edit.mergeNets.push({ keep: 'XS0.LDN', remove: `XS${k}.LDN` });
  }
  return edit;
}

const unique = (xs: string[]) => new Set(xs).size === xs.length;

describe('extractRegion', () => {
  it('highlights exactly the removed parts before and the added parts after', () => {
    const nl = sliceInverters(4);
    const edit = shareDriver();
    edit.addDevices.push({ name: 'RSHARE', kind: 'resistor', terminals: ['XS0.LDN', 'VCC'], value: 2200 });
    const r = extractRegion(nl, edit);
    const hl = (g: typeof r.before, role: string) => g.parts.filter((p) => p.role === role).map((p) => p.name).sort();
    expect(hl(r.before, 'removed')).toEqual([...edit.removeDevices].sort());
    expect(hl(r.before, 'added')).toEqual([]);
    expect(hl(r.after, 'added')).toEqual(['RSHARE']);
    expect(hl(r.after, 'removed')).toEqual([]);
    expect(r.after.parts.some((p) => edit.removeDevices.includes(p.name))).toBe(false);
  });

  it('keeps one ring of neighbours: parts on a changed non-rail net, not their neighbours', () => {
    // LOAD → RB → B → Q1 → LDN; a second stage reads XS0.LDN through R2 into Q2 (two hops away from XS1).
    const nl = sliceInverters(2);
    const edit = emptyEdit();
    edit.removeDevices.push('XS1.RB');
    const r = extractRegion(nl, edit);
    const names = r.before.parts.map((p) => p.name).sort();
    // RB sits on /LOAD and XS1.B: neighbours are XS0.RB (on LOAD) and XS1.Q1 (on XS1.B). RC shares only VCC (a rail).
    expect(names).toEqual(['XS0.RB', 'XS1.Q1', 'XS1.RB']);
    expect(r.before.parts.find((p) => p.name === 'XS1.Q1')!.role).toBe('neighbour');
  });

  it('draws every part and every net once, with rails marked and boundary nets flagged', () => {
    const nl = sliceInverters(4);
    const r = extractRegion(nl, shareDriver());
    for (const g of [r.before, r.after]) {
      expect(unique(g.parts.map((p) => p.name))).toBe(true);
      expect(unique(g.nets.map((n) => n.name))).toBe(true);
      const netNames = new Set(g.nets.map((n) => n.name));
      for (const p of g.parts) for (const t of p.terminals) expect(netNames.has(t.net)).toBe(true);
    }
    expect(r.before.nets.find((n) => n.name === 'VCC')).toMatchObject({ railVolts: 5, boundary: false });
    expect(r.before.nets.find((n) => n.name === '0')).toMatchObject({ railVolts: 0 });
  });

  it('marks reconnected parts as changed on both sides and follows them to their new net', () => {
    const nl = sliceInverters(2);
    const edit: Edit = { ...emptyEdit(), reconnect: [{ device: 'XS1.RB', terminal: 0, net: 'XS0.LDN' }] };
    const r = extractRegion(nl, edit);
    expect(r.before.parts.find((p) => p.name === 'XS1.RB')!.role).toBe('changed');
    const after = r.after.parts.find((p) => p.name === 'XS1.RB')!;
    expect(after.role).toBe('changed');
    expect(after.terminals[0]).toEqual({ name: 'a', net: 'XS0.LDN' });
    // XS0.LDN's driver parts are neighbours after the move.
    expect(r.after.parts.map((p) => p.name)).toEqual(expect.arrayContaining(['XS0.RC', 'XS0.Q1']));
  });

  it('caps the ring on a net with very many readers and says how many were left out', () => {
    const b = new NetlistBuilder('wide fan-out');
    b.rail('VCC', 5);
    b.model('QN', 'npn', {});
    b.resistor('RDRV', 'VCC', 'CLK', 1000);
    for (let k = 0; k < MAX_RING + 20; k++) b.resistor(`RB${k}`, 'CLK', `B${k}`, 4700);
    const nl = b.build();
    const r = extractRegion(nl, { ...emptyEdit(), removeDevices: ['RDRV'] });
    expect(r.before.parts).toHaveLength(MAX_RING + 1);
    expect(r.ringTruncated).toBe(20);
  });
});

describe('design and subcircuit graphs', () => {
  it('draws every device but the supply sources, and one subcircuit by its path', () => {
    const nl = sliceInverters(3);
    const all = designGraph(nl);
    expect(all.parts).toHaveLength(nl.devices.length - 1);
    expect(all.parts.some((p) => p.kind === 'vsource')).toBe(false);
    const one = subcircuitGraph(nl, 'XS2');
    expect(one.parts.map((p) => p.name).sort()).toEqual(['XS2.Q1', 'XS2.RB', 'XS2.RC']);
    expect(one.nets.find((n) => n.name === 'LOAD')?.boundary).toBe(true);
  });

  it('names gate terminals by role', () => {
    expect(terminalNames('gate', 'nand', 3)).toEqual(['y', 'in1', 'in2']);
    expect(terminalNames('gate', 'bufif1', 3)).toEqual(['y', 'in1', 'en']);
    expect(terminalNames('npn', undefined, 3)).toEqual(['c', 'b', 'e']);
  });
});
