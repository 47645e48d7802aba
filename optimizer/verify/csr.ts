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
    // Counts land one slot further right than the offsets, so the fill pass can advance the
    // offsets in place and leave each one at its list's start (no cursor array beside them).
    const at = new Int32Array(n + 2);
    const { keys, vals, size } = this;
    for (let i = 0; i < size; i++) at[keys[i] + 2]++;
    for (let i = 2; i <= n + 1; i++) at[i] += at[i - 1];
    const list = new Int32Array(size);
    for (let i = 0; i < size; i++) list[at[keys[i] + 1]++] = vals[i];
    return { off: at.subarray(0, n + 1), list };
  }
}

export function grow(a: Int32Array) {
  const b = new Int32Array(a.length * 2);
  b.set(a);
  return b;
}


/**
 * The same lists under new keys: list k becomes list newKey[k] (newKey a permutation). A caller
 * that already holds the inverse (oldKey[newKey[k]] = k) passes it, sparing a key-sized array.
 */
export function permute(c: Csr, newKey: Int32Array, inverse?: Int32Array): Csr {
  const n = newKey.length;
  let oldKey = inverse;
  if (!oldKey) {
    oldKey = new Int32Array(n);
    for (let k = 0; k < n; k++) oldKey[newKey[k]] = k;
  }
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
