// Proof of a design-wide edit by cut points: each changed net is composed back only through the
// nodes the edit can change, down to nets it cannot (the same function of the same nets before and
// after); every changed net is then a small problem of its own, and problems of one canonical form
// (a bit slice repeated) are proved once. Only a proof counts: a failed cut proof says nothing.
import { combinationalModel, ENABLE_SUFFIX } from '../extract/compose';
import { editedNodes, type EditShape } from '../extract/incremental';
import type { LogicNode, LogicView } from '../extract/types';
import { and, exprToString, support, v, type Expr } from '../logic/expr';
import type { FlatNetlist } from '../netlist/ir';
import { checkEquivalence, type EquivMethod } from '../verify/equivalence';

export interface CutProof {
  /** The changed nets compared, as the whole-design proof picks them. */
  compared: string[];
  /** The whole-design proof's method: exhaustive while its inputs fit the limit, SAT beyond. */
  method: EquivMethod;
  /** Problems solved (one per canonical form) and the outputs they stood for. */
  problems: number;
  outputs: number;
}

export type CutOutcome =
  | { proved: CutProof }
  | { proved?: undefined; reason: string; output?: string; counterexample?: Record<string, 0 | 1> };

export interface CutOptions {
  /** The whole-design proof's exhaustive limit (default 16, as checkEquivalence's). */
  exhaustiveLimit?: number;
  /** Variables the assumptions read: the whole-design proof counts them among its inputs. */
  assumptionInputs?: ReadonlySet<string>;
}

const readCache = new WeakMap<LogicView, Map<string, number>>();
const nameCache = new WeakMap<LogicView, Map<string, number>>();

/** How many nodes read each net name (built once per frozen view). */
function readCounts(view: LogicView): Map<string, number> {
  let m = readCache.get(view);
  if (m) return m;
  m = new Map();
  for (const n of view.nodes) for (const x of n.inputs) m.set(x, (m.get(x) ?? 0) + 1);
  if (Object.isFrozen(view.nodes)) readCache.set(view, m);
  return m;
}

function nodeIndex(view: LogicView): Map<string, number> {
  let m = nameCache.get(view);
  if (m) return m;
  m = new Map(view.nodes.map((n, i) => [n.name, i]));
  if (Object.isFrozen(view.nodes)) nameCache.set(view, m);
  return m;
}

const same = (a: LogicNode, b: LogicNode) =>
  a.kind === b.kind && exprToString(a.fn) === exprToString(b.fn) && (a.enable ? exprToString(a.enable) : '') === (b.enable ? exprToString(b.enable) : '');

/** A view of some nodes only: composing through it stops at every net it does not drive. */
const partial = (nodes: LogicNode[]): LogicView => ({ nodes, stateBits: [], inputs: [] }) as unknown as LogicView;

/**
 * The pair's text with variables numbered by first appearance: equal keys are the same problem
 * under a renaming of variables. Undefined past `budget` characters (a DAG printed as a tree).
 */
export function canonicalPair(before: Expr, after: Expr, budget = 4000): string | undefined {
  const ids = new Map<string, number>();
  const parts: string[] = [];
  let size = 0;
  const walk = (e: Expr): boolean => {
    if (++size > budget) return false;
    switch (e.op) {
      case 'const':
        parts.push(String(e.value));
        return true;
      case 'var': {
        let k = ids.get(e.name);
        if (k === undefined) ids.set(e.name, (k = ids.size));
        parts.push('#' + k);
        return true;
      }
      case 'not':
        parts.push('!');
        return walk(e.arg);
      case 'and':
      case 'or':
      case 'xor':
        parts.push(e.op, '(');
        for (const a of e.args) if (!walk(a)) return false;
        parts.push(')');
        return true;
      case 'implies':
      case 'iff':
        parts.push(e.op, '(');
        if (!walk(e.left) || !walk(e.right)) return false;
        parts.push(')');
        return true;
    }
  };
  if (!walk(before)) return undefined;
  parts.push('=');
  return walk(after) ? parts.join(' ') : undefined;
}

/**
 * @param before the unedited design and its (whole) view
 * @param after `applyProposals(before.nl, [proposal], { share: true })`
 * @param changed the nets the edit changes, sorted (as the scan finds them)
 * @returns proved, or why the cut could not decide (the caller then proves the whole design)
 */
export function cutProof(before: { nl: FlatNetlist; view: LogicView }, after: FlatNetlist, edit: EditShape, changed: string[], options: CutOptions = {}): CutOutcome {
  const { nl, view } = before;
  // A loop cut at a state bit may close through the edit: such designs take the whole proof.
  if (view.stateBits.length) return { reason: 'the design has state bits' };
  // Only the functions are read here: the nodes keep the cut's device numbering.
  const edited = editedNodes(before, after, edit, Infinity, false);
  if (!edited) return { reason: 'the edited design does not keep the net ids' };
  const { dirty } = edited;
  const afterByNet = new Map<number, LogicNode>();
  const afterByName = new Map<string, LogicNode>();
  for (const n of edited.nodes) {
    afterByNet.set(n.net, n);
    afterByName.set(n.name, n);
  }
  const kept = (id: number | undefined) => {
    const i = id === undefined ? undefined : view.nodeByNet.get(id);
    return i !== undefined && !dirty[i];
  };
  const drivenAfter = (id: number | undefined) => id !== undefined && (afterByNet.has(id) || kept(id));
  // Readers: a kept node reads the same names after the edit; the changed ones read anew.
  const reads = readCounts(view);
  const dirtyReads = new Map<string, number>();
  const expandedBefore: LogicNode[] = [];
  const expandedNames = new Set<string>();
  view.nodes.forEach((n, i) => {
    if (!dirty[i]) return;
    expandedBefore.push(n);
    expandedNames.add(n.name);
    for (const x of n.inputs) dirtyReads.set(x, (dirtyReads.get(x) ?? 0) + 1);
  });
  const keptReads = (name: string) => (reads.get(name) ?? 0) - (dirtyReads.get(name) ?? 0);
  const afterReads = new Map<string, number>();
  for (const n of edited.nodes) for (const x of n.inputs) afterReads.set(x, (afterReads.get(x) ?? 0) + 1);
  const readAfter = (name: string | undefined) => name !== undefined && (keptReads(name) > 0 || afterReads.has(name));

  // The nets compared, exactly as the whole-design proof chooses them.
  // (A net merged away still names the kept net, which carries its loads now.)
  const mergedAway = new Set(edit.mergeNets.filter((m) => after.netByName.has(m.remove)).map((m) => m.remove));
  const compared: string[] = [];
  for (const n of changed) {
    const id = nl.netByName.get(n);
    if (id === undefined || !view.nodeByNet.has(id)) continue;
    const aid = after.netByName.get(n);
    if (mergedAway.has(n) || drivenAfter(aid) || readAfter(after.nets[aid ?? 0]?.name)) compared.push(n);
  }
  if (compared.length === 0) return { reason: 'nothing to compare' };
  const bNames = compared.map((n) => nl.nets[nl.netByName.get(n)!].name);
  const aNames = compared.map((n) => after.nets[after.netByName.get(n)!].name);
  const comparedNames = new Set([...bNames, ...aNames]);
  const index = nodeIndex(view);
  for (const name of bNames) {
    if (expandedNames.has(name)) continue;
    // A changed net the extraction did not mark: compose through it too.
    const i = index.get(name)!;
    expandedBefore.push(view.nodes[i]);
    expandedNames.add(name);
  }
  for (let k = 0; k < compared.length; k++) {
    // A net merged away keeps its name on nothing after the edit: a kept reader would read a free net.
    if (bNames[k] !== aNames[k] && keptReads(bNames[k]) > 0) return { reason: `${bNames[k]} is merged away but still read` };
    const aid = after.netByName.get(compared[k])!;
    if (kept(aid) && !afterByNet.has(aid)) return { reason: `${aNames[k]} is driven by a node the edit keeps` };
  }
  // Every other net the edit can change must keep its function, or be read by nothing at all.
  const check = (name: string, b: LogicNode | undefined, a: LogicNode | undefined): string | undefined => {
    if (comparedNames.has(name) || (b && a && same(b, a))) return undefined;
    return (reads.get(name) ?? 0) + (afterReads.get(name) ?? 0) > 0 ? `${name} changes but is not compared` : undefined;
  };
  for (const b of expandedBefore) {
    if (b.kind === 'latch') return { reason: `${b.name} is a latch` };
    const bad = check(b.name, b, afterByName.get(b.name));
    if (bad) return { reason: bad };
  }
  for (const a of edited.nodes) {
    if (a.kind === 'latch') return { reason: `${a.name} is a latch` };
    const i = index.get(a.name);
    const bad = check(a.name, i !== undefined && dirty[i] ? view.nodes[i] : undefined, a);
    if (bad) return { reason: bad };
  }

  const method = wholeMethod(view, dirty, index, afterByName, { before: bNames, after: aNames }, options);
  if (!method) return { reason: 'the whole proof would have too many inputs to say its method' };

  // Each compared net as a function of cut points, with problemOf's tri-state treatment.
  const bModel = combinationalModel(partial(expandedBefore), bNames);
  const aModel = combinationalModel(
    partial(edited.nodes),
    aNames.filter((n) => afterByName.has(n)),
  );
  const outputs: { name: string; before: Expr; after: Expr }[] = [];
  compared.forEach((name, k) => {
    const b = bModel.outputs[bNames[k]];
    const a = aModel.outputs[aNames[k]] ?? v(aNames[k]);
    const enBefore = bModel.outputs[bNames[k] + ENABLE_SUFFIX];
    if (!enBefore) {
      outputs.push({ name, before: b, after: a });
      return;
    }
    outputs.push({ name, before: and(enBefore, b), after: and(enBefore, a) });
    const enAfter = aModel.outputs[aNames[k] + ENABLE_SUFFIX];
    if (enAfter) outputs.push({ name: name + ENABLE_SUFFIX, before: enBefore, after: and(enBefore, enAfter) });
  });
  // A variable must be a cut point: a net still composed on its side means a loop was left open.
  const afterNames = new Set(edited.nodes.map((n) => n.name));
  const proved = new Set<string>();
  let problems = 0;
  for (const o of outputs) {
    for (const x of support(o.before)) if (expandedNames.has(x)) return { reason: `${x} stays a variable before the edit` };
    for (const x of support(o.after)) if (afterNames.has(x)) return { reason: `${x} stays a variable after the edit` };
    const key = canonicalPair(o.before, o.after);
    if (key !== undefined && proved.has(key)) continue;
    problems++;
    const r = checkEquivalence({ [o.name]: o.before }, { [o.name]: o.after }, { minimiseAssumptions: false });
    if (r.verdict === 'refuted') return { reason: 'a cut problem differs', output: o.name, counterexample: r.counterexample };
    if (key !== undefined) proved.add(key);
  }
  return { proved: { compared, method, problems, outputs: outputs.length } };
}

/**
 * The method the whole-design proof reports when it proves: exhaustive while its inputs (the
 * variables its composed functions read, and the assumptions') fit the limit. Counted as the nets
 * the compared nets' fan-in reaches without a driver, on either side: a superset of those inputs.
 * Undefined when that superset is too large to tell.
 */
function wholeMethod(
  view: LogicView,
  dirty: Uint8Array,
  index: Map<string, number>,
  afterByName: Map<string, LogicNode>,
  roots: { before: string[]; after: string[] },
  options: CutOptions,
): EquivMethod | undefined {
  const limit = options.exhaustiveLimit ?? 16;
  const leaves = new Set<string>(options.assumptionInputs ?? []);
  for (const side of ['before', 'after'] as const) {
    const seenNode = new Uint8Array(view.nodes.length);
    const seenOther = new Set<string>();
    const stack = [...roots[side]];
    while (stack.length) {
      const name = stack.pop()!;
      const i = index.get(name);
      let node: LogicNode | undefined;
      if (i !== undefined && (side === 'before' || !dirty[i])) {
        if (seenNode[i]) continue;
        seenNode[i] = 1;
        node = view.nodes[i];
      } else {
        if (seenOther.has(name)) continue;
        seenOther.add(name);
        node = side === 'after' ? afterByName.get(name) : undefined;
      }
      if (!node) {
        leaves.add(name);
        if (leaves.size > limit) return undefined;
        continue;
      }
      for (const x of node.inputs) stack.push(x);
    }
  }
  return 'exhaustive';
}
