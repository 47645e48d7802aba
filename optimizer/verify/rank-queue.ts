// Worklists of groups ordered by topological rank, so the simulator settles acyclic logic with one
// evaluation per group and a group is queued once: a binary min-heap over any ranks, and a two-level
// bitmap for groups numbered in rank order (the switch model's). Both live in typed arrays: no
// allocation per push or pop, since a large design pushes millions of groups in a simulation.
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

/**
 * Worklist of ids 0..n-1 that pops the lowest queued id: one bit per id, and a summary bit per
 * 32-id word saying the word is non-empty. Push is constant time; pop scans summary words upward
 * from the lowest one that may be set, so a step that queues k groups out of n costs about
 * k + n/1024 word reads, and a wave of evaluations reads the group tables in order.
 */
export class LowestFirstQueue {
  private readonly bits: Int32Array;
  private readonly summary: Int32Array;
  private count = 0;
  /** No summary word below this one is non-zero. */
  private low = 0;
  constructor(n: number) {
    this.bits = new Int32Array((n + 31) >>> 5);
    this.summary = new Int32Array((this.bits.length + 31) >>> 5);
  }

  get size(): number {
    return this.count;
  }

  push(g: number): void {
    const w = g >>> 5;
    const bit = 1 << (g & 31);
    const word = this.bits[w];
    if (word & bit) return;
    if (word === 0) {
      const s = w >>> 5;
      this.summary[s] |= 1 << (w & 31);
      if (s < this.low) this.low = s;
    }
    this.bits[w] = word | bit;
    this.count++;
  }

  /** The lowest queued id; only called while size > 0. */
  pop(): number {
    const { bits, summary } = this;
    let s = this.low;
    while (summary[s] === 0) s++;
    this.low = s;
    const sw = summary[s];
    const w = (s << 5) | (31 - Math.clz32(sw & -sw));
    const word = bits[w];
    const g = (w << 5) | (31 - Math.clz32(word & -word));
    const rest = word & (word - 1);
    bits[w] = rest;
    if (rest === 0) summary[s] = sw & (sw - 1);
    this.count--;
    return g;
  }
}
