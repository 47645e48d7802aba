// Compressed adjacency lists for the switch-level model: pairs gathered in order, then laid out
// per key in typed arrays, so a million nets cost a few flat arrays instead of an array apiece.

/** Compressed lists: the entries of list i are list[off[i]] .. list[off[i+1]-1]. */
export interface Csr {
  off: Int32Array;
  list: Int32Array;
}

/** Key/value pairs collected in order, then grouped by key keeping that order (counting sort). */
export class Pairs {
  keys: Int32Array;
  vals: Int32Array;
  size = 0;
  /** @param capacity expected number of pairs (more still fit: the arrays grow) */
  constructor(capacity = 1024) {
    this.keys = new Int32Array(Math.max(16, capacity));
    this.vals = new Int32Array(Math.max(16, capacity));
  }
  push(k: number, v: number): void {
    if (this.size === this.keys.length) {
      this.keys = grow(this.keys);
      this.vals = grow(this.vals);
    }
    this.keys[this.size] = k;
    this.vals[this.size++] = v;
  }
  toCsr(n: number): Csr {
    const off = new Int32Array(n + 1);
    for (let i = 0; i < this.size; i++) off[this.keys[i] + 1]++;
    for (let i = 0; i < n; i++) off[i + 1] += off[i];
    const fill = off.slice(0, n);
    const list = new Int32Array(this.size);
    for (let i = 0; i < this.size; i++) list[fill[this.keys[i]]++] = this.vals[i];
    return { off, list };
  }
}

export function grow(a: Int32Array) {
  const b = new Int32Array(a.length * 2);
  b.set(a);
  return b;
}


/** The same lists under new keys: list k becomes list newKey[k] (newKey a permutation). */
export function permute(c: Csr, newKey: Int32Array): Csr {
  const n = newKey.length;
  const oldKey = new Int32Array(n);
  for (let k = 0; k < n; k++) oldKey[newKey[k]] = k;
  const off = new Int32Array(n + 1);
  const list = new Int32Array(c.list.length);
  let at = 0;
  for (let j = 0; j < n; j++) {
    const k = oldKey[j];
    off[j] = at;
    for (let i = c.off[k], end = c.off[k + 1]; i < end; i++) list[at++] = c.list[i];
  }
  off[n] = at;
  return { off, list };
}
