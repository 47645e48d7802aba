// The typed arena hands out zero-filled, aligned, non-overlapping arrays, also past its first buffer.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { OWN_BUFFERS, TypedArena, type TypedAlloc } from './typed-arena';

type Kind = 'i32' | 'u8' | 'i8' | 'f64';
const KINDS: Kind[] = ['i32', 'u8', 'i8', 'f64'];

describe('TypedArena', () => {
  it('gives arrays of the asked length and type, zero-filled, that never share memory', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 400 }),
        fc.array(fc.record({ kind: fc.constantFrom(...KINDS), n: fc.integer({ min: 0, max: 60 }) }), { maxLength: 40 }),
        (bytes, asks) => {
          const arena = new TypedArena(bytes);
          const got = asks.map(({ kind, n }) => ({ kind, n, a: arena[kind](n) }));
          for (const { kind, n, a } of got) {
            expect(a.length).toBe(n);
            expect(a).toBeInstanceOf(OWN_BUFFERS[kind](0).constructor);
            expect(Array.from(a).every((x) => x === 0)).toBe(true);
            // element alignment holds for every type (an unaligned view would have thrown)
            expect(a.byteOffset % 8).toBe(0);
          }
          // write a distinct value everywhere, then read it back: no array overwrote another
          got.forEach(({ a }, i) => a.fill((i % 100) + 1));
          got.forEach(({ a }, i) => expect(Array.from(a).every((x) => x === (i % 100) + 1)).toBe(true));
        },
      ),
    );
  });

  it('starts a further buffer when an estimate is short, and counts what it handed out', () => {
    const arena = new TypedArena(64);
    const a = arena.i32(10); // 40 bytes
    const b = arena.f64(10); // 80 bytes: does not fit beside a
    expect(arena.buffers).toBe(2);
    expect(a.buffer).not.toBe(b.buffer);
    expect(arena.used).toBe(40 + 80);
    const c = arena.u8(3);
    expect(c.byteOffset % 8).toBe(0);
  });

  it('is interchangeable with one buffer per array', () => {
    const fill = (alloc: TypedAlloc) => {
      const x = alloc.i32(5).fill(-1);
      const y = alloc.f64(3).fill(NaN);
      const z = alloc.i8(4);
      z[2] = -7;
      return [Array.from(x), Array.from(y), Array.from(z)];
    };
    expect(fill(new TypedArena(1 << 10))).toEqual(fill(OWN_BUFFERS));
  });

  it('reuses the memory taken after a mark once released, zero-filled again', () => {
    const arena = new TypedArena(1 << 12);
    const kept = arena.i32(4).fill(9);
    const m = arena.mark();
    const temp = arena.f64(16).fill(-1);
    arena.release(m);
    const again = arena.i32(8);
    expect(again.buffer).toBe(temp.buffer);
    expect(again.byteOffset).toBe(temp.byteOffset);
    expect(Array.from(again)).toEqual(new Array(8).fill(0));
    expect(Array.from(kept)).toEqual([9, 9, 9, 9]);
    expect(arena.used).toBe(16 + 32);
  });

  it('reuses nothing when the arena has moved on to a further buffer since the mark', () => {
    const arena = new TypedArena(64);
    const first = arena.u8(8).buffer;
    const m = arena.mark();
    const big = arena.i32(100); // a further buffer
    big.fill(5);
    arena.release(m);
    const next = arena.u8(8);
    expect(next.buffer).not.toBe(first);
    expect(Array.from(big)).toEqual(new Array(100).fill(5));
  });
});
