// two-level-minimise: valid cases (no finding) and invalid cases (findings with message id, data,
// savings equal to the applied part delta, proofs by the scan), per family, and the doc examples.
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { editSavings } from '../cost/cost';
import { extractLogic } from '../extract';
import { readSpice } from '../formats/spice/read';
import { parseExpr } from '../logic/expr-parse';
import { countFlat } from '../netlist/counts';
import { flatten } from '../netlist/flatten';
import { applyProposals } from '../rewrite/apply';
import { runRules } from './run-rules';
import { createEspressoMinimiser } from '../logic/espresso/espresso-minimiser';
import { exactMinimiser, type Minimiser } from '../logic/minimiser';
import { NetlistBuilder } from '../netlist/build';
import type { FlatNetlist } from '../netlist/ir';
import { scan } from './scan';
import { deckExamples } from './support/rule-test-kit';
import { twoLevelMinimise } from './two-level-minimise';
import type { Assumption, Proposal, Rule } from './types';

const rule = twoLevelMinimise as unknown as Rule;

const assumption = (id: string, text: string): Assumption => ({ id, text, expr: parseExpr(text) });

function deckToFlat(text: string): FlatNetlist {
  return flatten(readSpice(text, 'example.cir').design);
}

function runOne(nl: FlatNetlist, o: { ruleOptions?: unknown; assumptions?: Assumption[] } = {}) {
  return runRules(nl, extractLogic(nl), { rules: { [rule.id]: rule }, assumptions: o.assumptions ?? [], ...(o.ruleOptions ? { ruleOptions: { [rule.id]: o.ruleOptions } } : {}) });
}

/** Part counts removed by applying the proposal, and the savings it states. */
function countDelta(nl: FlatNetlist, p: Proposal) {
  const before = countFlat(nl);
  const after = countFlat(applyProposals(nl, [p]));
  const s = editSavings(nl, p.edit);
  return {
    actual: { t: before.transistors - after.transistors, r: before.resistors - after.resistors, d: before.diodes - after.diodes },
    stated: { t: s.transistors, r: s.resistors, d: s.diodes },
  };
}

const examples = deckExamples(path.join(__dirname, 'two-level-minimise.md'));
const deck = (k: number) => deckToFlat(examples[k].deck);

/**
 * RTL redundant NOR pair: Y = NOR(NOR(A, B), NOR(A, B, C)) = A + B, built of five transistors.
 *
 *   A,B ──NOR── T1 ─┐
 *   A,B,C ─NOR─ T2 ─┴─NOR── Y
 */
function rtlRedundant(): FlatNetlist {
  const b = new NetlistBuilder('Wren-8 bus request, RTL');
  b.rail('VCC', 5);
  b.model('QN', 'npn', { IS: 1e-14, BF: 100 });
  const nor = (name: string, ins: string[], out: string) => {
    b.resistor(`RC${name}`, 'VCC', out, 1000);
    ins.forEach((x, i) => {
      b.resistor(`RB${name}${i}`, x, `B${name}${i}`, 4700);
      b.npn(`Q${name}${i}`, out, `B${name}${i}`, '0', { model: 'QN' });
    });
  };
  nor('1', ['A', 'B'], 'T1');
  nor('2', ['A', 'B', 'C'], 'T2');
  nor('3', ['T1', 'T2'], 'Y');
  return b.build();
}

/** Gate level: Y = OR(AND(A, B), AND(A, NOT B)) = A … plus C so it is not a wire: Y = AB + AB' + C. */
function gateRedundant(): FlatNetlist {
  const b = new NetlistBuilder('Wren-8 flag logic, gate level');
  b.gate('U1', 'not', ['BN', 'B']);
  b.gate('U2', 'and', ['T1', 'A', 'B']);
  b.gate('U3', 'and', ['T2', 'A', 'BN']);
  b.gate('U4', 'and', ['T3', 'C', 'D']);
  b.gate('U5', 'or', ['Y', 'T1', 'T2', 'T3']);
  return b.build();
}

describe('two-level-minimise: valid (no finding)', () => {
  it.each([
    ['a block already minimal in NAND–NAND', () => deck(1)],
    ['a single two-input NAND with no assumption', () => deck(2)],
    ['an RTL NOR–NOR that is already minimal', () => {
      const b = new NetlistBuilder('minimal RTL');
      b.rail('VCC', 5);
      b.model('QN', 'npn', { IS: 1e-14, BF: 100 });
      b.resistor('RC1', 'VCC', 'T1', 1000).resistor('RB1', 'A', 'B1', 4700).npn('Q1', 'T1', 'B1', '0', { model: 'QN' });
      b.resistor('RB2', 'B', 'B2', 4700).npn('Q2', 'T1', 'B2', '0', { model: 'QN' });
      b.resistor('RC3', 'VCC', 'Y', 1000).resistor('RB3', 'T1', 'B3', 4700).npn('Q3', 'Y', 'B3', '0', { model: 'QN' });
      return b.build();
    }],
  ])('%s', async (_label, make) => {
    const r = await runOne(make());
    expect(r.ruleErrors).toEqual([]);
    expect(r.findings).toEqual([]);
  });

  it('leaves blocks with more inputs than maxInputs alone', async () => {
    const r = await runOne(deck(0), { ruleOptions: { maxInputs: 2 } });
    expect(r.findings).toEqual([]);
  });

  it('refuses invalid options', async () => {
    await expect(runOne(deck(0), { ruleOptions: { maxInputs: 40 } })).rejects.toThrow(/maxInputs/);
  });
});

describe('two-level-minimise: invalid (findings)', () => {
  it('CMOS carry written term by term → majority, 8 transistors saved, proved', async () => {
    const nl = deck(0);
    const r = await scan(nl, { rules: { [rule.id]: rule } });
    expect(r.ruleErrors).toEqual([]);
    expect(r.findings).toHaveLength(1);
    const f = r.findings[0];
    expect(f.finding.messageId).toBe('smaller');
    expect(f.finding.data).toMatchObject({ net: 'CY', inputs: 3, before: 26, after: 18, form: 'NAND–NAND' });
    const p = f.proposals[0];
    expect(p.savings.transistors).toBe(8);
    expect(p.verification.status).toBe('proved');
    expect(p.verdict).toBe('ready');
    const d = countDelta(nl, p.proposal);
    expect(d.actual).toEqual(d.stated);
  });

  it('RTL redundant NOR pair → NOR plus inverter, parts saved, proved', async () => {
    const nl = rtlRedundant();
    const r = await scan(nl, { rules: { [rule.id]: rule } });
    expect(r.findings).toHaveLength(1);
    const p = r.findings[0].proposals[0];
    // Mano (from memory): RTL NOR-2 = 2 T + 3 R, inverter 1 T + 2 R → 3 T, 5 R instead of 7 T, 10 R.
    expect(p.savings).toMatchObject({ transistors: 4, resistors: 5 });
    expect(p.verification.status).toBe('proved');
    const d = countDelta(nl, p.proposal);
    expect(d.actual).toEqual(d.stated);
  });

  it('gate level: AB + AB\' + CD → A + CD in gates, counted after mapping to CMOS', async () => {
    const r = await scan(gateRedundant(), { rules: { [rule.id]: rule } });
    expect(r.findings).toHaveLength(1);
    const p = r.findings[0].proposals[0];
    expect(p.verification.status).toBe('proved');
    expect(p.savings.gates).toBeGreaterThan(0);
    expect(p.savings.transistors).toBeGreaterThan(0);
    expect(r.findings[0].finding.data.sop).toMatch(/^(A \+ CD|CD \+ A)$/);
  });

  it('uses an assumption only when it buys parts, and names it', async () => {
    const nl = deck(2);
    const a1 = assumption('A1', 'WR -> SEL');
    const r = await scan(nl, { rules: { [rule.id]: rule }, assumptions: [a1, assumption('A2', 'WR | !WR')] });
    expect(r.findings).toHaveLength(1);
    const p = r.findings[0].proposals[0];
    expect(r.findings[0].finding.messageId).toBe('smallerAssuming');
    expect(p.proposal.assumptions).toEqual(['A1', 'A2']);
    expect(p.verification).toMatchObject({ status: 'proved', assumptions: ['A1'] });
    expect(p.savings.transistors).toBe(2);
  });

  it('gives the same covers through the Espresso process pool', async () => {
    const m = createEspressoMinimiser({ size: 1 });
    afterAll(() => m.close());
    const r = await scan(deck(0), { rules: { [rule.id]: rule }, minimiser: m });
    expect(r.findings[0].proposals[0].savings.transistors).toBe(8);
    expect(r.findings[0].proposals[0].verdict).toBe('ready');
  });
});

/** Three copies of the gate-level block (bit slices S0..S2), each with its own nets. */
function gateSlices(): FlatNetlist {
  const b = new NetlistBuilder('Wren-8 flag logic, three slices');
  for (const s of ['S0', 'S1', 'S2']) {
    const n = (x: string) => `${s}_${x}`;
    b.gate(n('U1'), 'not', [n('BN'), n('B')]);
    b.gate(n('U2'), 'and', [n('T1'), n('A'), n('B')]);
    b.gate(n('U3'), 'and', [n('T2'), n('A'), n('BN')]);
    b.gate(n('U4'), 'and', [n('T3'), n('C'), n('D')]);
    b.gate(n('U5'), 'or', [n('Y'), n('T1'), n('T2'), n('T3')]);
  }
  return b.build();
}

describe('two-level-minimise: repeated blocks and batches', () => {
  it('minimises the same block of every slice once, in one batch', async () => {
    const m = createEspressoMinimiser({ size: 1 });
    try {
      const calls: number[] = [];
      const counting: Minimiser = { name: 'counting', minimiseCover: (fn, o) => m.minimiseCover(fn, o), minimiseMany: (fns, o) => (calls.push(fns.length), m.minimiseMany(fns, o)) };
      const r = await runRules(gateSlices(), extractLogic(gateSlices()), { rules: { [rule.id]: rule }, minimiser: counting });
      expect(r.ruleErrors).toEqual([]);
      expect(r.findings.map((f) => f.data.net)).toEqual(['S0_Y', 'S1_Y', 'S2_Y']);
      expect(new Set(r.findings.map((f) => String(f.data.sop).replace(/S\d_/g, ''))).size).toBe(1);
      expect(calls).toEqual([3]);
      // Function and complement of the one distinct block: two PLAs sent for three slices.
      expect(m.pool.sent).toBe(2);
    } finally {
      m.close();
    }
  });

  it('minimises once a block copied with inputs whose names sort in another order, and maps its cover back to each copy', async () => {
    // Y = AB + AB' + CD; the copy reads Z for A, M for B, K for C and P for D, so its inputs sort
    // as C, B, D, A: the same function with its inputs permuted.
    const b = new NetlistBuilder('Wren-8 flag logic, two renamed copies');
    const block = (u: string, a: string, bb: string, c: string, d: string, y: string) => {
      b.gate(`${u}1`, 'not', [`${u}BN`, bb]);
      b.gate(`${u}2`, 'and', [`${u}T1`, a, bb]);
      b.gate(`${u}3`, 'and', [`${u}T2`, a, `${u}BN`]);
      b.gate(`${u}4`, 'and', [`${u}T3`, c, d]);
      b.gate(`${u}5`, 'or', [y, `${u}T1`, `${u}T2`, `${u}T3`]);
    };
    block('U', 'A', 'B', 'C', 'D', 'Y');
    block('V', 'Z', 'M', 'K', 'P', 'W');
    const nl = b.build();
    const m = createEspressoMinimiser({ size: 1 });
    try {
      const r = await runRules(nl, extractLogic(nl), { rules: { [rule.id]: rule }, minimiser: m });
      expect(r.ruleErrors).toEqual([]);
      const terms = (sop: unknown) => String(sop).split(' + ').map((t) => [...t].sort().join('')).sort();
      expect(r.findings.map((f) => [f.data.net, terms(f.data.sop)])).toEqual([
        ['Y', ['A', 'CD']],
        ['W', ['KP', 'Z']],
      ]);
      // Function and complement of the one block, once: the copy's covers are moved, not minimised.
      expect(m.pool.sent).toBe(2);
    } finally {
      m.close();
    }
  });

  it('records a minimiser failure against its block alone and reports the others', async () => {
    const failing: Minimiser = {
      name: 'failing-on-S1',
      minimiseCover: (fn, o) => exactMinimiser.minimiseCover(fn, o),
      minimiseMany: async (fns, o) =>
        Promise.all(fns.map(async (fn) => (fn.outputs[0].name === 'S1_Y' ? { ok: false as const, error: new Error('stopped after 10 ms') } : { ok: true as const, result: await exactMinimiser.minimiseCover(fn, o) }))),
    };
    const r = await runRules(gateSlices(), extractLogic(gateSlices()), { rules: { [rule.id]: rule }, minimiser: failing });
    expect(r.findings.map((f) => f.data.net)).toEqual(['S0_Y', 'S2_Y']);
    expect(r.ruleErrors).toHaveLength(1);
    expect(r.ruleErrors[0]).toMatchObject({ ruleId: rule.id, element: 'S1_Y' });
    expect(r.ruleErrors[0].message).toMatch(/could not minimise the block driving S1_Y: stopped after 10 ms/);
  });

  it('tabulates a block thousands of gates deep without recursing through it', async () => {
    // Y = NAND(…NAND(NAND(A, B), B)…, B), 5000 gates: nested as one expression it overflows the
    // call stack; gate by gate it is a function of A and B like any other.
    const depth = 5000;
    const b = new NetlistBuilder('Wren-8 ripple strobe chain');
    for (let k = 0; k < depth; k++) b.gate(`U${k}`, 'nand', [k === depth - 1 ? 'Y' : `N${k}`, k === 0 ? 'A' : `N${k - 1}`, 'B']);
    const nl = b.build();
    const r = await runRules(nl, extractLogic(nl), { rules: { [rule.id]: rule } });
    expect(r.ruleErrors).toEqual([]);
    expect(r.findings).toHaveLength(1);
    // B = 0 gives 1; B = 1 inverts A 5000 times: Y = A + B'.
    expect(r.findings[0].data).toMatchObject({ net: 'Y', inputs: 2, before: depth });
    expect(String(r.findings[0].data.sop)).toMatch(/^(A \+ B'|B' \+ A)$/);
  });

  it('gives the same findings with a minimiser that takes one function at a time', async () => {
    const single: Minimiser = { name: 'one-by-one', minimiseCover: (fn, o) => exactMinimiser.minimiseCover(fn, o) };
    const a = await runRules(gateSlices(), extractLogic(gateSlices()), { rules: { [rule.id]: rule }, minimiser: single });
    const b = await runRules(gateSlices(), extractLogic(gateSlices()), { rules: { [rule.id]: rule } });
    expect(a.findings.map((f) => [f.id, f.data])).toEqual(b.findings.map((f) => [f.id, f.data]));
    expect(a.findings).toHaveLength(3);
  });
});

describe('two-level-minimise.md examples', () => {
  it('has examples', () => expect(examples.length).toBeGreaterThanOrEqual(3));
  it.each(examples.map((e) => [e.label, e] as const))('%s', async (_l, ex) => {
    const nl = deckToFlat(ex.deck);
    const r = await runOne(nl, { assumptions: ex.assumptions });
    expect(r.ruleErrors).toEqual([]);
    if (ex.expect.messageId === null) {
      expect(r.findings).toEqual([]);
      return;
    }
    expect(r.findings.map((f) => f.messageId)).toEqual([ex.expect.messageId]);
    for (const [k, v] of Object.entries(ex.expect.data)) expect(String(r.findings[0].data[k])).toBe(v);
    const d = countDelta(nl, r.findings[0].proposals[0]);
    expect(d.actual).toEqual(d.stated);
  });
});
