// Side-by-side data for a two-level rewrite: the block's truth table, the rows its assumptions
// make don't-cares (and which assumption excludes each), the minimised cover the scan chose, the
// rewritten block's values, and a Karnaugh-map layout (Gray-code order) for up to 6 inputs.
import { InputError } from '../errors';
import { type Cover, cubeContains, coverMismatch, coverToText, cubeToString } from '../logic/cubes';
import { evaluate, type Expr } from '../logic/expr';
import { minimiseOutputQm } from '../logic/quine-mccluskey';
import { fromFunction } from '../logic/truth-table';

/** Largest block shown as a table (2^8 rows); the map is drawn up to 6 inputs. */
export const MAX_SIDE_BY_SIDE_INPUTS = 8;
export const MAX_MAP_INPUTS = 6;

export interface TwoLevelRow {
  /** Input values in `inputs` order. */
  bits: (0 | 1)[];
  /** The block's value before the rewrite. */
  before: 0 | 1;
  /** Ids of the assumptions this row breaks (non-empty = a don't-care). */
  excludedBy: string[];
  /** The cover's value. */
  cover: 0 | 1;
  /** The rewritten block's value, when it was derived. */
  after?: 0 | 1;
}

export interface KarnaughLayout {
  rowVars: string[];
  colVars: string[];
  /** Gray-code order of the row and column variable values (as numbers, MSB first). */
  rowOrder: number[];
  colOrder: number[];
}

export interface TwoLevelView {
  output: string;
  inputs: string[];
  rows: TwoLevelRow[];
  cover: { cubes: string[]; text: string; source: 'scan' | 'recomputed' };
  map: KarnaughLayout | null;
  dontCares: number;
}

export function grayCode(bits: number): number[] {
  return Array.from({ length: 2 ** bits }, (_, i) => i ^ (i >> 1));
}

/** Splits the inputs into map rows (first half) and columns (rest), each in Gray-code order. */
export function karnaughLayout(inputs: string[]): KarnaughLayout | null {
  if (inputs.length < 2 || inputs.length > MAX_MAP_INPUTS) return null;
  const nRow = Math.floor(inputs.length / 2);
  return { rowVars: inputs.slice(0, nRow), colVars: inputs.slice(nRow), rowOrder: grayCode(nRow), colOrder: grayCode(inputs.length - nRow) };
}

/**
 * Reads a sum of products written by coverToText ("A'B + CD", or "a·b' + c" when a name is longer
 * than one letter) back into cubes. Returns null when the text does not fit the inputs.
 */
export function parseCoverText(text: string, inputs: string[]): Cover | null {
  const n = inputs.length;
  const t = text.trim();
  if (t === '0') return [];
  const index = new Map(inputs.map((x, i) => [x, i]));
  const multi = inputs.some((x) => x.length > 1);
  const cover: Cover = [];
  for (const term of t.split(' + ')) {
    if (term === '1') {
      cover.push({ care: 0, value: 0 });
      continue;
    }
    const lits = multi ? term.split('·') : (term.match(/[^']'?/g) ?? []);
    let care = 0;
    let value = 0;
    for (const lit of lits) {
      const neg = lit.endsWith("'");
      const i = index.get(neg ? lit.slice(0, -1) : lit);
      if (i === undefined) return null;
      const bit = 1 << (n - 1 - i);
      if (care & bit) return null;
      care |= bit;
      if (!neg) value |= bit;
    }
    if (lits.length === 0) return null;
    cover.push({ care, value });
  }
  return cover;
}

/**
 * Builds the side-by-side view of a block `output = before(inputs)`. `coverText` is the scan's
 * cover; when it is missing or does not match the table on its care set, an exact cover
 * (Quine–McCluskey) is recomputed and marked so.
 */
export function twoLevelView(input: {
  output: string;
  inputs: string[];
  before: Expr;
  after?: Expr;
  assumptions: { id: string; expr: Expr }[];
  coverText?: string;
}): TwoLevelView {
  const n = input.inputs.length;
  if (n < 1 || n > MAX_SIDE_BY_SIDE_INPUTS) {
    throw InputError.at('whatif.block-size', `a side-by-side view takes 1–${MAX_SIDE_BY_SIDE_INPUTS} inputs, the block has ${n}`);
  }
  const env = (bits: number[]) => Object.fromEntries(input.inputs.map((x, i) => [x, bits[i] as 0 | 1]));
  const excluded = (bits: number[]) => input.assumptions.filter((a) => evaluate(a.expr, env(bits)) !== 1).map((a) => a.id);
  const table = fromFunction(input.inputs, [input.output], (bits) => [evaluate(input.before, env(bits)) === 1], (bits) => excluded(bits).length === 0);
  const out = table.outputs[0];
  const parsed = input.coverText !== undefined ? parseCoverText(input.coverText, input.inputs) : null;
  const fromScan = parsed !== null && coverMismatch(parsed, out, n) === undefined;
  const cover = fromScan ? parsed : minimiseOutputQm(out, n).cover;
  const rows: TwoLevelRow[] = [];
  let dontCares = 0;
  for (let m = 0; m < 2 ** n; m++) {
    const bits = input.inputs.map((_, i) => ((m >>> (n - 1 - i)) & 1) as 0 | 1);
    const by = excluded(bits);
    if (by.length) dontCares++;
    rows.push({
      bits,
      before: evaluate(input.before, env(bits)),
      excludedBy: by,
      cover: cover.some((c) => cubeContains(c, m)) ? 1 : 0,
      ...(input.after ? { after: evaluate(input.after, env(bits)) } : {}),
    });
  }
  return {
    output: input.output,
    inputs: [...input.inputs],
    rows,
    cover: { cubes: cover.map((c) => cubeToString(c, n)), text: coverToText(cover, input.inputs), source: fromScan ? 'scan' : 'recomputed' },
    map: karnaughLayout(input.inputs),
    dontCares,
  };
}
