// Helpers shared by the extraction tests: compare a node's function with an expected one by truth
// table, and find a node by name with a message that lists what was extracted.
import { evaluate, support, type Expr } from '../logic/expr';
import { parseExpr } from '../logic/expr-parse';
import type { LogicView } from './types';

/** Same truth table over the union of the supports (a wrong function fails on some row). */
export function sameFunction(got: Expr, want: string): boolean {
  const w = parseExpr(want);
  const vars = [...new Set([...support(got), ...support(w)])];
  for (let m = 0; m < 1 << vars.length; m++) {
    const env = Object.fromEntries(vars.map((n, i) => [n, ((m >> i) & 1) as 0 | 1]));
    if (evaluate(got, env) !== evaluate(w, env)) return false;
  }
  return true;
}

export function nodeNamed(view: LogicView, name: string) {
  const n = view.nodes.find((x) => x.name === name);
  if (!n) throw new Error(`no node ${name}; have ${view.nodes.map((x) => x.name).join(', ')}`);
  return n;
}
