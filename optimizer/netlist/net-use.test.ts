// NetUse counts every terminal on every net, across the growth of its counts array.
import { describe, expect, it } from 'vitest';
import { NetUse } from './net-use';

describe('NetUse', () => {
  it('counts each touch, also for the net whose first touch grows the counts array', () => {
    const use = new NetUse(['P0', 'P1']);
    const names = Array.from({ length: 300 }, (_, i) => `N${i}`);
    // Every net touched twice: first all once (numbering 2..301, growing at 64, 128 and 256), then again.
    for (const n of names) use.touch(n);
    for (const n of names) use.touch(n);
    const lonely = names.filter((n) => use.counts[use.table.get(n)] !== 2);
    expect(lonely).toEqual([]);
    expect(use.counts[use.table.get('P0')]).toBe(1);
  });
});
