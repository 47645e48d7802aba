// Functions of chosen nets over the design's primary inputs and state bits: each driven net's
// local function is substituted into its readers (memoised, so shared logic stays shared). State
// bits are cut: a latch net is a pseudo input (its value) and a pseudo output `<net>@next`.
import { substitute, support, v, type Expr } from '../logic/expr';
import type { LogicNode, LogicView } from './types';

export const NEXT_SUFFIX = '@next';
/** Suffix of the pseudo output that says when a tri-state or pass net is driven. */
export const ENABLE_SUFFIX = '@en';

export interface CombinationalModel {
  /** Primary inputs and state bits, by name. */
  inputs: string[];
  /** Output name → function over `inputs`. */
  outputs: Record<string, Expr>;
}

/**
 * @param outputs nets to express; by default every driven net nothing else reads, plus every
 *   state bit's next state. Tri-state/pass nets also get `<net>@en`.
 */
const byNameCache = new WeakMap<LogicView, Map<string, LogicNode>>();

/** Nodes by net name; kept for a frozen view (a scan's, asked for models many times), which cannot change. */
function nodesByName(view: LogicView): Map<string, LogicNode> {
  if (!Object.isFrozen(view.nodes)) return new Map(view.nodes.map((n) => [n.name, n]));
  let m = byNameCache.get(view);
  if (!m) {
    m = new Map(view.nodes.map((n) => [n.name, n]));
    byNameCache.set(view, m);
  }
  return m;
}

export function combinationalModel(view: LogicView, outputs?: string[]): CombinationalModel {
  const byName = nodesByName(view);
  const state = new Set(view.stateBits);
  const memo = new Map<string, Expr>();
  const resolving = new Set<string>();
  // Fan-in is resolved with an explicit stack (post-order), so a long ripple chain costs heap,
  // not call depth: every substitution below only looks up nets already memoised.
  const valueOf = (root: string): Expr => {
    const stack: { name: string; expanded: boolean }[] = [{ name: root, expanded: false }];
    while (stack.length) {
      const { name, expanded } = stack.pop()!;
      if (memo.has(name)) continue;
      const node = byName.get(name);
      if (!node || state.has(name)) {
        memo.set(name, v(name));
        continue;
      }
      if (expanded) {
        resolving.delete(name);
        // A net still resolving is a loop the extractor did not cut: it stays a variable.
        memo.set(name, substitute(node.fn, (n) => memo.get(n) ?? v(n)));
        continue;
      }
      if (resolving.has(name)) continue;
      resolving.add(name);
      stack.push({ name, expanded: true });
      for (const dep of support(node.fn)) if (!memo.has(dep) && !resolving.has(dep)) stack.push({ name: dep, expanded: false });
    }
    return memo.get(root) ?? v(root);
  };
  let names = outputs;
  if (!names) {
    const read = new Set(view.nodes.flatMap((n) => n.inputs));
    names = view.nodes.filter((n) => !read.has(n.name) && !state.has(n.name)).map((n) => n.name);
  }
  const out: Record<string, Expr> = {};
  for (const name of names) {
    const node = byName.get(name);
    if (state.has(name) || (node && node.kind === 'latch')) {
      out[name + NEXT_SUFFIX] = substitute(node!.fn, (n) => valueOf(n));
      continue;
    }
    out[name] = valueOf(name);
    if (node?.enable) out[name + ENABLE_SUFFIX] = substitute(node.enable, (n) => valueOf(n));
  }
  if (!outputs) {
    for (const s of view.stateBits) {
      const node = byName.get(s)!;
      out[s + NEXT_SUFFIX] = substitute(node.fn, (n) => valueOf(n));
    }
  }
  const inputs = new Set<string>([...view.inputs, ...view.stateBits]);
  return { inputs: [...inputs], outputs: out };
}
