// Proves the bit-parallel truth table of expressions equals minterm-by-minterm evaluation.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { and, evaluate, not, or, v, xor, type Expr } from './expr';
import { complementTable, constantValue, fromExprs, fromFunction, fromMinterms, getBit, mintermsOf } from './truth-table';

const exprArb = (names: string[]): fc.Arbitrary<Expr> =>
  fc.letrec<{ e: Expr }>((tie) => ({
    e: fc.oneof(
      { depthSize: 'small', withCrossShrink: true },
      fc.constantFrom(...names).map((n) => v(n)),
      tie('e').map((a) => not(a)),
      fc.array(tie('e'), { minLength: 2, maxLength: 3 }).map((xs) => and(...xs)),
      fc.array(tie('e'), { minLength: 2, maxLength: 3 }).map((xs) => or(...xs)),
      fc.array(tie('e'), { minLength: 2, maxLength: 2 }).map((xs) => xor(...xs)),
    ),
  })).e;

describe('fromExprs', () => {
  it('matches evaluation minterm by minterm, with a care expression, for 1..7 inputs', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 7 }).chain((n) => {
          const names = Array.from({ length: n }, (_, i) => `X${i}`);
          return fc.tuple(fc.constant(names), exprArb(names), exprArb(names));
        }),
        ([names, fn, care]) => {
          const env = (bits: number[]) => Object.fromEntries(names.map((x, i) => [x, bits[i] as 0 | 1]));
          const fast = fromExprs(names, [{ name: 'F', fn }], care);
          const slow = fromFunction(names, ['F'], (bits) => [evaluate(fn, env(bits)) === 1], (bits) => evaluate(care, env(bits)) === 1);
          expect(mintermsOf(fast.outputs[0].on, names.length)).toEqual(mintermsOf(slow.outputs[0].on, names.length));
          expect(mintermsOf(fast.outputs[0].dc, names.length)).toEqual(mintermsOf(slow.outputs[0].dc, names.length));
        },
      ),
      { numRuns: 200 },
    );
  });
});

describe('complementTable', () => {
  it('swaps the on-set and off-set and keeps the don\'t-cares', () => {
    const t = fromMinterms(['a', 'b'], [{ name: 'F', on: [0, 3], dc: [1] }]);
    const c = complementTable(t).outputs[0];
    expect(mintermsOf(c.on, 2)).toEqual([2]);
    expect(getBit(c.dc, 1)).toBe(true);
  });
});

describe('constantValue', () => {
  it('tells constant 0, constant 1 (on or don\'t-care everywhere) and real functions apart, at any width', () => {
    for (const n of [1, 3, 5, 6, 9]) {
      const names = Array.from({ length: n }, (_, i) => `x${i}`);
      const all = Array.from({ length: 2 ** n }, (_, m) => m);
      expect(constantValue(fromMinterms(names, [{ name: 'F', on: [] }]).outputs[0], n), `0 of ${n}`).toBe(0);
      expect(constantValue(fromMinterms(names, [{ name: 'F', on: all }]).outputs[0], n), `1 of ${n}`).toBe(1);
      expect(constantValue(fromMinterms(names, [{ name: 'F', on: all.slice(1), dc: [0] }]).outputs[0], n), `1 with a don't-care, ${n}`).toBe(1);
      expect(constantValue(fromMinterms(names, [{ name: 'F', on: all.slice(1) }]).outputs[0], n), `all but one of ${n}`).toBeUndefined();
    }
  });
});
