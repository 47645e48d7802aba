// A name-free order of a function's inputs (from the table alone) and the moves between input
// orders, for tables and covers: the minimiser keys what it remembers on the table in this order,
// so the same block wired to inputs whose names sort differently is minimised once.
import type { Cover } from '../cubes';
import type { OutputTable } from '../truth-table';

/** Minterm positions (0..31 in a word) whose index bit `b` is 1, for b < 5. */
const LOW_BIT_MASK = [0xaaaaaaaa, 0xcccccccc, 0xf0f0f0f0, 0xff00ff00, 0xffff0000];

/**
 * Moves the input bits of a minterm or cube mask: input k of the result (bit n-1-k) is input
 * from[k] of x (bit n-1-from[k]).
 */
export function moveBits(x: number, n: number, from: readonly number[]): number {
  let y = 0;
  for (let k = 0; k < n; k++) if ((x >>> (n - 1 - from[k])) & 1) y |= 1 << (n - 1 - k);
  return y;
}

/** The order that undoes `from` (inverse permutation). */
export function inverseOrder(from: readonly number[]): number[] {
  const inv = new Array<number>(from.length);
  from.forEach((i, k) => (inv[i] = k));
  return inv;
}

export const isIdentity = (order: readonly number[]) => order.every((i, k) => i === k);

/** Minterms (among 2^n) in which input i is 1, counted in a bitset. */
function countWithInput(set: Uint32Array, n: number, i: number): number {
  const b = n - 1 - i;
  let c = 0;
  if (b < 5) {
    // The input alternates inside each word: a fixed mask per bit position.
    const mask = LOW_BIT_MASK[b];
    for (let w = 0; w < set.length; w++) c += popcount32(set[w] & mask);
  } else {
    // The input is constant over runs of words.
    for (let w = 0; w < set.length; w++) if ((w >>> (b - 5)) & 1) c += popcount32(set[w]);
  }
  return c;
}

function popcount32(x: number): number {
  x -= (x >>> 1) & 0x55555555;
  x = (x & 0x33333333) + ((x >>> 2) & 0x33333333);
  return (((x + (x >>> 4)) & 0x0f0f0f0f) * 0x01010101) >>> 24;
}

/**
 * Inputs ordered by what the table says of each (on-set minterms with the input at 1, then
 * don't-cares with it at 1), ties kept in the given order: `order[k]` is the input placed k-th.
 * Renaming the inputs permutes the table; this order undoes that wherever those counts tell the
 * inputs apart, and where they tie on inputs the function treats alike the tables agree anyway.
 * (A tie between inputs that differ only costs a repeated minimiser call, never a wrong cover.)
 */
export function canonicalOrder(out: OutputTable, n: number): number[] {
  const on = new Array<number>(n);
  const dc = new Array<number>(n);
  const order = new Array<number>(n);
  for (let i = 0; i < n; i++) {
    on[i] = countWithInput(out.on, n, i);
    dc[i] = countWithInput(out.dc, n, i);
    // Insertion by (on, dc), later inputs after equal ones: a stable sort of at most 16.
    let k = i;
    while (k > 0 && (on[order[k - 1]] > on[i] || (on[order[k - 1]] === on[i] && dc[order[k - 1]] > dc[i]))) {
      order[k] = order[k - 1];
      k--;
    }
    order[k] = i;
  }
  return order;
}

/**
 * Exchanges minterm index bits p < q of a bitset in place: the value at every minterm with bit p
 * set and bit q clear trades places with the one at the minterm with those two bits the other way
 * round. Word-parallel: shifts and masks inside a word, words paired or swapped across them.
 */
function swapIndexBits(set: Uint32Array, p: number, q: number): void {
  if (q < 5) {
    // Both inside a word: a delta swap of the positions with bit p set and bit q clear.
    const d = (1 << q) - (1 << p);
    const mask = (LOW_BIT_MASK[p] & ~LOW_BIT_MASK[q]) >>> 0;
    for (let w = 0; w < set.length; w++) {
      const x = set[w];
      const t = ((x ^ (x >>> d)) & mask) >>> 0;
      set[w] = x ^ t ^ (t << d);
    }
  } else if (p < 5) {
    // Bit q picks the word: pair word w (bit q clear) with word w + 2^(q-5); bit p picks the position.
    const span = 1 << (q - 5);
    const s = 1 << p;
    const low = ~LOW_BIT_MASK[p] >>> 0; // positions with bit p clear
    for (let w = 0; w < set.length; w++) {
      if (w & span) continue;
      const a = set[w];
      const b = set[w + span];
      // a's positions with bit p set trade with b's with bit p clear.
      const t = (((a >>> s) ^ b) & low) >>> 0;
      set[w + span] = b ^ t;
      set[w] = a ^ (t << s);
    }
  } else {
    // Both pick the word: whole words trade places.
    const wp = 1 << (p - 5);
    const wq = 1 << (q - 5);
    for (let w = 0; w < set.length; w++) {
      if (!(w & wp) || w & wq) continue;
      const v = w - wp + wq;
      const x = set[w];
      set[w] = set[v];
      set[v] = x;
    }
  }
}

/**
 * Moves every minterm of a bitset to the order `from` (input k of the result is input from[k]):
 * at most n-1 exchanges of two inputs, each word-parallel, rather than a move per minterm.
 */
function moveSet(set: Uint32Array, n: number, from: readonly number[]): Uint32Array {
  const out = set.slice();
  // at[k]: the input of the original now at position k.
  const at = new Array<number>(n);
  for (let k = 0; k < n; k++) at[k] = k;
  for (let k = 0; k < n; k++) {
    if (at[k] === from[k]) continue;
    let j = k + 1;
    while (at[j] !== from[k]) j++;
    // Input k sits at minterm bit n-1-k: exchanging positions k < j exchanges bits n-1-j < n-1-k.
    swapIndexBits(out, n - 1 - j, n - 1 - k);
    at[j] = at[k];
    at[k] = from[k];
  }
  return out;
}

/** The output's table with its inputs put in the order `from`. */
export function reorderOutput(out: OutputTable, n: number, from: readonly number[]): OutputTable {
  if (isIdentity(from)) return out;
  return { name: out.name, on: moveSet(out.on, n, from), dc: moveSet(out.dc, n, from) };
}

/** A cover with its inputs put in the order `from` (input k of the result is input from[k]). */
export function reorderCover(cover: Cover, n: number, from: readonly number[]): Cover {
  if (isIdentity(from)) return cover.map((c) => ({ care: c.care, value: c.value }));
  return cover.map((c) => ({ care: moveBits(c.care, n, from), value: moveBits(c.value, n, from) }));
}
