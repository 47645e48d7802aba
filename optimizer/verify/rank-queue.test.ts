// The simulator's worklists pop groups in rank order and never hold a group twice.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { LowestFirstQueue, RankQueue } from './rank-queue';

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

describe('LowestFirstQueue', () => {
  it('pops queued ids lowest first, each once, also when lower ids are pushed between pops', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 5000 }), fc.array(fc.tuple(fc.boolean(), fc.nat()), { maxLength: 400 }), (n, ops) => {
        const q = new LowestFirstQueue(n);
        const model = new Set<number>();
        for (const [isPush, x] of ops) {
          if (isPush || model.size === 0) {
            q.push(x % n);
            model.add(x % n);
          } else {
            const lowest = Math.min(...model);
            expect(q.pop()).toBe(lowest);
            model.delete(lowest);
          }
          expect(q.size).toBe(model.size);
        }
        const rest: number[] = [];
        while (q.size) rest.push(q.pop());
        expect(rest).toEqual([...model].sort((a, b) => a - b));
      }),
    );
  });

  it('handles ids on word boundaries (31, 32, 1023, 1024)', () => {
    const q = new LowestFirstQueue(2048);
    for (const g of [1024, 31, 1023, 32, 2047, 0]) q.push(g);
    const out: number[] = [];
    while (q.size) out.push(q.pop());
    expect(out).toEqual([0, 31, 32, 1023, 1024, 2047]);
  });
});
