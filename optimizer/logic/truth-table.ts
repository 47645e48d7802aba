// Multi-output Boolean functions as bit-parallel truth tables with a don't-care set.
// Minterm m assigns input i the bit (m >> (n-1-i)) & 1: inputs[0] is the most significant,
// as in the textbooks' Σm notation and the column order of a Berkeley PLA.
import { InputError, InternalError } from '../errors';
import { evaluateWords, support, type Expr } from './expr';

/** Largest input count a truth table is built for (2^20 minterms = 128 KiB per bitset). */
export const MAX_TABLE_INPUTS = 20;

/** One output: its on-set and don't-care set as bitsets over the 2^n minterms. */
export interface OutputTable {
  name: string;
  on: Uint32Array;
  dc: Uint32Array;
}

export interface TruthTable {
  inputs: string[];
  outputs: OutputTable[];
}

export function words(n: number): number {
  return Math.max(1, Math.ceil(2 ** n / 32));
}

export function getBit(set: Uint32Array, m: number): boolean {
  return ((set[m >>> 5] >>> (m & 31)) & 1) === 1;
}

export function setBit(set: Uint32Array, m: number): void {
  set[m >>> 5] |= 1 << (m & 31);
}

export function clearBit(set: Uint32Array, m: number): void {
  set[m >>> 5] &= ~(1 << (m & 31));
}

function checkInputs(inputs: string[]): void {
  if (inputs.length > MAX_TABLE_INPUTS) {
    throw InputError.at(
      'logic.too-many-inputs',
      `a truth table over ${inputs.length} inputs is too large (limit ${MAX_TABLE_INPUTS})`,
    );
  }
  if (new Set(inputs).size !== inputs.length) {
    throw InputError.at('logic.duplicate-input', `duplicate input names in ${inputs.join(', ')}`);
  }
}

/** Builds a one-output table from minterm lists, as in F = Σm(...) + d(...). */
export function fromMinterms(
  inputs: string[],
  outputs: { name: string; on: number[]; dc?: number[] }[],
): TruthTable {
  checkInputs(inputs);
  const n = inputs.length;
  const size = 2 ** n;
  return {
    inputs: [...inputs],
    outputs: outputs.map(({ name, on, dc = [] }) => {
      const o: OutputTable = { name, on: new Uint32Array(words(n)), dc: new Uint32Array(words(n)) };
      for (const m of dc) {
        if (!Number.isInteger(m) || m < 0 || m >= size) {
          throw InputError.at('logic.bad-minterm', `don't-care minterm ${m} is outside 0..${size - 1}`);
        }
        setBit(o.dc, m);
      }
      for (const m of on) {
        if (!Number.isInteger(m) || m < 0 || m >= size) {
          throw InputError.at('logic.bad-minterm', `minterm ${m} is outside 0..${size - 1}`);
        }
        if (getBit(o.dc, m)) {
          throw InputError.at('logic.on-and-dc', `minterm ${m} of ${name} is both in the on-set and a don't-care`);
        }
        setBit(o.on, m);
      }
      return o;
    }),
  };
}

/**
 * Builds a table by evaluating a function of the input assignment. `care(m)` false makes the
 * minterm a don't-care for every output (an assumption that excludes it).
 */
export function fromFunction(
  inputs: string[],
  outputNames: string[],
  evaluate: (bits: number[], m: number) => boolean[],
  care?: (bits: number[], m: number) => boolean,
): TruthTable {
  checkInputs(inputs);
  const n = inputs.length;
  const outs: OutputTable[] = outputNames.map((name) => ({
    name,
    on: new Uint32Array(words(n)),
    dc: new Uint32Array(words(n)),
  }));
  const bits = new Array<number>(n).fill(0);
  for (let m = 0; m < 2 ** n; m++) {
    for (let i = 0; i < n; i++) bits[i] = (m >>> (n - 1 - i)) & 1;
    if (care && !care(bits, m)) {
      for (const o of outs) setBit(o.dc, m);
      continue;
    }
    const values = evaluate(bits, m);
    if (values.length !== outs.length) {
      throw new InternalError(`truth table evaluator returned ${values.length} values for ${outs.length} outputs`);
    }
    values.forEach((v, k) => {
      if (v) setBit(outs[k].on, m);
    });
  }
  return { inputs: [...inputs], outputs: outs };
}

/** Calls `visit` with each minterm of a bitset below 2^n, ascending (set bits found a word at a time). */
export function forEachMinterm(set: Uint32Array, n: number, visit: (m: number) => void): void {
  const size = 2 ** n;
  for (let w = 0; w < set.length; w++) {
    let word = set[w];
    while (word !== 0) {
      const low = word & -word;
      const m = w * 32 + (31 - Math.clz32(low));
      word ^= low;
      if (m < size) visit(m);
    }
  }
}

/** Minterms in a bitset, ascending. */
export function mintermsOf(set: Uint32Array, n: number): number[] {
  const out: number[] = [];
  forEachMinterm(set, n, (m) => out.push(m));
  return out;
}

export function popcount(set: Uint32Array): number {
  let c = 0;
  for (let w = 0; w < set.length; w++) {
    let x = set[w];
    x -= (x >>> 1) & 0x55555555;
    x = (x & 0x33333333) + ((x >>> 2) & 0x33333333);
    c += (((x + (x >>> 4)) & 0x0f0f0f0f) * 0x01010101) >>> 24;
  }
  return c;
}

/** Mask of the valid minterm bits (only the last word of a table with n < 5 is partial). */
export function fullSet(n: number): Uint32Array {
  const s = new Uint32Array(words(n));
  if (n >= 5) s.fill(0xffffffff);
  else s[0] = 2 ** 2 ** n - 1;
  return s;
}

/** Care-set classification of one output: constant 0, constant 1, or a real function. */
export function constantValue(o: OutputTable, n: number): 0 | 1 | undefined {
  // Every word is full but the only word of a table of fewer than 5 inputs (no mask allocated).
  const full = n >= 5 ? 0xffffffff : 2 ** 2 ** n - 1;
  const count = words(n);
  let anyOn = false;
  let allOnOrDc = true;
  for (let w = 0; w < count; w++) {
    if (o.on[w] !== 0) anyOn = true;
    // Unsigned compare: a full word is 0xffffffff, not the -1 that & gives.
    if ((((o.on[w] | o.dc[w]) & full) >>> 0) !== full) allOnOrDc = false;
  }
  if (!anyOn) return 0;
  if (allOnOrDc) return 1;
  return undefined;
}

/** The same function with on-set and off-set swapped (don't-cares kept): the complement's table. */
export function complementTable(t: TruthTable): TruthTable {
  const n = t.inputs.length;
  const all = fullSet(n);
  return {
    inputs: [...t.inputs],
    outputs: t.outputs.map((o) => {
      const on = new Uint32Array(o.on.length);
      for (let w = 0; w < on.length; w++) on[w] = ~(o.on[w] | o.dc[w]) & all[w];
      return { name: o.name, on, dc: o.dc.slice() };
    }),
  };
}

/**
 * Bit-parallel table of expressions over `inputs`: 32 minterms per evaluation. `care` false makes
 * a minterm a don't-care for every output (the conjunction of the assumptions, say).
 */
export function fromExprs(inputs: string[], outputs: { name: string; fn: Expr }[], care?: Expr): TruthTable {
  checkInputs(inputs);
  const n = inputs.length;
  const nWords = words(n);
  const valid = fullSet(n);
  const outs: OutputTable[] = outputs.map(({ name }) => ({ name, on: new Uint32Array(nWords), dc: new Uint32Array(nWords) }));
  const env = new Map<string, number>();
  // Inputs whose bit lies inside a word follow a fixed 32-bit pattern; the others are constant per word.
  const pattern = (bit: number) => {
    let w = 0;
    for (let b = 0; b < 32; b++) if ((b >> bit) & 1) w |= 1 << b;
    return w | 0;
  };
  for (let w = 0; w < nWords; w++) {
    inputs.forEach((x, i) => {
      const bit = n - 1 - i;
      env.set(x, bit < 5 ? pattern(bit) : ((w * 32) >> bit) & 1 ? -1 : 0);
    });
    const careWord = care ? evaluateWords(care, env) & valid[w] : valid[w];
    outputs.forEach(({ fn }, k) => {
      outs[k].on[w] = evaluateWords(fn, env) & careWord;
      outs[k].dc[w] = ~careWord & valid[w];
    });
  }
  return { inputs: [...inputs], outputs: outs };
}

/**
 * Bit-parallel table of one output computed by a network of small functions evaluated in order:
 * each step may read the inputs and the steps before it, and the output is the step named
 * `output`. A deep chain costs one small evaluation per step instead of a recursion through the
 * composed expression. A step reading a name that is neither an input nor an earlier step is an
 * error, as an unbound variable is for `fromExprs`.
 */
export function fromNetwork(inputs: string[], steps: readonly { name: string; fn: Expr }[], output: string, care?: Expr): TruthTable {
  checkInputs(inputs);
  const known = new Set(inputs);
  for (const s of steps) {
    for (const x of support(s.fn)) if (!known.has(x)) throw new RangeError(`no value for "${x}"`);
    known.add(s.name);
  }
  if (!known.has(output)) throw new RangeError(`no value for "${output}"`);
  const n = inputs.length;
  const nWords = words(n);
  const valid = fullSet(n);
  const out: OutputTable = { name: output, on: new Uint32Array(nWords), dc: new Uint32Array(nWords) };
  const env = new Map<string, number>();
  for (let w = 0; w < nWords; w++) {
    inputs.forEach((x, i) => env.set(x, inputWord(n - 1 - i, w)));
    const careWord = care ? evaluateWords(care, env) & valid[w] : valid[w];
    for (const s of steps) env.set(s.name, evaluateWords(s.fn, env));
    out.on[w] = env.get(output)! & careWord;
    out.dc[w] = ~careWord & valid[w];
  }
  return { inputs: [...inputs], outputs: [out] };
}

/** Word `w` of the input whose minterm bit is `bit`: a fixed pattern below bit 5, else all 0 or all 1. */
function inputWord(bit: number, w: number): number {
  if (bit >= 5) return ((w * 32) >> bit) & 1 ? -1 : 0;
  let x = 0;
  for (let b = 0; b < 32; b++) if ((b >> bit) & 1) x |= 1 << b;
  return x | 0;
}
