// Numbers names in first-seen order (0, 1, 2 …) with an open-addressing hash table in typed
// arrays: the readers and flatten number hundreds of thousands of net names, where a Map's probes
// and per-entry objects cost several times more than hashing the few characters of a name.

export class NameTable {
  /** Names by number, in first-seen order (the first string met for each name). */
  readonly names: string[] = [];
  /**
   * Slots in pairs: a name's hash, then its number + 1 (0: empty). The hash beside the number lets
   * a probe settle on one read of the table, where a separate list of hashes cost a second read
   * elsewhere in memory; growing rehashes from the slots alone. A power of two of pairs, at most
   * half of them used.
   */
  private slots: Int32Array;

  /** @param expected names the table will likely hold (sizes it once instead of growing step by step) */
  constructor(expected = 64) {
    let pairs = 128;
    while (pairs < expected * 2) pairs *= 2;
    this.slots = new Int32Array(pairs * 2);
  }

  get size(): number {
    return this.names.length;
  }

  /** The name's number, or -1 when it has not been added. */
  get(name: string): number {
    const h = hashOf(name);
    const slots = this.slots;
    const mask = (slots.length >> 1) - 1;
    for (let s = h & mask; ; s = (s + 1) & mask) {
      const id = slots[2 * s + 1] - 1;
      if (id < 0) return -1;
      if (slots[2 * s] === h && this.names[id] === name) return id;
    }
  }

  /** The name's number, numbering it next on first sight. */
  add(name: string): number {
    const h = hashOf(name);
    const slots = this.slots;
    const mask = (slots.length >> 1) - 1;
    let s = h & mask;
    for (; ; s = (s + 1) & mask) {
      const id = slots[2 * s + 1] - 1;
      if (id < 0) break;
      if (slots[2 * s] === h && this.names[id] === name) return id;
    }
    const id = this.names.length;
    this.names.push(name);
    slots[2 * s] = h;
    slots[2 * s + 1] = id + 1;
    if ((id + 1) * 2 > mask + 1) this.grow();
    return id;
  }

  private grow(): void {
    const old = this.slots;
    const slots = new Int32Array(old.length * 2);
    const mask = (slots.length >> 1) - 1;
    for (let o = 0; o < old.length; o += 2) {
      if (old[o + 1] === 0) continue;
      let s = old[o] & mask;
      while (slots[2 * s + 1] !== 0) s = (s + 1) & mask;
      slots[2 * s] = old[o];
      slots[2 * s + 1] = old[o + 1];
    }
    this.slots = slots;
  }
}

/**
 * Finds the names repeated in a list (a cell's devices), with no table of names: a hash table of
 * millions of names costs a cache miss per name wherever it is probed, and more again each time
 * it grows. Instead each name's hash is appended as the list is built — a reader does it while the
 * name is fresh in memory — and the hashes are sorted once (three counting passes that read and
 * write memory in order); only names whose hashes meet are compared.
 */
export class Repeats {
  private hashes: Int32Array;
  private size = 0;

  /** @param expected names likely to be added (sizes the list of hashes once) */
  constructor(expected = 64) {
    this.hashes = new Int32Array(Math.max(expected, 16));
  }

  /** Adds the next entry's name. */
  add(name: string): void {
    if (this.size === this.hashes.length) {
      const grown = new Int32Array(this.hashes.length * 2);
      grown.set(this.hashes);
      this.hashes = grown;
    }
    this.hashes[this.size++] = hashOf(name);
  }

  /**
   * The entries (numbered in the order added) whose name an earlier entry has, in ascending
   * order: with "R1 R1 R1", the second and the third. `nameAt(i)` is entry i's name.
   */
  find(nameAt: (i: number) => string): number[] {
    const n = this.size;
    let keys = this.hashes.slice(0, n);
    let at = new Int32Array(n);
    for (let i = 0; i < n; i++) at[i] = i;
    // Least significant digit first, each pass stable: entries of one hash stay in the order added.
    let keys2 = new Int32Array(n);
    let at2 = new Int32Array(n);
    const count = new Int32Array(2048);
    for (let shift = 0; shift < 31; shift += 11) {
      count.fill(0);
      for (let i = 0; i < n; i++) count[(keys[i] >>> shift) & 2047]++;
      for (let d = 0, sum = 0; d < 2048; d++) {
        const c = count[d];
        count[d] = sum;
        sum += c;
      }
      for (let i = 0; i < n; i++) {
        const to = count[(keys[i] >>> shift) & 2047]++;
        keys2[to] = keys[i];
        at2[to] = at[i];
      }
      [keys, keys2] = [keys2, keys];
      [at, at2] = [at2, at];
    }
    const out: number[] = [];
    for (let a = 0; a < n; ) {
      let b = a + 1;
      while (b < n && keys[b] === keys[a]) b++;
      if (b - a > 1) repeatsAmong(at, a, b, nameAt, out);
      a = b;
    }
    // Runs of different hashes interleave in the list: back into list order.
    return out.length > 1 ? out.sort((x, y) => x - y) : out;
  }
}

/** Entries at[a ..< b] share a hash and come in list order: those whose name came before go to out. */
function repeatsAmong(at: Int32Array, a: number, b: number, nameAt: (i: number) => string, out: number[]): void {
  if (b - a <= 8) {
    for (let j = a + 1; j < b; j++) {
      const name = nameAt(at[j]);
      for (let k = a; k < j; k++) {
        if (nameAt(at[k]) === name) {
          out.push(at[j]);
          break;
        }
      }
    }
    return;
  }
  // Many entries on one hash (a name written many times over): a set keeps this linear.
  const seen = new Set<string>();
  for (let j = a; j < b; j++) {
    const name = nameAt(at[j]);
    if (seen.has(name)) out.push(at[j]);
    else seen.add(name);
  }
}

/** FNV-1a over the UTF-16 code units, with a final mix so short names spread over the low bits. */
function hashOf(name: string): number {
  let h = 0x811c9dc5 | 0;
  for (let i = 0; i < name.length; i++) h = Math.imul(h ^ name.charCodeAt(i), 0x01000193);
  h ^= h >>> 15;
  h = Math.imul(h, 0x2c1b3c6d);
  h ^= h >>> 12;
  return h & 0x7fffffff;
}
