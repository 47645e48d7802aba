// Proves the name-free input order: a table with its inputs renamed (permuted) comes to the same
// canonical table when the per-input counts tell its inputs apart, and covers move between orders intact.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { coverMismatch } from '../cubes';
import { minimiseOutputQm } from '../quine-mccluskey';
import { fromFunction, type OutputTable } from '../truth-table';
import { canonicalOrder, inverseOrder, moveBits, reorderCover, reorderOutput } from './input-order';

/** A random function of n inputs (cells 0 off, 1 on, 2 don't-care) and a permutation of its inputs. */
const caseArb = fc.integer({ min: 1, max: 7 }).chain((n) =>
  fc.tuple(
    fc.constant(n),
    fc.array(fc.constantFrom(0, 1, 1, 2), { minLength: 2 ** n, maxLength: 2 ** n }),
    fc.shuffledSubarray(Array.from({ length: n }, (_, i) => i), { minLength: n, maxLength: n }),
  ),
);

function table(n: number, cells: number[]): OutputTable {
  const names = Array.from({ length: n }, (_, i) => `x${i}`);
  const on = fromFunction(names, ['F'], (_b, m) => [cells[m] === 1]).outputs[0];
  const dc = fromFunction(names, ['F'], (_b, m) => [cells[m] === 2]).outputs[0];
  return { name: 'F', on: on.on, dc: dc.on };
}

/** The same function with input i of the original wired to input perm[i] (a renaming of its inputs). */
function renamed(n: number, cells: number[], perm: number[]): OutputTable {
  const moved = new Array<number>(2 ** n);
  // Input perm[i] of the new table is input i of the old one.
  const from = inverseOrder(perm);
  for (let m = 0; m < 2 ** n; m++) moved[moveBits(m, n, from)] = cells[m];
  return table(n, moved);
}

const distinctCounts = (out: OutputTable, n: number) => {
  const order = canonicalOrder(out, n);
  const t = reorderOutput(out, n, order);
  // Inputs are told apart when no two neighbours in the order tie on both counts.
  const counts = (i: number) => {
    let on = 0;
    let dc = 0;
    for (let m = 0; m < 2 ** n; m++) if ((m >>> (n - 1 - i)) & 1) {
      if ((t.on[m >>> 5] >>> (m & 31)) & 1) on++;
      if ((t.dc[m >>> 5] >>> (m & 31)) & 1) dc++;
    }
    return `${on}/${dc}`;
  };
  const all = Array.from({ length: n }, (_, i) => counts(i));
  return new Set(all).size === n;
};

describe('canonical input order', () => {
  it('moves a table and back to itself, and a cover with it', () => {
    fc.assert(
      fc.property(caseArb, ([n, cells, perm]) => {
        const t = table(n, cells);
        const there = reorderOutput(t, n, perm);
        const back = reorderOutput(there, n, inverseOrder(perm));
        expect([...back.on]).toEqual([...t.on]);
        expect([...back.dc]).toEqual([...t.dc]);
        // A cover of the table, moved along with it, is a cover of the moved table: the exact
        // minimum where that is quick, else one cube per on-set minterm.
        const full = (1 << n) - 1;
        const cover = n <= 5 ? minimiseOutputQm(t, n).cover : cells.flatMap((c, m) => (c === 1 ? [{ care: full, value: m }] : []));
        expect(coverMismatch(reorderCover(cover, n, perm), there, n)).toBeUndefined();
      }),
      { numRuns: 150 },
    );
  });

  it('moves every minterm as moving its input bits one by one does, inside and across words', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 10 }).chain((n) =>
          fc.tuple(
            fc.constant(n),
            fc.array(fc.constantFrom(0, 1, 2), { minLength: 2 ** n, maxLength: 2 ** n }),
            fc.shuffledSubarray(Array.from({ length: n }, (_, i) => i), { minLength: n, maxLength: n }),
          ),
        ),
        ([n, cells, perm]) => {
          const moved = reorderOutput(table(n, cells), n, perm);
          // The reference: minterm m of the original lands at moveBits(m), one input bit at a time.
          const want = new Array<number>(2 ** n);
          for (let m = 0; m < 2 ** n; m++) want[moveBits(m, n, perm)] = cells[m];
          const expected = table(n, want);
          expect([...moved.on]).toEqual([...expected.on]);
          expect([...moved.dc]).toEqual([...expected.dc]);
        },
      ),
      { numRuns: 300 },
    );
  });

  it('gives a renamed copy the same canonical table whenever the counts tell its inputs apart', () => {
    let told = 0;
    fc.assert(
      fc.property(caseArb, ([n, cells, perm]) => {
        const a = table(n, cells);
        const b = renamed(n, cells, perm);
        if (!distinctCounts(a, n)) return;
        told++;
        const ca = reorderOutput(a, n, canonicalOrder(a, n));
        const cb = reorderOutput(b, n, canonicalOrder(b, n));
        expect([...cb.on]).toEqual([...ca.on]);
        expect([...cb.dc]).toEqual([...ca.dc]);
      }),
      { numRuns: 200 },
    );
    expect(told).toBeGreaterThan(20);
  });

  it('keeps inputs the function treats alike in their given order (a symmetric function is its own canonical table)', () => {
    // Majority of three: every input counts the same, so the order is the given one.
    const maj = table(3, [0, 0, 0, 1, 0, 1, 1, 1]);
    expect(canonicalOrder(maj, 3)).toEqual([0, 1, 2]);
    expect(reorderOutput(maj, 3, [0, 1, 2])).toBe(maj);
  });
});
