// Proves applying proposals: the input is untouched, overlaps are refused with a clear message,
// merges and reconnections land where stated, and part counts change by exactly the savings.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { InputError } from '../errors';
import { editSavings, sumSavings } from '../cost/cost';
import { countFlat } from '../netlist/counts';
import { sliceInverters } from '../rules/test-helpers';
import { emptyEdit, type Proposal } from '../rules/types';
import { applyProposals, flatToDesign } from './apply';

const netOf = (nl: ReturnType<typeof sliceInverters>, device: string, terminal: number) =>
  nl.nets[nl.devices.find((d) => d.name === device)!.terminals[terminal]].name;

/** Share slice 0's inverter: remove slices 1..3's transistors and resistors, merge their outputs. */
function shareDriver(): Proposal {
  const edit = emptyEdit();
  for (let k = 1; k < 4; k++) {
    edit.removeDevices.push(`XS${k}.Q1`, `XS${k}.RC`, `XS${k}.RB`);
    edit.mergeNets.push({ keep: 'XS0.LDN', remove: `XS${k}.LDN` });
  }
  return { id: 'shared-control-driver-1', title: 'one load inverter for four slices', edit, assumptions: [], margins: [] };
}

describe('applyProposals', () => {
  it('applies removals and merges, leaving the input netlist unchanged', () => {
    const nl = sliceInverters(4);
    const before = countFlat(nl);
    const p = shareDriver();
    const out = applyProposals(nl, [p]);
    expect(nl.devices).toHaveLength(13);
    expect(out.devices.map((d) => d.name)).toEqual(['VVCC', 'XS0.RC', 'XS0.RB', 'XS0.Q1']);
    expect(out.netByName.get('XS3.LDN')).toBe(out.netByName.get('XS0.LDN'));
    const after = countFlat(out);
    const s = editSavings(nl, p.edit);
    expect(before.transistors - after.transistors).toBe(s.transistors);
    expect(before.resistors - after.resistors).toBe(s.resistors);
    expect(s).toMatchObject({ transistors: 3, resistors: 6 });
  });

  it('reconnects terminals and adds devices on new nets', () => {
    const nl = sliceInverters(2);
    const p: Proposal = {
      id: 'p1',
      title: 'steer',
      assumptions: [], margins: [],
      edit: {
        ...emptyEdit(),
        reconnect: [{ device: 'XS1.RB', terminal: 0, net: 'XS0.LDN' }],
        addDevices: [{ name: 'DSTEER', kind: 'diode', terminals: ['XS1.LDN', 'SHARED'] }],
      },
    };
    const out = applyProposals(nl, [p]);
    expect(netOf(out, 'XS1.RB', 0)).toBe('XS0.LDN');
    expect(netOf(out, 'DSTEER', 1)).toBe('SHARED');
    expect(netOf(nl, 'XS1.RB', 0)).toBe('LOAD');
  });

  it('refuses overlapping proposals naming both and what they share', () => {
    const nl = sliceInverters(2);
    const a: Proposal = { id: 'rule-a', title: 'a', assumptions: [], margins: [], edit: { ...emptyEdit(), removeDevices: ['XS0.Q1'] } };
    const b: Proposal = { id: 'rule-b', title: 'b', assumptions: [], margins: [], edit: { ...emptyEdit(), reconnect: [{ device: 'XS0.Q1', terminal: 1, net: 'LOAD' }] } };
    expect(() => applyProposals(nl, [a, b])).toThrow(InputError);
    expect(() => applyProposals(nl, [a, b])).toThrow(/rule-a and rule-b overlap \(both change device XS0.Q1\)/);
  });

  it('refuses an edit that does not fit the netlist', () => {
    const nl = sliceInverters(1);
    const p: Proposal = { id: 'p', title: 'p', assumptions: [], margins: [], edit: { ...emptyEdit(), addDevices: [{ name: 'QN', kind: 'npn', terminals: ['a', 'b'] }] } };
    expect(() => applyProposals(nl, [p])).toThrow(/npn QN with 2 terminals/);
  });

  it('changes part counts by exactly the stated savings for any set of disjoint removals', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 6 }), fc.array(fc.boolean(), { minLength: 18, maxLength: 18 }), (slices, picks) => {
        const nl = sliceInverters(slices);
        const removable = nl.devices.filter((d) => d.kind !== 'vsource');
        const proposals: Proposal[] = removable
          .filter((_, i) => picks[i % picks.length])
          .map((d, i) => ({ id: `p${i}`, title: d.name, assumptions: [], margins: [], edit: { ...emptyEdit(), removeDevices: [d.name], addDevices: i % 2 ? [{ name: `RNEW${i}`, kind: 'resistor', terminals: ['VCC', `N${i}`], value: 1000 }] : [] } }));
        const before = countFlat(nl);
        const after = countFlat(applyProposals(nl, proposals));
        const s = sumSavings(proposals.map((p) => editSavings(nl, p.edit)));
        expect(before.transistors - after.transistors).toBe(s.transistors);
        expect(before.resistors - after.resistors).toBe(s.resistors);
        expect(before.diodes - after.diodes).toBe(s.diodes);
      }),
      { numRuns: 100 },
    );
  });
});

describe('flatToDesign', () => {
  it('makes one top cell with element names that start with their kind letter', () => {
    const d = flatToDesign(applyProposals(sliceInverters(2), []));
    const names = d.cells[d.top].devices.map((x) => x.name);
    expect(names).toEqual(['VVCC', 'R_XS0_RC', 'R_XS0_RB', 'Q_XS0_Q1', 'R_XS1_RC', 'R_XS1_RB', 'Q_XS1_Q1']);
    expect(d.cells[d.top].devices[3].terminals).toEqual(['XS0.LDN', 'XS0.B', '0']);
    expect(d.globals).toEqual(['0', 'VCC']);
  });

  it('gives the same circuit, net by net name, when it keeps the input\'s net ids for a proof', () => {
    const nl = sliceInverters(4);
    const p = shareDriver();
    p.edit.reconnect.push({ device: 'XS0.RB', terminal: 0, net: 'CLR' });
    const plain = applyProposals(nl, [p]);
    const shared = applyProposals(nl, [p], { share: true });
    const wiring = (x: typeof nl) => x.devices.map((d) => [d.name, d.kind, d.value, d.terminals.map((t) => x.nets[t].name)]);
    expect(wiring(shared)).toEqual(wiring(plain));
    for (const n of nl.nets) expect(shared.nets[shared.netByName.get(n.name)!].name).toBe(plain.nets[plain.netByName.get(n.name)!].name);
    expect(shared.rails.map((r) => shared.nets[r.net].name)).toEqual(plain.rails.map((r) => plain.nets[r.net].name));
    // untouched devices are the input's own objects; the rewired one is a new object
    expect(shared.devices.find((d) => d.name === 'XS0.Q1')).toBe(nl.devices.find((d) => d.name === 'XS0.Q1'));
    expect(shared.devices.find((d) => d.name === 'XS0.RB')).not.toBe(nl.devices.find((d) => d.name === 'XS0.RB'));
    expect(nl.devices).toHaveLength(13);
  });

  it('names the shared copy\'s nets like a whole map of them: look-ups, iteration, size and changes', () => {
    const nl = sliceInverters(4);
    const p = shareDriver();
    p.edit.addDevices.push({ name: 'RX', kind: 'resistor', terminals: ['XS0.LDN', 'SPARE'], value: 1000 });
    const shared = applyProposals(nl, [p], { share: true });
    // What a map filled net by net (then the added names) holds.
    const expected = new Map<string, number>();
    for (const n of nl.nets) expected.set(n.name, shared.netByName.get(n.name)!);
    expected.set('SPARE', shared.nets.length - 1);
    expect(shared.nets[expected.get('SPARE')!].name).toBe('SPARE');
    expect(shared.netByName.get('XS1.LDN')).toBe(shared.netByName.get('XS0.LDN'));
    expect(shared.netByName.has('NO-SUCH-NET')).toBe(false);
    expect(shared.netByName.get('NO-SUCH-NET')).toBeUndefined();
    expect(shared.netByName.size).toBe(expected.size);
    expect(new Map(shared.netByName)).toEqual(expected);
    shared.netByName.delete('SPARE');
    expect(shared.netByName.has('SPARE')).toBe(false);
    expect(shared.netByName.size).toBe(expected.size - 1);
  });
});
