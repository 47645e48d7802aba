// Proves the waveform side of a region: inputs found from the logic, default vectors only where the
// assumptions allow, the text form round-trips and reports located errors, and the before/after
// simulation aligns lanes and marks the first step where they differ.
import { describe, expect, it } from 'vitest';
import { InputError } from '../errors';
import { parseExpr } from '../logic/expr-parse';
import { NetlistBuilder } from '../netlist/build';
import { applyProposals } from '../rewrite/apply';
import { emptyEdit, type Assumption, type Edit } from '../rules/types';
import { extractRegion } from './region';
import { simulateRegion } from './simulate';
import { defaultStimulus, parseStimulusText, regionInputs, stimulusProblems, stimulusToText } from './stimulus';

const assume = (id: string, text: string): Assumption => ({ id, text, expr: parseExpr(text) });

/** A → u1 (not) → N1 → u2 (not) → Y → u3 (and with B) → Z: a double inversion in front of a gate. */
function chain() {
  const b = new NetlistBuilder('Wren-8 strobe chain');
  b.port('A', 'B', 'Z');
  b.gate('u1', 'not', ['N1', 'A']);
  b.gate('u2', 'not', ['Y', 'N1']);
  b.gate('u3', 'and', ['Z', 'Y', 'B']);
  return b.build();
}
const dropPair = (): Edit => ({ ...emptyEdit(), removeDevices: ['u1', 'u2'], reconnect: [{ device: 'u3', terminal: 1, net: 'A' }] });
const wrong = (): Edit => ({ ...emptyEdit(), removeDevices: ['u2'], reconnect: [{ device: 'u3', terminal: 1, net: 'N1' }] });

describe('default stimulus', () => {
  it('finds the primary inputs the region depends on', () => {
    const nl = chain();
    const r = extractRegion(nl, dropPair());
    expect(regionInputs(nl, r.before)).toEqual(['A', 'B']);
  });

  it('lists every vector when few inputs, and only those the assumptions allow', () => {
    const all = defaultStimulus(['A', 'B'], []);
    expect(all.vectors).toHaveLength(4);
    const oneHot = defaultStimulus(['A', 'B', 'C'], [assume('a1', '!(A & B) & !(A & C) & !(B & C)')]);
    // at most one of three high: 000, 001, 010, 100
    expect(oneHot.vectors).toHaveLength(4);
    expect(stimulusProblems(oneHot, [assume('a1', '!(A & B) & !(A & C) & !(B & C)')])).toEqual([]);
  });

  it('samples a fixed, allowed set when there are many inputs', () => {
    const names = Array.from({ length: 12 }, (_, i) => `D${i}`);
    const a = assume('a1', '!(D0 & D1)');
    const s1 = defaultStimulus(names, [a]);
    const s2 = defaultStimulus(names, [a]);
    expect(s1).toEqual(s2);
    expect(s1.vectors.length).toBeGreaterThan(10);
    expect(s1.vectors.every((v) => !(v.D0 === 1 && v.D1 === 1))).toBe(true);
  });

  it('names the steps that break an assumption', () => {
    const st = parseStimulusText('A=1 B=1\nA=0 B=1');
    expect(stimulusProblems(st, [assume('a1', '!(A & B)')])).toEqual(['step 1 breaks the assumption "!(A & B)"']);
  });
});

describe('stimulus text', () => {
  it('round-trips vectors and clocked sequences', () => {
    const v = parseStimulusText('A=0 B=1\n# comment\nA=1 B=X\n');
    expect(v).toEqual({ kind: 'vectors', vectors: [{ A: 0, B: 1 }, { A: 1, B: 'X' }] });
    expect(parseStimulusText(stimulusToText(v))).toEqual(v);
    const c = parseStimulusText('clock CLK\nD=1\nD=0');
    expect(c).toEqual({ kind: 'clocked', clock: 'CLK', vectors: [{ D: 1 }, { D: 0 }] });
    expect(parseStimulusText(stimulusToText(c))).toEqual(c);
  });

  it('reports bad tokens with line and column', () => {
    try {
      parseStimulusText('A=0\nA=0 B=2');
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      expect((e as InputError).diagnostics[0]).toMatchObject({ code: 'stimulus.syntax', loc: { file: 'stimulus', line: 2, col: 5 } });
    }
    expect(() => parseStimulusText('  \n')).toThrow(/no steps/);
    expect(() => parseStimulusText('A=1\nclock C')).toThrow(/clock line must come first/);
  });
});

describe('simulateRegion', () => {
  it('shows equal lanes for an equivalent rewrite, with lanes aligned by net', () => {
    const nl = chain();
    const edit = dropPair();
    const after = applyProposals(nl, [{ id: 'p', title: 'p', edit, assumptions: [], margins: [] }]);
    const r = extractRegion(nl, edit, after);
    const sim = simulateRegion(nl, after, r, defaultStimulus(['A', 'B'], []));
    expect(sim.steps).toBe(4);
    const z = sim.lanes.find((l) => l.net === 'Z')!;
    expect(z.before).toEqual([0, 0, 0, 1]); // Z = A & B over 00, 01, 10, 11
    expect(z.after).toEqual(z.before);
    expect(sim.lanes.find((l) => l.net === 'N1')!.after).toBeUndefined(); // the rewrite removed N1's only parts
    expect(sim.firstDifference).toBeUndefined();
    expect(sim.lanes.slice(0, 2).map((l) => l.role)).toEqual(['input', 'input']);
  });

  it('marks the first step where a wrong rewrite differs', () => {
    const nl = chain();
    const edit = wrong();
    const after = applyProposals(nl, [{ id: 'p', title: 'p', edit, assumptions: [], margins: [] }]);
    const r = extractRegion(nl, edit, after);
    const sim = simulateRegion(nl, after, r, parseStimulusText('A=0 B=0\nA=0 B=1\nA=1 B=1'));
    // before Z = A&B: 0,0,1; after Z = !A&B: 0,1,0 → first difference at step 1 (0-based)
    expect(sim.lanes.find((l) => l.net === 'Z')).toMatchObject({ before: [0, 0, 1], after: [0, 1, 0], firstDifference: 1 });
    expect(sim.firstDifference).toEqual({ step: 1, nets: ['Z'] });
  });
});
