// Compressed adjacency lists for the switch-level model: pairs gathered in order, then laid out
// per key in typed arrays, so a million nets cost a few flat arrays instead of an array apiece.

/** Compressed lists: the entries of list i are list[off[i]] .. list[off[i+1]-1]. */
export interface Csr {
  off: Int32Array;
  list: Int32Array;
}

/** Key/value pairs collected in order, then grouped by key keeping that order (counting sort). */
export class Pairs {
  keys = new Int32Array(1024);
  vals = new Int32Array(1024);
  size = 0;
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

