// Truth-table keys: the bit-parallel table agrees row by row with plain evaluation, and equal
// functions of the same nets written differently share a class.
import { describe, expect, it } from 'vitest';
import { and, evaluate, not, or, v, xor, type Expr } from '../../logic/expr';
import { truthKey } from './same-function';

/** Row-by-row reference: one hex digit per four rows, first row the high bit. */
function rowByRow(fn: Expr, inputs: string[]): string {
  const rows = 2 ** inputs.length;
  let out = '';
  for (let m = 0; m < rows; m += 4) {
    let digit = 0;
    for (let r = m; r < Math.min(m + 4, rows); r++) {
      const env = Object.fromEntries(inputs.map((n, i) => [n, ((r >> (inputs.length - 1 - i)) & 1) as 0 | 1]));
      digit = (digit << 1) | evaluate(fn, env);
    }
    out += digit.toString(16);
  }
  return out;
}

describe('truthKey', () => {
  it('matches row-by-row evaluation on random functions of 1 to 10 inputs', () => {
    let seed = 7;
    const rnd = () => (seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) / 2 ** 32;
    const gen = (names: string[], depth: number): Expr => {
      if (depth === 0 || rnd() < 0.2) return v(names[Math.floor(rnd() * names.length)]);
      const a = gen(names, depth - 1);
      const b = gen(names, depth - 1);
      return [and(a, b), or(a, b), not(a), xor(a, b)][Math.floor(rnd() * 4)];
    };
    for (let t = 0; t < 400; t++) {
      const names = Array.from({ length: 1 + (t % 10) }, (_, i) => `XS${t}.N${i}`);
      const fn = gen(names, 5);
      expect(truthKey(fn, names)).toBe(rowByRow(fn, names));
    }
  });

  it('gives known tables: NAND of two inputs is 1110, an inverter 10', () => {
    // common practice: truth table rows in binary counting order, first input most significant
    expect(truthKey(not(and(v('A'), v('B'))), ['A', 'B'])).toBe('e');
    expect(truthKey(not(v('A')), ['A'])).toBe('2');
    expect(truthKey(or(v('B'), v('A')), ['A', 'B'])).toBe(truthKey(or(v('A'), v('B')), ['A', 'B']));
  });
});
