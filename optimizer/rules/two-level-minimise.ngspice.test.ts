// ngspice (Debian package; generic level-1 MOS VTO ±0.7 and NPN IS=1e-14 BF=100 models) against
// two-level-minimise: the applied rewrite of every ready finding gives the original's logic levels
// on every input combination its assumptions allow.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { levelTable } from '@/tests/support/rule-levels';
import { editSavings } from '../cost/cost';
import { readSpice } from '../formats/spice/read';
import { parseExpr } from '../logic/expr-parse';
import { evaluate } from '../logic/expr';
import { thresholdsFor, DEFAULT_MARGIN_SETTINGS as S } from '../margins/defaults';
import { NetlistBuilder } from '../netlist/build';
import { flatten } from '../netlist/flatten';
import type { FlatNetlist } from '../netlist/ir';
import { applyProposals } from '../rewrite/apply';
import { scan } from './scan';
import { twoLevelMinimise } from './two-level-minimise';
import type { Rule } from './types';

const rule = twoLevelMinimise as unknown as Rule;
const decks = [...readFileSync(path.join(__dirname, 'two-level-minimise.md'), 'utf8').matchAll(/```spice\n([\s\S]*?)```/g)].map((m) => m[1]);
const flat = (deck: string): FlatNetlist => flatten(readSpice(deck, 'example.cir').design);

async function readyProposal(nl: FlatNetlist, assumptions: { id: string; text: string }[] = []) {
  const r = await scan(nl, { rules: { [rule.id]: rule }, assumptions: assumptions.map((a) => ({ ...a, expr: parseExpr(a.text) })) });
  expect(r.findings).toHaveLength(1);
  const p = r.findings[0].proposals[0];
  expect(p.verdict).toBe('ready');
  return p.proposal;
}

describe('two-level-minimise in ngspice', () => {
  it('CMOS carry: the majority rewrite gives the same levels on all 8 combinations', async () => {
    const nl = flat(decks[0]);
    const after = applyProposals(nl, [await readyProposal(nl)]);
    // CMOS at 5 V: V_IL 30 %, V_IH 70 % of the supply (common practice; the margin defaults).
    const o = { inputs: ['A', 'B', 'C'], nets: ['CY'], high: 5, thresholds: thresholdsFor('cmos', 5, S) };
    const before = levelTable(nl, o);
    expect(before.levels.map((l) => l.CY)).toEqual([0, 0, 0, 1, 0, 1, 1, 1]);
    expect(levelTable(after, o).levels).toEqual(before.levels);
  });

  it('write strobe: the inverter under WR -> SEL matches on every allowed combination', async () => {
    const nl = flat(decks[2]);
    const after = applyProposals(nl, [await readyProposal(nl, [{ id: 'A1', text: 'WR -> SEL' }])]);
    const allowed = [
      { WR: 0, SEL: 0 },
      { WR: 0, SEL: 1 },
      { WR: 1, SEL: 1 },
    ] as Record<string, 0 | 1>[];
    expect(allowed.every((p) => evaluate(parseExpr('WR -> SEL'), p) === 1)).toBe(true);
    const o = { inputs: ['WR', 'SEL'], nets: ['WS'], high: 5, thresholds: thresholdsFor('cmos', 5, S), points: allowed };
    expect(levelTable(after, o).levels).toEqual(levelTable(nl, o).levels);
    // Outside the assumption (WR high, SEL low) the two differ, which is why the proposal names it.
    const excluded = { ...o, points: [{ WR: 1, SEL: 0 }] as Record<string, 0 | 1>[] };
    expect(levelTable(after, excluded).levels).not.toEqual(levelTable(nl, excluded).levels);
  });

  it('RTL redundant NOR pair: NOR plus inverter gives the same levels', async () => {
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
    const nl = b.build();
    const after = applyProposals(nl, [await readyProposal(nl)]);
    // RTL thresholds V_IL 0.5 V, V_IH 1.0 V (common practice; the margin defaults).
    const o = { inputs: ['A', 'B', 'C'], nets: ['Y'], high: 5, thresholds: S.thresholds.rtl };
    const before = levelTable(nl, o);
    expect(before.levels.map((l) => l.Y)).toEqual([0, 0, 1, 1, 1, 1, 1, 1]);
    expect(levelTable(after, o).levels).toEqual(before.levels);
  });

  it('DTL redundant NAND pair: NAND plus DTL inverter gives the same levels', async () => {
    const nl = dtlRedundant();
    const p = await readyProposal(nl);
    // Mano (from memory): DTL NAND-n = 1 T, n + 2 D, 3 R; three gates (3 T, 13 D, 9 R) become a
    // NAND-2 and an inverter (2 T, 7 D, 6 R).
    expect(editSavings(nl, p.edit)).toMatchObject({ transistors: 1, diodes: 6, resistors: 3 });
    const after = applyProposals(nl, [p]);
    // DTL thresholds V_IL 1.2 V, V_IH 2.0 V (common practice; the margin defaults).
    const o = { inputs: ['A', 'B', 'C'], nets: ['Y'], high: 5, thresholds: S.thresholds.dtl };
    const before = levelTable(nl, o);
    expect(before.levels.map((l) => l.Y)).toEqual([0, 0, 0, 0, 0, 0, 1, 1]);
    expect(levelTable(after, o).levels).toEqual(before.levels);
  });
});

/** DTL: Y = NAND(NAND(A, B), NAND(A, B, C)) = AB, three DTL NAND gates (Mano's basic form). */
function dtlRedundant(): FlatNetlist {
  const b = new NetlistBuilder('Wren-8 DTL grant logic');
  b.rail('VCC', 5);
  b.model('QN', 'npn', { IS: 1e-14, BF: 100 });
  b.model('DN', 'd', { IS: 1e-14 });
  const nand = (name: string, ins: string[], out: string) => {
    ins.forEach((x, i) => b.diode(`D${name}${i}`, `P${name}`, x, { model: 'DN' }));
    b.resistor(`RP${name}`, 'VCC', `P${name}`, 2000);
    b.diode(`DS${name}`, `P${name}`, `M${name}`, { model: 'DN' });
    b.diode(`DT${name}`, `M${name}`, `BB${name}`, { model: 'DN' });
    b.resistor(`RBB${name}`, `BB${name}`, '0', 5000);
    b.resistor(`RC${name}`, 'VCC', out, 2000);
    b.npn(`Q${name}`, out, `BB${name}`, '0', { model: 'QN' });
  };
  nand('1', ['A', 'B'], 'T1');
  nand('2', ['A', 'B', 'C'], 'T2');
  nand('3', ['T1', 'T2'], 'Y');
  return b.build();
}
