// Worklist of groups ordered by topological rank (a binary min-heap with a membership flag), so
// the simulator settles acyclic logic with one evaluation per group and a group is queued once.
// Heap entries and their ranks sit in typed arrays and sift by moving a hole: no allocation per
// push or pop, since a large design pushes millions of groups in a simulation.
export class RankQueue {
  private readonly items: Int32Array;
  private readonly keys: Int32Array;
  private count = 0;
  private readonly queued: Uint8Array;
  constructor(private readonly rank: Int32Array) {
    this.queued = new Uint8Array(rank.length);
    // each group is in the heap at most once
    this.items = new Int32Array(rank.length);
    this.keys = new Int32Array(rank.length);
  }

  get size(): number {
    return this.count;
  }

  push(g: number): void {
    if (this.queued[g]) return;
    this.queued[g] = 1;
    const { items, keys } = this;
    const key = this.rank[g];
    let i = this.count++;
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (keys[p] <= key) break;
      items[i] = items[p];
      keys[i] = keys[p];
      i = p;
    }
    items[i] = g;
    keys[i] = key;
  }

  pop(): number {
    const { items, keys } = this;
    const top = items[0];
    const n = --this.count;
    if (n > 0) {
      const g = items[n];
      const key = keys[n];
      let i = 0;
      for (;;) {
        const l = 2 * i + 1;
        if (l >= n) break;
        const r = l + 1;
        const k = r < n && keys[r] < keys[l] ? r : l;
        if (keys[k] >= key) break;
        items[i] = items[k];
        keys[i] = keys[k];
        i = k;
      }
      items[i] = g;
      keys[i] = key;
    }
    this.queued[top] = 0;
    return top;
  }
}
