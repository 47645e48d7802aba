// Nets the stated assumptions hold at a constant ("TEST is always 0"), with the assumptions each
// constant needs — proved with the equivalence checker (a net against a constant), not guessed.
import { c, FALSE, support, TRUE, v } from '../../logic/expr';
import { checkEquivalence } from '../../verify/equivalence';
import type { Assumption } from '../types';

export interface FixedValue {
  value: 0 | 1;
  /** Ids of the assumptions that fix it (empty for a rail). */
  assumptions: string[];
}

/** Largest number of variables the assumptions may mention before the search is skipped. */
const MAX_VARS = 64;

export function fixedByAssumptions(assumptions: readonly Assumption[]): Map<string, FixedValue> {
  const out = new Map<string, FixedValue>();
  if (assumptions.length === 0) return out;
  const named = assumptions.map((a) => ({ name: a.id, expr: a.expr }));
  // Contradictory assumptions would make every net "constant": refuse to read anything into them.
  const unsat = checkEquivalence({ x: FALSE }, { x: TRUE }, { assumptions: named, minimiseAssumptions: false });
  if (unsat.verdict === 'proved') return out;
  const vars = new Set<string>();
  for (const a of assumptions) support(a.expr, vars);
  if (vars.size > MAX_VARS) return out;
  for (const name of [...vars].sort()) {
    for (const value of [0, 1] as const) {
      const r = checkEquivalence({ [name]: v(name) }, { [name]: c(value) }, { assumptions: named });
      if (r.verdict === 'proved') {
        out.set(name, { value, assumptions: r.assumptionsUsed });
        break;
      }
    }
  }
  return out;
}
