// Product terms (cubes) and covers: the shape every minimiser returns and the mapper consumes.
// A cube over n inputs is (care, value) bit masks with input i at bit n-1-i, so its PLA text
// reads left to right in input order: '1' = true literal, '0' = complemented, '-' = absent.
import { InputError } from '../errors';
import { getBit, type OutputTable, words } from './truth-table';

export interface Cube {
  /** Bits of the inputs this term tests. */
  care: number;
  /** Required values of those inputs (zero outside `care`). */
  value: number;
}

/** A sum of products for one output. An empty cover is constant 0; a cube with care 0 is 1. */
export type Cover = Cube[];

/** One cover per output of a truth table, in the table's output order. */
export interface MultiCover {
  inputs: string[];
  outputs: { name: string; cover: Cover }[];
}

export function cubeToString(c: Cube, n: number): string {
  let s = '';
  for (let i = 0; i < n; i++) {
    const bit = 1 << (n - 1 - i);
    s += c.care & bit ? (c.value & bit ? '1' : '0') : '-';
  }
  return s;
}

export function cubeFromString(text: string, n: number): Cube {
  if (text.length !== n || !/^[01-]*$/.test(text)) {
    throw InputError.at('logic.bad-cube', `cube "${text}" is not ${n} characters of 0, 1 and -`);
  }
  let care = 0;
  let value = 0;
  for (let i = 0; i < n; i++) {
    const bit = 1 << (n - 1 - i);
    if (text[i] === '1') {
      care |= bit;
      value |= bit;
    } else if (text[i] === '0') care |= bit;
  }
  return { care, value };
}

export function cubeContains(c: Cube, m: number): boolean {
  return (m & c.care) === c.value;
}

export function literalCount(c: Cube): number {
  let x = c.care;
  let k = 0;
  while (x) {
    x &= x - 1;
    k++;
  }
  return k;
}

export function coverLiterals(cover: Cover): number {
  return cover.reduce((s, c) => s + literalCount(c), 0);
}

/** Positions (0..31 in a word) whose minterm bit b is 1, for b < 5. */
const LOW_BIT_MASK = [0xaaaaaaaa, 0xcccccccc, 0xf0f0f0f0, 0xff00ff00, 0xffff0000];

/**
 * Bitset of the minterms a cover is true on, a word at a time: the inputs at minterm bits 0..4
 * pick positions inside a word (one mask per cube), the others pick the words a cube reaches.
 */
export function coverToSet(cover: Cover, n: number): Uint32Array {
  const count = words(n);
  const set = new Uint32Array(count);
  const valid = n >= 5 ? 0xffffffff : 2 ** 2 ** n - 1;
  for (const c of cover) {
    let mask = valid;
    for (let b = 0; b < 5; b++) {
      if (((c.care >>> b) & 1) === 0) continue;
      mask &= (c.value >>> b) & 1 ? LOW_BIT_MASK[b] : ~LOW_BIT_MASK[b];
    }
    // Word w holds minterms 32w..32w+31: its index is the minterm's bits from 5 up.
    const care = c.care >>> 5;
    const value = c.value >>> 5;
    if (care === 0) {
      for (let w = 0; w < count; w++) set[w] |= mask;
    } else {
      for (let w = 0; w < count; w++) if ((w & care) === value) set[w] |= mask;
    }
  }
  return set;
}

/**
 * Checks a cover against an output on its care set: every on-set minterm covered, no off-set
 * minterm covered. Returns the first wrong minterm, or undefined when the cover is right.
 */
export function coverMismatch(
  cover: Cover,
  out: OutputTable,
  n: number,
): { minterm: number; expected: 0 | 1 } | undefined {
  const got = coverToSet(cover, n);
  const size = 2 ** n;
  for (let w = 0; w < got.length; w++) {
    const wrong = (got[w] ^ out.on[w]) & ~out.dc[w];
    if (wrong !== 0) {
      for (let b = 0; b < 32; b++) {
        const m = w * 32 + b;
        if (m < size && (wrong >>> b) & 1) return { minterm: m, expected: getBit(out.on, m) ? 1 : 0 };
      }
    }
  }
  return undefined;
}

/** Human-readable sum of products, e.g. "A'B + CD" (1 and 0 for constants). */
export function coverToText(cover: Cover, inputs: string[]): string {
  if (cover.length === 0) return '0';
  const n = inputs.length;
  return cover
    .map((c) => {
      if (c.care === 0) return '1';
      const lits: string[] = [];
      for (let i = 0; i < n; i++) {
        const bit = 1 << (n - 1 - i);
        if (c.care & bit) lits.push(inputs[i] + (c.value & bit ? '' : "'"));
      }
      return lits.join(inputs.some((x) => x.length > 1) ? '·' : '');
    })
    .join(' + ');
}
