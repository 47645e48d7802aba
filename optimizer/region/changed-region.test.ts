// Proves the explorer's changed regions become drawable graphs: removed, added and rewired parts get
// their roles, rewired terminals and merged nets land on their new nets, and proposals combine.
import { describe, expect, it } from 'vitest';
import type { ChangedRegion } from '../whatif/explorer-data';
import { changedRegionGraphs } from './changed-region';

// Two Wren-8 bus slices share one pull-up after the rewrite (invented demo names).
const bus: ChangedRegion = {
  before: [
    { name: 'XS1.RC', kind: 'resistor', terminals: ['VCC', 'XS1.LDN'], value: 4300 },
    { name: 'XS1.Q1', kind: 'npn', terminals: ['XS1.LDN', 'XS1.B', '0'] },
  ],
  after: [{ name: 'RPULL', kind: 'resistor', terminals: ['VCC', 'XS1.LDN'], value: 2200 }],
  reconnect: [{ device: 'XS1.Q1', terminal: 0, net: 'XS0.LDN' }],
  mergeNets: [{ keep: 'XS0.LDN', remove: 'XS1.LDN' }],
};
const ws: ChangedRegion = {
  before: [{ name: 'UWS', kind: 'gate', op: 'nand', terminals: ['WS', 'A', 'B'] }],
  after: [{ name: 'UWS2', kind: 'gate', op: 'nor', terminals: ['WS', 'A', 'B'] }],
  reconnect: [],
  mergeNets: [],
};

describe('changedRegionGraphs', () => {
  it('marks removed and rewired parts before, added and rewired parts after', () => {
    const { before, after } = changedRegionGraphs([bus]);
    expect(before.parts.map((p) => [p.name, p.role])).toEqual([['XS1.RC', 'removed'], ['XS1.Q1', 'changed']]);
    expect(after.parts.map((p) => [p.name, p.role])).toEqual([['XS1.Q1', 'changed'], ['RPULL', 'added']]);
  });

  it('puts a rewired terminal on its new net and renames merged nets', () => {
    const { after } = changedRegionGraphs([bus]);
    const q = after.parts.find((p) => p.name === 'XS1.Q1')!;
    expect(q.terminals).toEqual([{ name: 'c', net: 'XS0.LDN' }, { name: 'b', net: 'XS1.B' }, { name: 'e', net: '0' }]);
    expect(after.parts.find((p) => p.name === 'RPULL')!.terminals.map((t) => t.net)).toEqual(['VCC', 'XS0.LDN']);
    // The collector and the new pull-up now share the kept net: drawn inside, not as a port.
    expect(after.nets.find((n) => n.name === 'XS0.LDN')).toEqual({ name: 'XS0.LDN', boundary: false });
    expect(after.nets.find((n) => n.name === '0')).toEqual({ name: '0', railVolts: 0, boundary: false });
  });

  it('names gate terminals output first and draws several proposals as one', () => {
    const { before, after } = changedRegionGraphs([bus, ws]);
    expect(before.parts).toHaveLength(3);
    expect(after.parts.map((p) => p.name)).toEqual(['XS1.Q1', 'RPULL', 'UWS2']);
    expect(after.parts[2]!.terminals.map((t) => t.name)).toEqual(['y', 'in1', 'in2']);
    expect(changedRegionGraphs([])).toEqual({ before: { parts: [], nets: [] }, after: { parts: [], nets: [] } });
  });

  it('refuses a device kind the engine does not have', () => {
    expect(() => changedRegionGraphs([{ ...ws, before: [{ name: 'X', kind: 'fuse', terminals: ['A', 'B'] }] }])).toThrow(/unknown kind "fuse"/);
  });
});
