// Proves the part-by-part proof of design-wide edits: on chained bit slices every rule's edit gets
// the whole-design proof's verdict and compared nets, slices cut out alike share one key, an edit
// whose correctness rests on logic beyond the cut falls back to the whole design (and is proved),
// and a wrong edit is still refuted.
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { extractLogic } from '../extract';
import { readSpice } from '../formats/spice/read';
import { writeSpice } from '../formats/spice/write';
import { NetlistBuilder } from '../netlist/build';
import { flatten } from '../netlist/flatten';
import { generateBitSliced } from '../netlist/generate';
import type { FlatNetlist } from '../netlist/ir';
import { partKey } from '../region/part-key';
import { createEspressoMinimiser } from '../logic/espresso/espresso-minimiser';
import { constantInput } from './constant-input';
import { cutParts, partRegion } from './cut-parts';
import { defineRule } from './define-rule';
import { mergeDuplicateLogic } from './merge-duplicate-logic';
import { RULES } from './index';
import { indexOf, terminalRows } from './region';
import { scan, verifyProposal } from './scan';
import { sharedControlDriver } from './shared-control-driver';
import { emptyEdit, type Proposal } from './types';

/** Chained RTL register slices as the bench generates them (slice k's input is slice k-1's output). */
function slices(n: number, family: 'rtl' | 'cmos' = 'rtl'): FlatNetlist {
  return flatten(readSpice(writeSpice(generateBitSliced({ slices: n, family })), 'slices.cir').design);
}

const sliceRules = {
  [sharedControlDriver.id]: sharedControlDriver,
  [mergeDuplicateLogic.id]: mergeDuplicateLogic,
  [constantInput.id]: constantInput,
};

describe('proof part by part', () => {
  it.each([
    ['rtl', 'the slice rules'],
    ['cmos', 'every rule'],
  ] as const)('gives every edit on chained %s slices (%s) the whole-design verdict and compared nets', async (family, _rules) => {
    const nl = slices(12, family);
    const rules = family === 'rtl' ? sliceRules : RULES;
    const minimiser = createEspressoMinimiser({ size: 1 });
    try {
      // simulateUpTo below the design's size sends large edits through the parts; above it, the
      // same edits are proved on the whole design (the reference).
      const parts = await scan(nl, { rules, simulateUpTo: 100, minimiser });
      const whole = await scan(nl, { rules, simulateUpTo: 100_000, minimiser });
      const proposals = parts.findings.flatMap((f) => f.proposals);
      const reference = whole.findings.flatMap((f) => f.proposals);
      expect(proposals.length).toBe(reference.length);
      expect(proposals.filter((p) => /proved in \d+ parts/.test(p.verification.note ?? '')).length).toBeGreaterThanOrEqual(2);
      proposals.forEach((p, k) => {
        expect(p.proposal.id).toBe(reference[k].proposal.id);
        expect(p.verification.status).toBe(reference[k].verification.status);
        expect(p.verification.compared).toEqual(reference[k].verification.compared);
        expect(p.verification.status).toBe('proved');
      });
    } finally {
      minimiser.close();
    }
  });

  it('splits a shared driver into one part per slice, and slices cut out alike share a key', async () => {
    const nl = slices(10);
    const view = extractLogic(nl);
    const r = await scan(nl, { rules: { [sharedControlDriver.id]: sharedControlDriver }, view, simulateUpTo: 100 });
    const p = r.findings[0].proposals[0].proposal;
    const ids = (names: string[]) => names.map((n) => nl.netByName.get(n)!).filter((id) => id !== undefined);
    const changed = { ids: ids(r.findings[0].proposals[0].verification.compared), others: [] };
    const split = cutParts(nl, view, p.edit, changed)!;
    expect(split).toBeDefined();
    const list = Array.from({ length: split.count }, (_, k) => split.part(k));
    // Every merged slice is a part of its own; the kept driver is compared in one more.
    expect(list.filter((x) => x.edit.mergeNets.length === 1)).toHaveLength(p.edit.mergeNets.length);
    const keys = list.map((part) => {
      const region = partRegion(nl, view, part)!;
      const { byName } = indexOf(nl);
      return partKey(nl, { ...region, changed: part.changed, edit: part.edit, removed: part.removed, moved: part.moved, assumptions: [], extra: '', terminals: terminalRows(nl), deviceIndex: (n) => byName.get(n) }).key;
    });
    // Ten slices at four loads a driver: drivers in slices 0 and 5, eight slices merged onto them,
    // and the two kept drivers compared on their own: 10 parts. A merged slice whose input comes
    // from its driver's own slice is cut differently (one instance holds both), so 3 keys in all.
    expect(list).toHaveLength(10);
    expect(new Set(keys).size).toBe(3);
  });

  it('falls back to the whole design when a part holds only through logic beyond its cut', async () => {
    // P = NOT A; Q = NOT(NOT(NOT A)) through two more inverters. Merging Q into P is correct, but a
    // part cut at Q's unchanged input N2 compares NOT N2 with NOT A and cannot prove it.
    const b = new NetlistBuilder('Wren-8 strobe copies');
    b.rail('VCC', 5);
    b.model('QN', 'npn', { IS: 1e-14, BF: 100 });
    const inverter = (name: string, input: string, output: string) => {
      b.resistor(`RC${name}`, 'VCC', output, 1000);
      b.resistor(`RB${name}`, input, `B${name}`, 4700);
      b.npn(`Q${name}`, output, `B${name}`, '0', { model: 'QN' });
    };
    inverter('P', 'A', 'P');
    inverter('1', 'A', 'N1');
    inverter('2', 'N1', 'N2');
    inverter('Q', 'N2', 'Q');
    inverter('L', 'Q', 'OUT');
    const nl = b.build();
    const view = extractLogic(nl);
    const edit = emptyEdit();
    edit.removeDevices.push('RCQ', 'RBQ', 'QQ');
    edit.mergeNets.push({ keep: 'P', remove: 'Q' });
    const proposal: Proposal = { id: 'merge-q', title: 'merge Q into P', edit, assumptions: [], margins: [] };
    const r = verifyProposal({ nl, view }, proposal, [], undefined, 1, new Map());
    expect(r.status).toBe('proved');
    expect(r.note ?? '').not.toMatch(/parts?/);
    expect(r.compared).toEqual(expect.arrayContaining(['OUT', 'Q']));
  });

  it('still refutes a wrong design-wide edit, with a counterexample that tells the designs apart', async () => {
    const nl = slices(8);
    const wrong = defineRule({
      id: 'test-wrong-merge',
      meta: { description: 'merge each slice output into its enable', messages: { m: 'merge' }, optionsSchema: z.object({}), defaultOptions: {} },
      find(ctx) {
        const edit = emptyEdit();
        for (let k = 1; k < 8; k++) {
          edit.removeDevices.push(`X${k}.QEN`, `X${k}.RBEN`, `X${k}.RCEN`);
          // X0.Q is constant (its data input is a rail), not the enable: a wrong shared line.
          edit.mergeNets.push({ keep: 'X0.Q', remove: `X${k}.ENB` });
        }
        ctx.report({ messageId: 'm', data: {}, location: { devices: ['X1.QEN'], nets: [] }, proposals: [{ title: 'wrong', edit, margins: [] }] });
      },
    });
    const r = await scan(nl, { rules: { [wrong.id]: wrong }, simulateUpTo: 100 });
    const v = r.findings[0].proposals[0].verification;
    expect(v.status).toBe('refuted');
    expect(v.differing?.length).toBeGreaterThan(0);
  });
});
