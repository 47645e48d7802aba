// Compressed adjacency lists for the switch-level model: pairs gathered in order, then laid out
// per key in typed arrays, so a million nets cost a few flat arrays instead of an array apiece.
import { OWN_BUFFERS, type TypedAlloc } from '../netlist/typed-arena';

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
  /**
   * @param capacity expected number of pairs (more still fit: the arrays grow)
   * @param alloc where the pair arrays (and grown copies) come from
   */
  constructor(capacity = 1024, private readonly alloc: TypedAlloc = OWN_BUFFERS) {
    this.keys = alloc.i32(Math.max(16, capacity));
    this.vals = alloc.i32(Math.max(16, capacity));
  }
  push(k: number, v: number): void {
    if (this.size === this.keys.length) {
      this.keys = grow(this.keys, this.alloc);
      this.vals = grow(this.vals, this.alloc);
    }
    this.keys[this.size] = k;
    this.vals[this.size++] = v;
  }
  /** @param alloc where the lists come from (the pairs' own allocator unless given) */
  toCsr(n: number, alloc: TypedAlloc = this.alloc): Csr {
    // Counts land one slot further right than the offsets, so the fill pass can advance the
    // offsets in place and leave each one at its list's start (no cursor array beside them).
    const at = alloc.i32(n + 2);
    const { keys, vals, size } = this;
    for (let i = 0; i < size; i++) at[keys[i] + 2]++;
    for (let i = 2; i <= n + 1; i++) at[i] += at[i - 1];
    const list = alloc.i32(size);
    for (let i = 0; i < size; i++) list[at[keys[i] + 1]++] = vals[i];
    return { off: at.subarray(0, n + 1), list };
  }
}

export function grow(a: Int32Array, alloc: TypedAlloc = OWN_BUFFERS): Int32Array {
  const b = alloc.i32(a.length * 2);
  b.set(a);
  return b;
}


/**
 * The same lists under new keys: list k becomes list newKey[k] (newKey a permutation). A caller
 * that already holds the inverse (oldKey[newKey[k]] = k) passes it, sparing a key-sized array.
 * `offAlloc` and `listAlloc` say where the result's two arrays come from (a caller may keep only
 * the offsets).
 */
export function permute(c: Csr, newKey: Int32Array, inverse?: Int32Array, offAlloc: TypedAlloc = OWN_BUFFERS, listAlloc: TypedAlloc = offAlloc): Csr {
  const n = newKey.length;
  let oldKey = inverse;
  if (!oldKey) {
    oldKey = listAlloc.i32(n);
    for (let k = 0; k < n; k++) oldKey[newKey[k]] = k;
  }
  const off = offAlloc.i32(n + 1);
  const list = listAlloc.i32(c.list.length);
  let at = 0;
  for (let j = 0; j < n; j++) {
    const k = oldKey[j];
    off[j] = at;
    for (let i = c.off[k], end = c.off[k + 1]; i < end; i++) list[at++] = c.list[i];
  }
  off[n] = at;
  return { off, list };
}
