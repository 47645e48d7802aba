// Typed arrays carved out of a few large buffers. V8 counts every typed array's memory as external
// to its heap and, once 64 MB more of it has been allocated since the last full collection, starts
// one: a model of a million-device design built from a hundred separate arrays next to a 2 GB heap
// paid for several full collections of that heap. Buffers taken together cost one.

/** Where a table's typed arrays come from: the engine's heap (one buffer each) or an arena. */
export interface TypedAlloc {
  i32(n: number): Int32Array;
  u8(n: number): Uint8Array;
  i8(n: number): Int8Array;
  f64(n: number): Float64Array;
}

/** One buffer per array, as `new Int32Array(n)` gives. */
export const OWN_BUFFERS: TypedAlloc = {
  i32: (n) => new Int32Array(n),
  u8: (n) => new Uint8Array(n),
  i8: (n) => new Int8Array(n),
  f64: (n) => new Float64Array(n),
};

/**
 * A bump allocator: arrays are zero-filled views into a buffer sized up front from the caller's
 * estimate; an array that does not fit starts a further buffer (half the first's size at least),
 * so a short estimate costs speed, never correctness. Nothing is freed one array at a time: the
 * buffers go when the last view into them does.
 */
export class TypedArena implements TypedAlloc {
  private buf: ArrayBuffer;
  private at = 0;
  /** End of the memory handed out before the last release(): reused memory below it is zeroed. */
  private dirty = 0;
  private readonly chunk: number;
  /** Bytes handed out, alignment included (for sizing estimates in tests and benches). */
  used = 0;
  /** Buffers allocated so far. */
  buffers = 1;

  /** @param bytes expected total; the first buffer is this size (rounded up to 8 bytes) */
  constructor(bytes: number) {
    this.chunk = Math.max(64, align(bytes));
    this.buf = new ArrayBuffer(this.chunk);
  }

  /** Byte offset of a fresh region of `bytes` (8-byte aligned, so any element type fits). */
  private take(bytes: number): number {
    const size = align(bytes);
    if (this.at + size > this.buf.byteLength) {
      this.buf = new ArrayBuffer(Math.max(size, align(this.chunk / 2)));
      this.at = 0;
      this.buffers++;
    }
    const from = this.at;
    this.at += size;
    this.used += size;
    if (from < this.dirty) new Uint8Array(this.buf, from, Math.min(size, this.dirty - from)).fill(0);
    return from;
  }

  /** A point to release back to: everything handed out after it can be reused. */
  mark(): { buf: ArrayBuffer; at: number } {
    return { buf: this.buf, at: this.at };
  }

  /**
   * Hands the memory taken since `m` back for reuse (arrays taken since then must not be used
   * again). After the arena moved on to a further buffer, nothing is reused.
   */
  release(m: { buf: ArrayBuffer; at: number }): void {
    if (m.buf !== this.buf) return;
    this.dirty = Math.max(this.dirty, this.at);
    this.used -= this.at - m.at;
    this.at = m.at;
  }

  i32(n: number): Int32Array {
    const at = this.take(4 * n);
    return new Int32Array(this.buf, at, n);
  }

  u8(n: number): Uint8Array {
    const at = this.take(n);
    return new Uint8Array(this.buf, at, n);
  }

  i8(n: number): Int8Array {
    const at = this.take(n);
    return new Int8Array(this.buf, at, n);
  }

  f64(n: number): Float64Array {
    const at = this.take(8 * n);
    return new Float64Array(this.buf, at, n);
  }
}

function align(bytes: number): number {
  return Math.ceil(bytes / 8) * 8;
}
