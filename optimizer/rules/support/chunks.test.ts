// The split search: near-equal runs, the worst result per check, and fewestParts giving the same
// count as trying every count in turn, whether it skips proven-failing counts or bisects.
import { describe, expect, it } from 'vitest';
import type { MarginResult, MarginStatus } from '../../margins/corners';
import { chunked, fewestParts, worstPerName, type Chunk } from './chunks';

const result = (name: string, status: MarginStatus, value = 0): MarginResult => ({
  name,
  value,
  limit: 1,
  unit: '',
  status,
  corner: { supply: 5, resistors: 'nominal' },
  note: '',
});

/** The definition: the first count 1 … n − 1 whose margins pass, else one part, refused. */
function reference(members: number[], marginsFor: (c: Chunk[]) => MarginResult[]): { parts: number; passes: boolean } {
  const fails = (ms: MarginResult[]) => ms.some((m) => m.status === 'fail');
  for (let k = 1; k < Math.max(2, members.length); k++) if (!fails(marginsFor(chunked(members, k)))) return { parts: k, passes: true };
  return { parts: 1, passes: false };
}

/** Fan-out of each part (sum of member loads) against a limit. */
function fanOutFor(loads: number[], limit: number) {
  let calls = 0;
  const marginsFor = (chunks: Chunk[]) => {
    calls++;
    return worstPerName(
      chunks.map((ch) => {
        const total = [ch.keep, ...ch.others].reduce((s, i) => s + loads[i], 0);
        return result('fan-out', total > limit ? 'fail' : 'pass', total);
      }),
    );
  };
  return { marginsFor, calls: () => calls };
}

/** Deterministic pseudo-random integers (xorshift), so a failing case can be replayed. */
function rng(seed: number): (n: number) => number {
  let x = seed >>> 0 || 1;
  return (n) => {
    x ^= x << 13;
    x ^= x >>> 17;
    x ^= x << 5;
    return (x >>> 0) % n;
  };
}

describe('chunked', () => {
  it('splits in design order into runs differing by one at most, each keeping its first', () => {
    expect(chunked([10, 11, 12, 13, 14, 15, 16], 3)).toEqual([
      { keep: 10, others: [11, 12] },
      { keep: 13, others: [14] },
      { keep: 15, others: [16] },
    ]);
  });
});

describe('worstPerName', () => {
  it('keeps the first of the worst status per check, in order of first appearance', () => {
    const a = result('fan-out', 'warn', 1);
    const b = result('sink current', 'pass', 2);
    const c = result('fan-out', 'fail', 3);
    const d = result('fan-out', 'fail', 4);
    const e = result('sink current', 'warn', 5);
    expect(worstPerName([a, b, c, d, e])).toEqual([c, e]);
  });
});

describe('fewestParts', () => {
  it('two parts of four loads when one of eight fails a fan-out of five', () => {
    const { marginsFor } = fanOutFor(Array(8).fill(1), 5);
    expect(fewestParts([0, 1, 2, 3, 4, 5, 6, 7], marginsFor)).toMatchObject({ parts: 2, passes: true });
  });

  it('refuses with the one-part margins when no split passes', () => {
    const { marginsFor } = fanOutFor([9, 1, 1], 5);
    const r = fewestParts([0, 1, 2], marginsFor, { atLeast: 3, monotone: true });
    expect(r).toMatchObject({ parts: 1, passes: false });
    expect(r.margins).toBe(r.single);
    expect(r.margins[0]).toMatchObject({ status: 'fail', value: 11 });
  });

  it('stops at once on a failure that no split can cure', () => {
    let calls = 0;
    const marginsFor = () => {
      calls++;
      return [result('low level', 'fail')];
    };
    expect(fewestParts([0, 1, 2, 3], marginsFor, (m) => m.name === 'low level')).toMatchObject({ parts: 1, passes: false });
    expect(calls).toBe(1);
  });

  it('gives the same count as trying every count, on random loads, with the pigeonhole bound', () => {
    const next = rng(7);
    for (let trial = 0; trial < 300; trial++) {
      const n = 2 + next(40);
      const limit = 1 + next(12);
      // Uneven loads (zeros and large ones) make passing non-monotone in the count.
      const loads = Array.from({ length: n }, () => (next(4) === 0 ? 0 : next(limit + 2)));
      const members = loads.map((_, i) => i);
      const { marginsFor } = fanOutFor(loads, limit);
      const total = loads.reduce((a, b) => a + b, 0);
      const got = fewestParts(members, marginsFor, { atLeast: Math.ceil(total / limit) });
      expect({ parts: got.parts, passes: got.passes }, `loads ${loads.join(',')} limit ${limit}`).toEqual(reference(members, marginsFor));
    }
  });

  it('bisects identical members to the same count as trying every count, with far fewer trials', () => {
    const next = rng(11);
    for (let trial = 0; trial < 200; trial++) {
      const n = 2 + next(300);
      const each = 1 + next(3);
      const limit = 1 + next(20);
      const members = Array.from({ length: n }, (_, i) => i);
      const { marginsFor } = fanOutFor(Array(n).fill(each), limit);
      const got = fewestParts(members, marginsFor, { monotone: true });
      expect({ parts: got.parts, passes: got.passes }, `n ${n} each ${each} limit ${limit}`).toEqual(reference(members, marginsFor));
    }
    const big = fanOutFor(Array(5000).fill(1), 5);
    const r = fewestParts(
      Array.from({ length: 5000 }, (_, i) => i),
      big.marginsFor,
      { monotone: true },
    );
    expect(r.parts).toBe(1000);
    expect(big.calls()).toBeLessThan(40);
  });

  it('returns the margins of the count it found', () => {
    const { marginsFor } = fanOutFor(Array(12).fill(1), 5);
    const r = fewestParts(
      Array.from({ length: 12 }, (_, i) => i),
      marginsFor,
      { atLeast: 3, monotone: true },
    );
    expect(r.parts).toBe(3);
    expect(r.margins).toEqual([result('fan-out', 'pass', 4)]);
    expect(r.single).toEqual([result('fan-out', 'fail', 12)]);
  });
});
