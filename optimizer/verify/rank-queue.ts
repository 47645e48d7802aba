// Worklist of groups ordered by topological rank (a binary min-heap with a membership flag), so
// the simulator settles acyclic logic with one evaluation per group and a group is queued once.
export class RankQueue {
  private readonly heap: number[] = [];
  private readonly queued: Uint8Array;
  constructor(private readonly rank: Int32Array) {
    this.queued = new Uint8Array(rank.length);
  }

  get size(): number {
    return this.heap.length;
  }

  push(g: number): void {
    if (this.queued[g]) return;
    this.queued[g] = 1;
    const { heap, rank } = this;
    heap.push(g);
    let i = heap.length - 1;
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (rank[heap[p]] <= rank[heap[i]]) break;
      [heap[p], heap[i]] = [heap[i], heap[p]];
      i = p;
    }
  }

  pop(): number {
    const { heap, rank } = this;
    const top = heap[0];
    const last = heap.pop()!;
    if (heap.length) {
      heap[0] = last;
      let i = 0;
      for (;;) {
        const l = 2 * i + 1;
        const r = l + 1;
        let k = i;
        if (l < heap.length && rank[heap[l]] < rank[heap[k]]) k = l;
        if (r < heap.length && rank[heap[r]] < rank[heap[k]]) k = r;
        if (k === i) break;
        [heap[k], heap[i]] = [heap[i], heap[k]];
        i = k;
      }
    }
    this.queued[top] = 0;
    return top;
  }
}
