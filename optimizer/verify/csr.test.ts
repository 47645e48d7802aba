// Compressed adjacency lists: every key's list holds exactly its pairs, in the order they were pushed.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { Pairs, permute } from './csr';

const lists = (c: { off: Int32Array; list: Int32Array }, n: number) =>
  Array.from({ length: n }, (_, k) => Array.from(c.list.subarray(c.off[k], c.off[k + 1])));

describe('Pairs.toCsr', () => {
  it('groups pairs by key in push order, also past the initial capacity', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 30 }), fc.array(fc.nat(), { maxLength: 200 }), fc.integer({ min: 0, max: 40 }), (n, keys, capacity) => {
        const p = new Pairs(capacity);
        const expected: number[][] = Array.from({ length: n }, () => []);
        keys.forEach((k, i) => {
          p.push(k % n, i);
          expected[k % n].push(i);
        });
        const c = p.toCsr(n);
        expect(c.off.length).toBe(n + 1);
        expect(c.off[0]).toBe(0);
        expect(c.off[n]).toBe(keys.length);
        expect(lists(c, n)).toEqual(expected);
      }),
    );
  });
});

describe('permute', () => {
  it('moves list k to key newKey[k], keeping each list', () => {
    fc.assert(
      fc.property(fc.array(fc.array(fc.nat(99), { maxLength: 5 }), { minLength: 1, maxLength: 20 }), fc.nat(), (src, seed) => {
        const n = src.length;
        const p = new Pairs();
        src.forEach((l, k) => l.forEach((v) => p.push(k, v)));
        // a permutation from the seed (Fisher–Yates with a small LCG)
        const newKey = Int32Array.from({ length: n }, (_, i) => i);
        let s = seed >>> 0;
        for (let i = n - 1; i > 0; i--) {
          s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
          const j = s % (i + 1);
          [newKey[i], newKey[j]] = [newKey[j], newKey[i]];
        }
        const moved = lists(permute(p.toCsr(n), newKey), n);
        src.forEach((l, k) => expect(moved[newKey[k]]).toEqual(l));
      }),
    );
  });
});
