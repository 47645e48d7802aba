// Side-by-side view of a two-level rewrite: don't-cares come from the assumptions, the scan's cover
// is read back and checked against the table, and a wrong cover is replaced by an exact one.
import { describe, expect, it } from 'vitest';
import { and, not, or, v } from '../logic/expr';
import { parseExpr } from '../logic/expr-parse';
import { grayCode, karnaughLayout, parseCoverText, twoLevelView } from './two-level';

// y = A'B + AB' (exclusive or); with "never A and B together" the row 11 is a don't-care, so the
// cover A + B fits (Mano, Digital Design, don't-care example, from memory).
const xorAB = or(and(not(v('A')), v('B')), and(v('A'), not(v('B'))));
const never = [{ id: 'A1', expr: parseExpr('!(A & B)') }];

describe('twoLevelView', () => {
  it('marks the rows the assumptions exclude and keeps the scan cover when it fits', () => {
    const view = twoLevelView({ output: 'Y', inputs: ['A', 'B'], before: xorAB, after: or(v('A'), v('B')), assumptions: never, coverText: 'A + B' });
    expect(view.dontCares).toBe(1);
    expect(view.rows.map((r) => r.excludedBy)).toEqual([[], [], [], ['A1']]);
    expect(view.cover).toEqual({ cubes: ['1-', '-1'], text: 'A + B', source: 'scan' });
    expect(view.rows.map((r) => r.before)).toEqual([0, 1, 1, 0]);
    expect(view.rows.map((r) => r.cover)).toEqual([0, 1, 1, 1]);
    expect(view.rows.map((r) => r.after)).toEqual([0, 1, 1, 1]);
  });

  it('recomputes the cover when the given one is wrong on the care set', () => {
    const view = twoLevelView({ output: 'Y', inputs: ['A', 'B'], before: xorAB, assumptions: [], coverText: 'A + B' });
    expect(view.cover.source).toBe('recomputed');
    expect(view.rows.map((r) => r.cover)).toEqual([0, 1, 1, 0]);
    expect(view.dontCares).toBe(0);
  });

  it('refuses a block too large to show', () => {
    const inputs = Array.from({ length: 9 }, (_, i) => `x${i}`);
    expect(() => twoLevelView({ output: 'Y', inputs, before: v('x0'), assumptions: [] })).toThrow(/1–8 inputs/);
  });
});

describe('parseCoverText', () => {
  it('reads single-letter and multi-letter covers', () => {
    expect(parseCoverText("A'B + C", ['A', 'B', 'C'])).toEqual([{ care: 0b110, value: 0b010 }, { care: 0b001, value: 0b001 }]);
    expect(parseCoverText("en·d0' + clr", ['en', 'd0', 'clr'])).toEqual([{ care: 0b110, value: 0b100 }, { care: 0b001, value: 0b001 }]);
    expect(parseCoverText('0', ['A'])).toEqual([]);
    expect(parseCoverText('1', ['A'])).toEqual([{ care: 0, value: 0 }]);
  });

  it('returns null for names the block lacks or repeated literals', () => {
    expect(parseCoverText('A + Q', ['A', 'B'])).toBeNull();
    expect(parseCoverText("AA'", ['A', 'B'])).toBeNull();
  });
});

describe('karnaughLayout', () => {
  it('orders rows and columns in Gray code', () => {
    expect(grayCode(2)).toEqual([0, 1, 3, 2]);
    expect(karnaughLayout(['A', 'B', 'C', 'D'])).toEqual({ rowVars: ['A', 'B'], colVars: ['C', 'D'], rowOrder: [0, 1, 3, 2], colOrder: [0, 1, 3, 2] });
    expect(karnaughLayout(Array.from({ length: 7 }, (_, i) => `x${i}`))).toBeNull();
  });
});
