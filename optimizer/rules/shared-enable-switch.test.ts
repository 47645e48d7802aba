// shared-enable-switch: valid cases (no finding) and invalid ones (message id, data, part delta),
// RTL and NMOS stacks, the split into the fewest switches, the sneak-path refusal, the doc examples.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { extractLogic } from '../extract';
import { exprToString } from '../logic/expr';
import { NetlistBuilder } from '../netlist/build';
import type { FlatNetlist } from '../netlist/ir';
import { applyProposals } from '../rewrite/apply';
import { simulate } from '../verify/switch-sim';
import { scan, verifyProposal } from './scan';
import { sharedEnableSwitch } from './shared-enable-switch';
import { checkDeckExample, countDelta, deckExamples, deckNetlist, runOne, scanOne } from './support/rule-test-kit';
import { emptyEdit, type Edit, type Proposal, type Rule } from './types';

const rule = sharedEnableSwitch as unknown as Rule;

/**
 * Per bit k: output Yk pulled up by RC, data transistor QD (base from Dk) over an enable
 * transistor QE (base from EN or from `enable(k)`), emitter to ground.
 *
 *   VCC ─RC─ Yk ─ QD(Dk) ─ Nk ─ QE(EN) ─ 0
 */
function rtlStacks(n: number, o: { rc?: number; rbe?: number; enable?: (k: number) => string; extra?: boolean } = {}): FlatNetlist {
  const b = new NetlistBuilder('Wren-8 bus output stacks');
  b.rail('VCC', 5);
  b.model('QN', 'npn', { IS: 1e-14, BF: 100 });
  for (let k = 0; k < n; k++) {
    b.within([`XO${k}`], () => {
      b.resistor('RC', 'VCC', 'Y', o.rc ?? 1000);
      b.resistor('RD', `/D${k}`, 'BD', 4700);
      b.npn('QD', 'Y', 'BD', 'N');
      b.resistor('RE', `/${o.enable ? o.enable(k) : 'EN'}`, 'BE', o.rbe ?? 2200);
      b.npn('QE', 'N', 'BE', '0');
      if (o.extra) {
        // a second pull-down straight to ground (e.g. a clear), parallel to the stack
        b.resistor('RX', `/X${k}`, 'BX', 4700);
        b.npn('QX', 'Y', 'BX', '0');
      }
    });
  }
  return b.build();
}

function nmosStacks(n: number): FlatNetlist {
  const b = new NetlistBuilder('Wren-8 NMOS bus stacks');
  b.rail('VDD', 5);
  b.model('NM', 'nmos', { VTO: 1, KP: 2e-5 });
  for (let k = 0; k < n; k++) {
    b.within([`XN${k}`], () => {
      b.resistor('RL', 'VDD', 'Y', 20000);
      b.nmos('MD', 'Y', `/D${k}`, 'N');
      b.nmos('ME', 'N', '/EN', '0');
    });
  }
  return b.build();
}

describe('shared-enable-switch: valid (no finding)', () => {
  it.each([
    ['one stack only', rtlStacks(1)],
    ['every stack has its own enable', rtlStacks(4, { enable: (k) => `EN${k}` })],
  ])('%s', async (_l, nl) => {
    const r = await runOne(rule, nl);
    expect(r.ruleErrors).toEqual([]);
    expect(r.findings).toEqual([]);
  });
});

describe('shared-enable-switch: invalid (findings)', () => {
  it('four RTL stacks on EN meet on one switch (3 transistors, 3 resistors saved) and keep their functions', async () => {
    const nl = rtlStacks(4);
    const r = await runOne(rule, nl);
    expect(r.ruleErrors).toEqual([]);
    const f = r.findings[0];
    expect(f.messageId).toBe('share');
    expect(f.data).toMatchObject({ count: 4, enable: 'EN', switches: 1 });
    expect(f.data.where).toBe('bit 0 of slice XO0, bit 1 of slice XO1, bit 2 of slice XO2, bit 3 of slice XO3');
    const p = f.proposals[0];
    expect(p.edit.removeDevices).toEqual(['XO1.QE', 'XO1.RE', 'XO2.QE', 'XO2.RE', 'XO3.QE', 'XO3.RE']);
    expect(p.edit.mergeNets).toEqual([1, 2, 3].map((k) => ({ keep: 'XO0.N', remove: `XO${k}.N` })));
    expect(p.margins.map((m) => [m.name, m.status])).toEqual([
      ['sink current', 'pass'],
      ['forced β', 'warn'],
      ['stacked low level', 'warn'],
      ['sneak paths', 'pass'],
    ]);
    const d = countDelta(nl, p);
    expect(d.actual).toEqual({ transistors: 3, resistors: 3, diodes: 0 });
    expect(d.actual).toEqual(d.stated);
    // Re-extracting the rewrite gives each output !(Dk & EN) still.
    const after = extractLogic(applyProposals(nl, [p]));
    for (let k = 0; k < 4; k++) {
      const node = after.nodes.find((n) => n.name === `XO${k}.Y`)!;
      expect(exprToString(node.fn)).toBe(`!(D${k} & EN)`);
    }
  });

  it('eight stacks fail forced β on one switch and pass as the fewest that keep it', async () => {
    // 8 × 1k pull-ups ≈ 40 mA through one switch fed by 6.8k: forced β ≈ 67 (common practice:
    // keep ≤ 10; fail above β_min 50) — the rule splits until forced β passes.
    const nl = rtlStacks(8, { rbe: 6800 });
    const f = (await runOne(rule, nl)).findings[0];
    expect(f.messageId).toBe('share');
    expect(f.data.switches).toBe(2);
    const beta = f.proposals[0].margins.find((m) => m.name === 'forced β')!;
    expect(beta.status).not.toBe('fail');
    const d = countDelta(nl, f.proposals[0]);
    expect(d.actual.transistors).toBe(8 - Number(f.data.switches));
    expect(d.actual).toEqual(d.stated);
  });

  it('refuses the rewrite when a parallel pull-down makes a sneak path through the common node', async () => {
    // With EN off, D0 and D1 on and X1 on, Y0 reaches ground through QD0, the common node, QD1
    // (either way in a switch-level model) and QX1: Y0 would read 0 where it read 1.
    const nl = rtlStacks(2, { extra: true });
    const f = (await runOne(rule, nl)).findings[0];
    expect(f.messageId).toBe('failing');
    const sneak = f.proposals[0].margins.find((m) => m.name === 'sneak paths')!;
    expect(sneak.status).toBe('fail');
    expect(sneak.value).toBeGreaterThan(0);
    expect(f.data.failed).toContain('sneak paths');
  });

  it('shares the enable transistor of NMOS stacks (sneak check only: no bipolar margins)', async () => {
    const nl = nmosStacks(3);
    const f = (await runOne(rule, nl)).findings[0];
    expect(f.messageId).toBe('share');
    expect(f.proposals[0].margins.map((m) => m.name)).toEqual(['sneak paths']);
    expect(countDelta(nl, f.proposals[0]).actual).toEqual({ transistors: 2, resistors: 0, diodes: 0 });
  });
});

describe('shared-enable-switch: doc examples', () => {
  const examples = deckExamples(path.join(__dirname, 'shared-enable-switch.md'));
  it('has examples', () => expect(examples.length).toBeGreaterThanOrEqual(2));
  it.each(examples.map((e) => [e.label, e] as const))('%s', (_l, ex) => checkDeckExample(rule, ex));
  it('scans as the doc says: the first proved and ready, the second refuted at switch level by a vector that tells the designs apart', async () => {
    const scanned = [];
    for (const ex of examples.slice(0, 2)) {
      const nl = deckNetlist(ex.deck);
      scanned.push({ nl, p: (await scanOne(rule, nl)).findings[0].proposals[0] });
    }
    expect(scanned.map(({ p }) => [p.verification.status, p.verification.method, p.verdict])).toEqual([
      ['proved', 'exhaustive', 'ready'],
      ['refuted', 'switch-level', 'refuted'],
    ]);
    const { nl, p } = scanned[1];
    // the rule's own sneak check fails the same rewrite
    expect(p.margins.find((m) => m.name === 'sneak paths')!.status).toBe('fail');
    const cex = p.verification.counterexample!;
    // with the shared switch off a line still reaches ground through the other bit's clear
    expect(cex.BUSEN).toBe(0);
    expect(distinguishing(nl, applyProposals(nl, [p.proposal]), cex, ['Y0', 'Y1']).length).toBeGreaterThan(0);
  });
});

/** Nets whose switch-level values, both definite, differ between the two designs on one vector. */
function distinguishing(before: FlatNetlist, after: FlatNetlist, vector: Record<string, 0 | 1>, nets: string[]): string[] {
  const stimulus = { kind: 'vectors' as const, vectors: [vector] };
  const b = simulate(before, stimulus, { watch: nets }).waveforms;
  const a = simulate(after, stimulus, { watch: nets }).waveforms;
  return nets.filter((n) => (b[n][0] === 0 || b[n][0] === 1) && (a[n][0] === 0 || a[n][0] === 1) && b[n][0] !== a[n][0]);
}

const proposalOf = (edit: Edit): Proposal => ({ id: 'p', title: 'hand-made shared switch', edit, assumptions: [], margins: [] });

/** The rule's own edit shape: every other stack's QE and RE removed, its N joined to XO0.N. */
function shareByHand(others: number[]): Edit {
  const edit = emptyEdit();
  for (const k of others) {
    edit.removeDevices.push(`XO${k}.QE`, `XO${k}.RE`);
    edit.mergeNets.push({ keep: 'XO0.N', remove: `XO${k}.N` });
  }
  return edit;
}

describe('shared-enable-switch: scan verification', () => {
  it('joined emitter nodes: every stack on them is compared and simulated, and the shared switch is proved', async () => {
    const nl = rtlStacks(4);
    const r = await scanOne(rule, nl);
    const p = r.findings[0].proposals[0];
    expect(p.verification.status).toBe('proved');
    // the kept stack (XO0) changes too: its emitter node now carries the other three
    expect(p.verification.compared).toEqual(['XO0.Y', 'XO1.Y', 'XO2.Y', 'XO3.Y']);
    // D0..D3 and EN, every combination, before and after
    expect(p.verification.simulatedVectors).toBe(32);
    expect(p.verdict).toBe('ready');
  });

  it('the Wren-8 output port demo is proved and ready', async () => {
    const file = path.join(__dirname, '../../server/db/demo/wren8-output-port.cir');
    const nl = deckNetlist(readFileSync(file, 'utf8'), file);
    const p = (await scanOne(rule, nl)).findings[0].proposals[0];
    expect(p.verification).toMatchObject({ status: 'proved', compared: ['Y0', 'Y1', 'Y2', 'Y3'] });
    expect(p.verdict).toBe('ready');
  });

  it('a shared switch on stacks with different enables is refuted by a vector that tells the designs apart', () => {
    const nl = rtlStacks(2, { enable: (k) => `EN${k}` });
    const p = proposalOf(shareByHand([1]));
    const v = verifyProposal({ nl, view: extractLogic(nl) }, p, []);
    expect(v.status).toBe('refuted');
    const cex = v.counterexample!;
    // bit 1 now switched by EN0: only a vector with D1 on and the enables apart shows it
    expect(cex.D1).toBe(1);
    expect(cex.EN0).not.toBe(cex.EN1);
    expect(v.differing!.map((d) => d.name)).toEqual(['XO1.Y']);
    expect(distinguishing(nl, applyProposals(nl, [p]), cex, ['XO0.Y', 'XO1.Y'])).toEqual(['XO1.Y']);
  });

  it("a data transistor's collector tied to another bit's line is refuted by a vector that tells the designs apart", () => {
    const nl = rtlStacks(3);
    const edit = shareByHand([1, 2]);
    edit.reconnect.push({ device: 'XO1.QD', terminal: 0, net: 'XO0.Y' });
    const p = proposalOf(edit);
    const v = verifyProposal({ nl, view: extractLogic(nl) }, p, []);
    expect(v.status).toBe('refuted');
    const cex = v.counterexample!;
    const nets = ['XO0.Y', 'XO1.Y', 'XO2.Y'];
    const seen = distinguishing(nl, applyProposals(nl, [p]), cex, nets);
    expect(seen).toContain(v.differing![0].name);
    // bit 0's line is pulled low by bit 1's data now: D1 and EN on, D0 off
    expect(cex).toMatchObject({ D0: 0, D1: 1, EN: 1 });
  });
});

/** Three bits of an NMOS read port: VDD ─47k─ SBk ─ MR(Zk) ─ N ─ ME(RDF) ─ 0. */
const NMOS_READ = `Wren-8 NMOS read port
.global VDD
VDD VDD 0 DC 5
.subckt RBIT Z RDF SB
RL VDD SB 47k
MR SB Z N 0 NM
ME N RDF 0 0 NM
.ends RBIT
XR0 Z0 RDF SB0 RBIT
XR1 Z1 RDF SB1 RBIT
XR2 Z2 RDF SB2 RBIT
.model NM NMOS (VTO=1 KP=2e-5)
.end
`;

/** Three DTL bus bits; the enable transistor's base network (from EN to BE) as given. */
const DTL_BASES = {
  gate: 'RP VCC P 2k\nDI P EN DN\nDL1 P M DN\nDL2 M BE DN',
  diode: 'DB EN BE DN',
  resistorDiode: 'RE EN X 2.2k\nDB X BE DN',
};
function dtlBus(base: string, bits = 3): string {
  return `Wren-8 DTL bus bits
.global VCC
VCC VCC 0 DC 5
.subckt OBIT D EN Y
RC VCC Y 2k
RD D BD 4.7k
QD Y BD N QN
${base}
RB BE 0 5k
QE N BE 0 QN
.ends OBIT
${Array.from({ length: bits }, (_, k) => `XO${k} D${k} BUSEN Y${k} OBIT`).join('\n')}
.model QN NPN (IS=1e-14 BF=100)
.model DN D (IS=1e-14)
.end
`;
}

describe('shared-enable-switch: internal nets of enable stacks stay internal', () => {
  it.each([
    ['NMOS stacks with 47k loads', NMOS_READ, 'SB', 'Z', 'RDF', 'nmos'],
    ['DTL bits, enable base from a diode gate (input diode, two level-shift diodes)', dtlBus(DTL_BASES.gate), 'Y', 'D', 'BUSEN', 'dtl'],
    ['DTL bits, enable base through a level-shift diode', dtlBus(DTL_BASES.diode), 'Y', 'D', 'BUSEN', 'dtl'],
    ['DTL bits, enable base through a resistor and a diode', dtlBus(DTL_BASES.resistorDiode), 'Y', 'D', 'BUSEN', 'dtl'],
  ])('%s: each output is NOT(data AND enable), and every proposal of a full scan is proved', async (_l, deck, out, data, enable, family) => {
    const nl = deckNetlist(deck);
    const view = extractLogic(nl);
    // only the real inputs: no stack middle node, no diode-fed base
    expect(view.inputs).toEqual([enable, `${data}0`, `${data}1`, `${data}2`].sort());
    for (let k = 0; k < 3; k++) {
      const node = view.nodes.find((n) => n.name === `${out}${k}`)!;
      expect(exprToString(node.fn)).toBe(`!(${data}${k} & ${enable})`);
      expect(node.family).toBe(family);
    }
    const r = await scan(nl, { view });
    const shared = r.findings.filter((f) => f.finding.ruleId === 'shared-enable-switch');
    expect(shared).toHaveLength(1);
    const p = shared[0].proposals[0];
    expect(p.verification).toMatchObject({ status: 'proved', compared: [0, 1, 2].map((k) => `${out}${k}`) });
    expect(p.verdict).toBe('ready');
    for (const f of r.findings) for (const q of f.proposals) expect([f.finding.ruleId, q.verification.status]).toEqual([f.finding.ruleId, 'proved']);
  });
});

describe('shared-enable-switch: DTL bus bits of any width', () => {
  // Device and net numbers shift with the width: the reading of a diode-fed base must not.
  it.each(Object.entries(DTL_BASES))('enable base %s: one shared switch, proved, at 3, 4, 5 and 12 bits', async (_l, base) => {
    for (const bits of [3, 4, 5, 12]) {
      const nl = deckNetlist(dtlBus(base, bits));
      const r = await scan(nl);
      const shared = r.findings.filter((f) => f.finding.ruleId === 'shared-enable-switch');
      expect([bits, shared.length]).toEqual([bits, 1]);
      const p = shared[0].proposals[0];
      expect([bits, p.verification.status, p.verification.compared]).toEqual([bits, 'proved', Array.from({ length: bits }, (_, k) => `Y${k}`).sort()]);
      for (const f of r.findings) for (const q of f.proposals) expect([bits, f.finding.ruleId, q.verification.status]).toEqual([bits, f.finding.ruleId, 'proved']);
    }
  });
});
