// Textbook and mathematical worked examples of two-level minimisation, shared by the tests of
// every minimiser. Each carries the published minimal term (and literal) counts and its source.
import { fromFunction, fromMinterms, type TruthTable } from './truth-table';

export interface WorkedExample {
  name: string;
  source: string;
  table: TruthTable;
  /** Minimal term count per output, in output order. */
  terms: number[];
  /** Minimal literal count per output where the source gives the expressions. */
  literals?: number[];
}

const BCD = ['A', 'B', 'C', 'D'];
const BCD_DC = [10, 11, 12, 13, 14, 15];

/** Segments lit per decimal digit; 6 lights a, 7 lights a b c, 9 lights d. */
const SEGMENTS: Record<string, number[]> = {
  a: [0, 2, 3, 5, 6, 7, 8, 9],
  b: [0, 1, 2, 3, 4, 7, 8, 9],
  c: [0, 1, 3, 4, 5, 6, 7, 8, 9],
  d: [0, 2, 3, 5, 6, 8, 9],
  e: [0, 2, 6, 8],
  f: [0, 4, 5, 6, 8, 9],
  g: [2, 3, 4, 5, 6, 8, 9],
};

export function parityTable(n: number): TruthTable {
  const inputs = Array.from({ length: n }, (_, i) => `X${i}`);
  return fromFunction(inputs, ['P'], (bits) => [bits.reduce((a, b) => a ^ b, 0) === 1]);
}

export const WORKED_EXAMPLES: WorkedExample[] = [
  {
    name: 'BCD to seven-segment',
    // Mano & Ciletti, Digital Design, BCD-to-seven-segment decoder (from memory): 4,3,3,5,2,4,4 = 25.
    source: 'Mano & Ciletti, Digital Design (from memory)',
    table: fromMinterms(
      BCD,
      Object.entries(SEGMENTS).map(([name, on]) => ({ name, on, dc: BCD_DC })),
    ),
    terms: [4, 3, 3, 5, 2, 4, 4],
  },
  {
    name: 'BCD to excess-3',
    // Mano, Digital Design, code-conversion example (from memory):
    // w = A + BC + BD; x = B'C + B'D + BC'D'; y = CD + C'D'; z = D'.
    source: 'Mano, Digital Design, code conversion (from memory)',
    table: fromMinterms(
      BCD,
      ['w', 'x', 'y', 'z'].map((name, k) => ({
        name,
        on: Array.from({ length: 10 }, (_, d) => d).filter((d) => (((d + 3) >> (3 - k)) & 1) === 1),
        dc: BCD_DC,
      })),
    ),
    terms: [3, 3, 2, 1],
    literals: [5, 7, 4, 1],
  },
  {
    name: 'Σm(0,1,2,4,5,6,8,9,12,13,14)',
    // Mano, Digital Design, map example (from memory): F = y' + w'z' + xz'.
    source: 'Mano, Digital Design, map example (from memory)',
    table: fromMinterms(['w', 'x', 'y', 'z'], [{ name: 'F', on: [0, 1, 2, 4, 5, 6, 8, 9, 12, 13, 14] }]),
    terms: [3],
    literals: [5],
  },
  {
    name: 'Σm(1,3,7,11,15) + d(0,2,5)',
    // Mano, Digital Design, don't-care example (from memory): F = yz + w'z or yz + w'x'.
    source: 'Mano, Digital Design, don\'t-care example (from memory)',
    table: fromMinterms(['w', 'x', 'y', 'z'], [{ name: 'F', on: [1, 3, 7, 11, 15], dc: [0, 2, 5] }]),
    terms: [2],
    literals: [4],
  },
  ...[2, 3, 4, 5, 6].map((n) => ({
    name: `${n}-input parity`,
    // Mathematics: no two odd-weight minterms are adjacent, so none merge: 2^(n-1) terms of n literals.
    source: 'mathematics',
    table: parityTable(n),
    terms: [2 ** (n - 1)],
    literals: [2 ** (n - 1) * n],
  })),
  {
    name: '2-bit magnitude comparator',
    // Mathematics (checked by exhaustion): GT and LT 3 terms each, EQ 4 terms of 4 literals.
    source: 'mathematics',
    table: fromFunction(['A1', 'A0', 'B1', 'B0'], ['GT', 'LT', 'EQ'], (b) => {
      const a = b[0] * 2 + b[1];
      const c = b[2] * 2 + b[3];
      return [a > c, a < c, a === c];
    }),
    terms: [3, 3, 4],
    literals: [8, 8, 16],
  },
];
