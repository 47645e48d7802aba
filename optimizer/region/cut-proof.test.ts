// The cut-point proof of design-wide edits against the whole-design proof: the same verification on
// generated bit slices (RTL, DTL, CMOS), a slice that differs proved on its own, and a rewrite that
// is wrong for one load refuted by the whole proof with that slice's nets.
import { describe, expect, it } from 'vitest';
import { extractLogic } from '../extract';
import { readSpice } from '../formats/spice/read';
import { and, not, or, v } from '../logic/expr';
import { flatten } from '../netlist/flatten';
import { generateBitSliced, type Family } from '../netlist/generate';
import type { Design, FlatNetlist } from '../netlist/ir';
import { applyProposals } from '../rewrite/apply';
import { scan, verifyProposal } from '../rules/scan';
import type { Proposal } from '../rules/types';
import { canonicalPair, cutProof } from './cut-proof';

// Both on the whole design (no region cut out), without the switch-level check.
const WHOLE = { cut: 'never', wholeDesign: true } as const;
const CUT_FIRST = { cut: 'always', wholeDesign: true } as const;

/** DTL bus bits, as the demo bus driver's, `n` of them, each with its own enable inverter of OEN. */
function dtlBusBits(n: number): FlatNetlist {
  const each = (line: (i: number) => string) => Array.from({ length: n }, (_, i) => line(i)).join('\n');
  // Instances, then the bus pull-ups, then the sources, as the demo deck lists them.
  const bits = [
    each((i) => `XO${i} D${i} OEN BUS${i} BUSBIT`),
    each((i) => `RL${i} VCC BUS${i} 2k`),
    each((i) => `VD${i} D${i} 0 PULSE(0 5 0 10n 10n ${i + 1}u ${2 * i + 2}u)`),
  ].join('\n');
  const deck = `Larkspur DTL bus bits (test)
.global VCC
VCC VCC 0 DC 5
.subckt BUSBIT D OEN Y
RPI VCC PI 4.7k
DI PI OEN DX
DI1 PI MI DX
DI2 MI BI DX
RBI BI 0 5k
RCI VCC EN 2k
QI EN BI 0 QN
RPD VCC PD 4.7k
DA PD D DX
DB PD EN DX
DD1 PD MD DX
DD2 MD BD DX
RBD BD 0 5k
QD Y BD 0 QN
.ends BUSBIT
${bits}
VOE OEN 0 PULSE(0 5 8u 10n 10n 8u 16u)
.model QN NPN (IS=1e-14 BF=50)
.model DX D (IS=1e-14)
.end
`;
  return flatten(readSpice(deck, 'bus.cir').design);
}

const sliced = (family: Family, slices: number, edit?: (d: Design) => void): FlatNetlist => {
  const design = generateBitSliced({ slices, family, flat: true });
  edit?.(design);
  return flatten(design);
};

async function proposalsOf(nl: FlatNetlist) {
  const r = await scan(nl, { simulateUpTo: 0 });
  return { view: r.view, proposals: r.findings.flatMap((f) => f.proposals.map((p) => p.proposal)) };
}

function cutOf(nl: FlatNetlist, view: ReturnType<typeof extractLogic>, p: Proposal) {
  const whole = verifyProposal({ nl, view }, p, [], undefined, 0, undefined, WHOLE);
  const after = applyProposals(nl, [p], { share: true });
  // The nets the whole proof compared are among the changed nets the cut is given.
  return { whole, cut: cutProof({ nl, view }, after, p.edit, [...whole.compared].sort()) };
}

describe('canonicalPair', () => {
  it('gives one key to problems that differ only in variable names', () => {
    const a = canonicalPair(not(or(v('S1_D'), v('S1_ENB'))), not(or(v('S1_D'), v('S0_ENB'))));
    const b = canonicalPair(not(or(v('S7_D'), v('S7_ENB'))), not(or(v('S7_D'), v('S0_ENB'))));
    expect(a).toBeDefined();
    expect(a).toBe(b);
    // The same shape with a variable shared across the sides is another problem.
    expect(canonicalPair(not(or(v('D'), v('E'))), not(or(v('D'), v('E'))))).not.toBe(a);
    expect(canonicalPair(and(v('x'), v('y')), or(v('x'), v('y')))).not.toBe(canonicalPair(and(v('x'), v('y')), and(v('x'), v('y'))));
  });

  it('gives no key past its budget', () => {
    let e = v('x0');
    for (let i = 1; i < 50; i++) e = and(e, or(v(`x${i}`), e));
    expect(canonicalPair(e, e, 500)).toBeUndefined();
  });
});

describe('cut-point proof of design-wide edits', () => {
  for (const [label, build] of [
    ['RTL', () => sliced('rtl', 12)],
    ['CMOS', () => sliced('cmos', 12)],
    ['DTL', () => dtlBusBits(12)],
  ] as const) {
    it(`${label} bit slices: the same verification as the whole-design proof, repeated slices proved once`, async () => {
      const nl = build();
      const { view, proposals } = await proposalsOf(nl);
      expect(proposals.length).toBeGreaterThan(0);
      let cutProved = 0;
      for (const p of proposals) {
        const whole = verifyProposal({ nl, view }, p, [], undefined, 0, undefined, WHOLE);
        const first = verifyProposal({ nl, view }, p, [], undefined, 0, undefined, CUT_FIRST);
        expect(first).toEqual(whole);
        const { cut } = cutOf(nl, view, p);
        if (!cut.proved) continue;
        cutProved++;
        expect(whole.status).toBe('proved');
        expect(cut.proved.compared).toEqual(whole.compared);
        expect(cut.proved.method).toBe(whole.method);
        // Twelve slices of one shape: far fewer problems than nets compared.
        if (cut.proved.outputs >= 12) expect(cut.proved.problems).toBeLessThanOrEqual(cut.proved.outputs / 4);
      }
      expect(cutProved).toBeGreaterThan(0);
    });
  }

  it('proves a slice that differs from the others on its own', async () => {
    const plain = sliced('rtl', 12);
    // Slice 5's line gets one more pull-down, from a test input of its own: another structure.
    const odd = sliced('rtl', 12, (d) =>
      d.cells[d.top].devices.push(
        { name: 'RBT_S5', kind: 'resistor', terminals: ['TEST5', 'S5_BT'], value: 1000, params: {} },
        { name: 'QT_S5', kind: 'npn', terminals: ['S5_Q', 'S5_BT', '0'], model: 'QN', params: {} },
      ),
    );
    const count = async (nl: FlatNetlist) => {
      const { view, proposals } = await proposalsOf(nl);
      const p = proposals.find((x) => x.id.startsWith('shared-control-driver'))!;
      const { whole, cut } = cutOf(nl, view, p);
      expect(whole.status).toBe('proved');
      expect(cut.proved).toBeDefined();
      expect(verifyProposal({ nl, view }, p, [], undefined, 0, undefined, CUT_FIRST)).toEqual(whole);
      return cut.proved!.problems;
    };
    expect(await count(odd)).toBeGreaterThan(await count(plain));
  });

  it('leaves a rewrite that is wrong for one load to the whole proof, which refutes it with that slice', async () => {
    // The data input left free (no source), so every slice's line depends on the data.
    const nl = sliced('rtl', 12, (d) => {
      const top = d.cells[d.top];
      top.devices = top.devices.filter((x) => x.name !== 'VDIN');
    });
    const { view, proposals } = await proposalsOf(nl);
    const good = proposals.find((x) => x.id.startsWith('shared-control-driver'))!;
    // Slice 5's gating resistor moved from its enable (NOT LOAD) onto LOAD itself.
    const broken: Proposal = { ...good, edit: { ...good.edit, reconnect: [...good.edit.reconnect, { device: 'RBE_S5', terminal: 0, net: 'LOAD' }] } };
    const { whole, cut } = cutOf(nl, view, broken);
    expect(cut.proved).toBeUndefined();
    expect(cut).toMatchObject({ reason: 'a cut problem differs', output: 'S5_Q' });
    expect(whole.status).toBe('refuted');
    expect(whole.differing?.map((d) => d.name)).toContain('S5_Q');
    expect(verifyProposal({ nl, view }, broken, [], undefined, 0, undefined, CUT_FIRST)).toEqual(whole);
  });
});
