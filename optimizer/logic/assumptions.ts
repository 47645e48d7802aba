// A design's operating assumptions ("clear and load are never active together"): each one parsed
// with its own location name, their conjunction, and a check that together they can hold at all
// (contradictory assumptions would let any rewrite "prove", so they are refused).
import { InputError } from '../errors';
import { and, FALSE, support, type Expr } from './expr';
import { parseExpr } from './expr-parse';
import { checkEquivalence, type Assumption } from '../verify/equivalence';

export interface AssumptionSource {
  /** How reviewers know it (a short name); defaults to the expression text. */
  name?: string;
  text: string;
}

/** Parses each assumption; errors are located as "assumption N:line:col". */
export function parseAssumptions(list: AssumptionSource[]): Assumption[] {
  const problems: InputError[] = [];
  const out: Assumption[] = [];
  list.forEach((a, i) => {
    try {
      out.push({ name: a.name?.trim() || a.text.trim(), expr: parseExpr(a.text, `assumption ${i + 1}`) });
    } catch (e) {
      if (e instanceof InputError) problems.push(e);
      else throw e;
    }
  });
  if (problems.length) throw new InputError(problems.flatMap((p) => p.diagnostics));
  return out;
}

export function conjunction(list: Assumption[]): Expr {
  return and(...list.map((a) => a.expr));
}

/** Net names the assumptions mention, for checking them against a design's nets. */
export function assumptionNets(list: Assumption[]): string[] {
  const s = new Set<string>();
  for (const a of list) support(a.expr, s);
  return [...s].sort();
}

/**
 * Throws when the assumptions cannot all hold together; otherwise returns one assignment under
 * which they do (a witness a reviewer can read).
 */
export function witnessAssumptions(list: Assumption[]): Record<string, 0 | 1> {
  if (list.length === 0) return {};
  const all = conjunction(list);
  // "all ≡ 0" is refuted exactly when some assignment makes every assumption true
  const r = checkEquivalence({ holds: all }, { holds: FALSE }, { minimiseAssumptions: false });
  if (r.verdict === 'proved') {
    throw InputError.at('assumption.contradiction', `the assumptions contradict each other (${list.map((a) => `"${a.name}"`).join(', ')}): no input satisfies all of them`);
  }
  return r.counterexample;
}
