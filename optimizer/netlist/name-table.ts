// Numbers names in first-seen order (0, 1, 2 …) with an open-addressing hash table in typed
// arrays: the readers and flatten number hundreds of thousands of net names, where a Map's probes
// and per-entry objects cost several times more than hashing the few characters of a name.

const EMPTY = -1;

export class NameTable {
  /** Names by number, in first-seen order (the first string met for each name). */
  readonly names: string[] = [];
  /** Hash of each name, by number (kept so growing the table never hashes a name again). */
  private hashes: Int32Array;
  /** Slots: a name's number, or EMPTY. Size is a power of two, at most half full. */
  private slots: Int32Array;

  /** @param expected names the table will likely hold (sizes it once instead of growing step by step) */
  constructor(expected = 64) {
    let slots = 128;
    while (slots < expected * 2) slots *= 2;
    this.hashes = new Int32Array(slots / 2);
    this.slots = new Int32Array(slots).fill(EMPTY);
  }

  get size(): number {
    return this.names.length;
  }

  /** The name's number, or -1 when it has not been added. */
  get(name: string): number {
    const h = hashOf(name);
    const mask = this.slots.length - 1;
    for (let s = h & mask; ; s = (s + 1) & mask) {
      const id = this.slots[s];
      if (id === EMPTY) return -1;
      if (this.hashes[id] === h && this.names[id] === name) return id;
    }
  }

  /** The name's number, numbering it next on first sight. */
  add(name: string): number {
    const h = hashOf(name);
    const slots = this.slots;
    const mask = slots.length - 1;
    let s = h & mask;
    for (; ; s = (s + 1) & mask) {
      const id = slots[s];
      if (id === EMPTY) break;
      if (this.hashes[id] === h && this.names[id] === name) return id;
    }
    const id = this.names.length;
    this.names.push(name);
    if (id === this.hashes.length) {
      const grown = new Int32Array(id * 2);
      grown.set(this.hashes);
      this.hashes = grown;
    }
    this.hashes[id] = h;
    slots[s] = id;
    if ((id + 1) * 2 > slots.length) this.grow();
    return id;
  }

  private grow(): void {
    const slots = new Int32Array(this.slots.length * 2).fill(EMPTY);
    const mask = slots.length - 1;
    const n = this.names.length;
    for (let id = 0; id < n; id++) {
      let s = this.hashes[id] & mask;
      while (slots[s] !== EMPTY) s = (s + 1) & mask;
      slots[s] = id;
    }
    this.slots = slots;
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
