// Proves the word-parallel cover bitset: the minterms it sets are exactly those some cube contains.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { coverMismatch, coverToSet, cubeContains, type Cube } from './cubes';
import { fromMinterms, getBit } from './truth-table';

const coverArb = fc.integer({ min: 1, max: 10 }).chain((n) =>
  fc.tuple(
    fc.constant(n),
    fc.array(
      fc.tuple(fc.integer({ min: 0, max: 2 ** n - 1 }), fc.integer({ min: 0, max: 2 ** n - 1 })).map(([care, v]): Cube => ({ care, value: v & care })),
      { maxLength: 6 },
    ),
  ),
);

describe('cover bitsets', () => {
  it('set exactly the minterms some cube of the cover contains, and none past 2^n', () => {
    fc.assert(
      fc.property(coverArb, ([n, cover]) => {
        const set = coverToSet(cover, n);
        for (let m = 0; m < 2 ** n; m++) expect(getBit(set, m), `minterm ${m}`).toBe(cover.some((c) => cubeContains(c, m)));
        for (let m = 2 ** n; m < set.length * 32; m++) expect(getBit(set, m)).toBe(false);
      }),
      { numRuns: 300 },
    );
  });

  it('find the first minterm a wrong cover gets wrong on the care set', () => {
    // F = Σm(1, 3, 5, 7) + d(6) over (a, b, c) is c; the cover "c + ab" is wrong at 6 only where 6 is a care minterm.
    const t = fromMinterms(['a', 'b', 'c'], [{ name: 'F', on: [1, 3, 5, 7] }]).outputs[0];
    const withDc = fromMinterms(['a', 'b', 'c'], [{ name: 'F', on: [1, 3, 5, 7], dc: [6] }]).outputs[0];
    const cover: Cube[] = [{ care: 0b001, value: 0b001 }, { care: 0b110, value: 0b110 }];
    expect(coverMismatch(cover, t, 3)).toEqual({ minterm: 6, expected: 0 });
    expect(coverMismatch(cover, withDc, 3)).toBeUndefined();
    expect(coverMismatch([{ care: 0b001, value: 0b001 }], t, 3)).toBeUndefined();
  });
});
