// Proves the exact minimiser reaches the published minimal covers and is right on its care set.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { coverLiterals, coverMismatch, coverToText, cubeToString } from './cubes';
import { minimiseOutputQm, minimiseQm, primeImplicants } from './quine-mccluskey';
import { fromMinterms, words } from './truth-table';
import { WORKED_EXAMPLES } from './worked-examples';

describe('prime implicants', () => {
  it('finds the primes of Σm(0,1,2,5,6,7) over xyz (the cyclic core)', () => {
    // Mathematics: the cyclic function x'y' + x'z' + ... has six primes, each of two literals.
    const primes = primeImplicants([0, 1, 2, 5, 6, 7], 3).map((c) => cubeToString(c, 3)).sort();
    expect(primes).toEqual(['-01', '-10', '0-0', '00-', '1-1', '11-']);
  });
  it('merges across don\'t-cares', () => {
    const primes = primeImplicants([0, 1, 2, 3], 2).map((c) => cubeToString(c, 2));
    expect(primes).toEqual(['--']);
  });
});

describe('exact cover on worked examples', () => {
  for (const ex of WORKED_EXAMPLES) {
    it(`${ex.name} reaches ${ex.terms.join(',')} terms (${ex.source})`, () => {
      const { cover, exact } = minimiseQm(ex.table);
      expect(exact).toBe(true);
      const n = ex.table.inputs.length;
      cover.outputs.forEach((o, k) => {
        expect(coverMismatch(o.cover, ex.table.outputs[k], n), `${o.name} = ${coverToText(o.cover, cover.inputs)}`).toBeUndefined();
        expect(o.cover.length, o.name).toBe(ex.terms[k]);
        if (ex.literals) expect(coverLiterals(o.cover), o.name).toBe(ex.literals[k]);
      });
    });
  }

  it('takes the cyclic core with three terms, not four', () => {
    // Mathematics: Σm(0,1,2,5,6,7) has no essential prime and a minimum cover of 3 terms.
    const t = fromMinterms(['x', 'y', 'z'], [{ name: 'F', on: [0, 1, 2, 5, 6, 7] }]);
    const r = minimiseOutputQm(t.outputs[0], 3);
    expect(r.cover).toHaveLength(3);
    expect(coverMismatch(r.cover, t.outputs[0], 3)).toBeUndefined();
  });

  it('returns constants without search', () => {
    const t = fromMinterms(['a', 'b'], [
      { name: 'zero', on: [], dc: [1] },
      { name: 'one', on: [0, 3], dc: [1, 2] },
    ]);
    const r = minimiseQm(t);
    expect(r.cover.outputs[0].cover).toEqual([]);
    expect(r.cover.outputs[1].cover).toEqual([{ care: 0, value: 0 }]);
  });
});

describe('exact cover on random functions', () => {
  it('equals the function on the care set and never loses to the minterm cover', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 6 }).chain((n) =>
          fc.tuple(fc.constant(n), fc.array(fc.constantFrom(0, 1, 2), { minLength: 2 ** n, maxLength: 2 ** n })),
        ),
        ([n, cells]) => {
          const on = cells.flatMap((c, m) => (c === 1 ? [m] : []));
          const dc = cells.flatMap((c, m) => (c === 2 ? [m] : []));
          const t = fromMinterms(Array.from({ length: n }, (_, i) => `i${i}`), [{ name: 'F', on, dc }]);
          const r = minimiseOutputQm(t.outputs[0], n);
          expect(r.exact).toBe(true);
          expect(coverMismatch(r.cover, t.outputs[0], n)).toBeUndefined();
          expect(r.cover.length).toBeLessThanOrEqual(Math.max(on.length, 1));
          expect(t.outputs[0].on.length).toBe(words(n));
        },
      ),
      { numRuns: 200 },
    );
  });
});

describe('exact cover is minimal', () => {
  it('matches a brute-force search over every subset of primes (n ≤ 3)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 3 }).chain((n) =>
          fc.tuple(fc.constant(n), fc.array(fc.constantFrom(0, 1, 2), { minLength: 2 ** n, maxLength: 2 ** n })),
        ),
        ([n, cells]) => {
          const on = cells.flatMap((c, m) => (c === 1 ? [m] : []));
          const dc = cells.flatMap((c, m) => (c === 2 ? [m] : []));
          const t = fromMinterms(Array.from({ length: n }, (_, i) => `i${i}`), [{ name: 'F', on, dc }]);
          const primes = primeImplicants([...on, ...dc].sort((a, b) => a - b), n);
          let best = on.length === 0 ? 0 : Infinity;
          for (let mask = 1; mask < 2 ** primes.length && on.length > 0; mask++) {
            const pick = primes.filter((_, i) => (mask >> i) & 1);
            if (coverMismatch(pick, t.outputs[0], n) === undefined) best = Math.min(best, pick.length);
          }
          const r = minimiseOutputQm(t.outputs[0], n);
          expect(r.cover.length).toBe(best);
        },
      ),
      { numRuns: 150 },
    );
  });
});
