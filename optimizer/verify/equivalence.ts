// Combinational equivalence of two sets of output functions under assumptions. Random vectors
// first (a quick filter), exhaustive bit-parallel evaluation up to ~16 inputs, SAT beyond: a miter
// (Goldberg, Prasad, Brayton, DATE 2001) in Tseitin CNF (Tseitin 1968) conjoined with the
// assumptions, solved by logic-solver (MiniSat). Pure and synchronous: callers that must not block
// run it in a worker thread. Every counterexample is re-simulated on both sides before it is returned.
import Logic from 'logic-solver';
import { InputError, InternalError } from '../errors';
import { and, evaluate, support, TRUE, type Expr } from '../logic/expr';

export interface Assumption {
  /** How a reviewer knows it: a name or the expression text. */
  name: string;
  expr: Expr;
}

export type EquivMethod = 'random' | 'exhaustive' | 'sat';

export type EquivResult =
  | { verdict: 'proved'; method: EquivMethod; assumptionsUsed: string[]; inputs: string[] }
  | {
      verdict: 'refuted';
      method: EquivMethod;
      counterexample: Record<string, 0 | 1>;
      outputs: { name: string; before: 0 | 1; after: 0 | 1 }[];
      inputs: string[];
    };

export interface EquivOptions {
  assumptions?: Assumption[];
  /** Largest input count proved by exhaustion (default 16). */
  exhaustiveLimit?: number;
  /** Random 32-vector words tried first (default 8 → 256 vectors). */
  randomWords?: number;
  seed?: number;
  /** Find the smallest set of assumptions the proof needs (default true). */
  minimiseAssumptions?: boolean;
}

/** Bit-parallel evaluation with a memo, so shared sub-expressions (DAGs) are computed once. */
function wordEval(e: Expr, words: Map<string, number>, memo: Map<Expr, number>): number {
  const hit = memo.get(e);
  if (hit !== undefined) return hit;
  let r: number;
  switch (e.op) {
    case 'const':
      r = e.value ? -1 : 0;
      break;
    case 'var':
      r = words.get(e.name) ?? 0;
      break;
    case 'not':
      r = ~wordEval(e.arg, words, memo);
      break;
    case 'and':
      r = -1;
      for (const a of e.args) r &= wordEval(a, words, memo);
      break;
    case 'or':
      r = 0;
      for (const a of e.args) r |= wordEval(a, words, memo);
      break;
    case 'xor':
      r = 0;
      for (const a of e.args) r ^= wordEval(a, words, memo);
      break;
    case 'implies':
      r = ~wordEval(e.left, words, memo) | wordEval(e.right, words, memo);
      break;
    case 'iff':
      r = ~(wordEval(e.left, words, memo) ^ wordEval(e.right, words, memo));
      break;
  }
  memo.set(e, r | 0);
  return r | 0;
}

/** mulberry32: small, seedable, good enough for test vectors. */
function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return (t ^ (t >>> 14)) >>> 0;
  };
}

interface Problem {
  names: string[];
  before: Expr[];
  after: Expr[];
  inputs: string[];
}

/** A word with bit set where some output differs and the assumption holds; -1 lanes used. */
function missWord(p: Problem, assume: Expr, words: Map<string, number>): number {
  const memo = new Map<Expr, number>();
  let diff = 0;
  for (let i = 0; i < p.names.length; i++) diff |= wordEval(p.before[i], words, memo) ^ wordEval(p.after[i], words, memo);
  return diff & wordEval(assume, words, memo);
}

function vectorFrom(words: Map<string, number>, inputs: string[], bit: number): Record<string, 0 | 1> {
  return Object.fromEntries(inputs.map((n) => [n, (((words.get(n) ?? 0) >>> bit) & 1) as 0 | 1]));
}

const PATTERNS = [0xaaaaaaaa, 0xcccccccc, 0xf0f0f0f0, 0xff00ff00, 0xffff0000].map((x) => x | 0);

/** Searches every input vector; returns a counterexample or undefined. */
function exhaustive(p: Problem, assume: Expr): Record<string, 0 | 1> | undefined {
  const n = p.inputs.length;
  const low = Math.min(n, 5);
  const lane = low === 5 ? -1 : (1 << (1 << low)) - 1;
  const words = new Map<string, number>();
  p.inputs.slice(0, low).forEach((name, i) => words.set(name, PATTERNS[i]));
  for (let hi = 0; hi < 2 ** (n - low); hi++) {
    p.inputs.slice(low).forEach((name, i) => words.set(name, Math.floor(hi / 2 ** i) % 2 ? -1 : 0));
    const miss = missWord(p, assume, words) & lane;
    if (miss) return vectorFrom(words, p.inputs, 31 - Math.clz32(miss & -miss));
  }
  return undefined;
}

function randomSearch(p: Problem, assume: Expr, count: number, seed: number): Record<string, 0 | 1> | undefined {
  const next = rng(seed);
  const words = new Map<string, number>();
  for (let k = 0; k < count; k++) {
    for (const name of p.inputs) words.set(name, next() | 0);
    const miss = missWord(p, assume, words);
    if (miss) return vectorFrom(words, p.inputs, 31 - Math.clz32(miss & -miss));
  }
  return undefined;
}

/** Tseitin encoding: one solver variable per distinct sub-expression, clauses tie it to its operands. */
class Tseitin {
  readonly solver = new Logic.Solver();
  private readonly memo = new Map<Expr, string>();
  private count = 0;
  input(name: string): string {
    return `i${name.length}:${name}`;
  }
  lit(e: Expr): string {
    const hit = this.memo.get(e);
    if (hit) return hit;
    const s = this.solver;
    let t: string;
    if (e.op === 'var') t = this.input(e.name);
    else {
      t = `t${++this.count}`;
      switch (e.op) {
        case 'const':
          s.require(e.value ? t : Logic.not(t));
          break;
        case 'not': {
          const a = this.lit(e.arg);
          s.require(Logic.or(Logic.not(t), Logic.not(a)), Logic.or(t, a));
          break;
        }
        case 'and': {
          const as = e.args.map((x) => this.lit(x));
          for (const a of as) s.require(Logic.or(Logic.not(t), a));
          s.require(Logic.or(t, ...as.map((a) => Logic.not(a))));
          break;
        }
        case 'or': {
          const as = e.args.map((x) => this.lit(x));
          for (const a of as) s.require(Logic.or(t, Logic.not(a)));
          s.require(Logic.or(Logic.not(t), ...as));
          break;
        }
        case 'xor':
        case 'iff':
        case 'implies': {
          const pair = (a: string, b: string, op: 'xor' | 'iff' | 'implies') => {
            const r = `t${++this.count}`;
            if (op === 'implies') {
              s.require(Logic.or(Logic.not(r), Logic.not(a), b), Logic.or(r, a), Logic.or(r, Logic.not(b)));
            } else {
              const x = op === 'xor' ? r : Logic.not(r);
              s.require(
                Logic.or(Logic.not(x), a, b),
                Logic.or(Logic.not(x), Logic.not(a), Logic.not(b)),
                Logic.or(x, Logic.not(a), b),
                Logic.or(x, a, Logic.not(b)),
              );
            }
            return r;
          };
          if (e.op === 'xor') {
            const as = e.args.map((x) => this.lit(x));
            let acc = as[0];
            for (const a of as.slice(1)) acc = pair(acc, a, 'xor');
            if (as.length === 1) acc = pair(acc, this.lit({ op: 'const', value: 0 }), 'xor');
            t = acc;
          } else t = pair(this.lit(e.left), this.lit(e.right), e.op);
          break;
        }
      }
    }
    this.memo.set(e, t);
    return t;
  }
}

function satSearch(p: Problem, assume: Expr): Record<string, 0 | 1> | undefined {
  const ts = new Tseitin();
  const diffs = p.names.map((_, i) => ts.lit({ op: 'xor', args: [p.before[i], p.after[i]] }));
  ts.solver.require(Logic.or(...diffs));
  ts.solver.require(ts.lit(assume));
  const sol = ts.solver.solve();
  if (!sol) return undefined;
  const map = sol.getMap() as Record<string, boolean>;
  return Object.fromEntries(p.inputs.map((n) => [n, map[ts.input(n)] ? 1 : 0])) as Record<string, 0 | 1>;
}

/**
 * Are `before` and `after` (output name → function over input names) equal wherever every
 * assumption holds? Both sides must name the same outputs.
 */
export function checkEquivalence(
  before: Record<string, Expr>,
  after: Record<string, Expr>,
  options: EquivOptions = {},
): EquivResult {
  const names = Object.keys(before).sort();
  const missing = [...names.filter((n) => !(n in after)), ...Object.keys(after).filter((n) => !(n in before))];
  if (missing.length) {
    throw InputError.at('equiv.outputs', `outputs not on both sides: ${missing.slice(0, 10).join(', ')}`);
  }
  const assumptions = options.assumptions ?? [];
  const inputSet = new Set<string>();
  for (const n of names) {
    support(before[n], inputSet);
    support(after[n], inputSet);
  }
  for (const a of assumptions) support(a.expr, inputSet);
  const p: Problem = { names, before: names.map((n) => before[n]), after: names.map((n) => after[n]), inputs: [...inputSet].sort() };
  const limit = options.exhaustiveLimit ?? 16;
  const search = (assume: Expr): { cex?: Record<string, 0 | 1>; method: EquivMethod } => {
    const quick = randomSearch(p, assume, options.randomWords ?? 8, options.seed ?? 0x5eed);
    if (quick) return { cex: quick, method: 'random' };
    if (p.inputs.length <= limit) return { cex: exhaustive(p, assume), method: 'exhaustive' };
    return { cex: satSearch(p, assume), method: 'sat' };
  };
  const all = and(...assumptions.map((a) => a.expr));
  const { cex, method } = search(all);
  if (cex) {
    const outputs = names
      .map((name, i) => ({ name, before: evaluate(p.before[i], cex), after: evaluate(p.after[i], cex) }))
      .filter((o) => o.before !== o.after);
    // re-simulation on both sides: a counterexample that does not distinguish them is our bug
    if (outputs.length === 0 || evaluate(all, cex) !== 1) {
      throw new InternalError(`equivalence (${method}) produced a counterexample that does not distinguish the designs`);
    }
    return { verdict: 'refuted', method, counterexample: cex, outputs, inputs: p.inputs };
  }
  // Which assumptions the proof relies on: drop each in turn while the proof still holds.
  let used = assumptions;
  if ((options.minimiseAssumptions ?? true) && assumptions.length > 0 && assumptions.length <= 8) {
    for (const a of assumptions) {
      const rest = used.filter((x) => x !== a);
      if (!search(rest.length ? and(...rest.map((x) => x.expr)) : TRUE).cex) used = rest;
    }
  }
  return { verdict: 'proved', method, assumptionsUsed: used.map((a) => a.name), inputs: p.inputs };
}
