// The simulator's worklist pops groups in rank order and never holds a group twice.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { RankQueue } from './rank-queue';

describe('RankQueue', () => {
  it('pops in non-decreasing rank order, each queued group once', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 0, max: 50 }), { minLength: 1, maxLength: 60 }), fc.array(fc.nat(59)), (ranks, pushes) => {
        const q = new RankQueue(Int32Array.from(ranks));
        const ids = pushes.filter((g) => g < ranks.length);
        for (const g of ids) q.push(g);
        const out: number[] = [];
        while (q.size) out.push(q.pop());
        expect(out.length).toBe(new Set(ids).size);
        expect(new Set(out)).toEqual(new Set(ids));
        for (let i = 1; i < out.length; i++) expect(ranks[out[i - 1]]).toBeLessThanOrEqual(ranks[out[i]]);
      }),
    );
  });
});
