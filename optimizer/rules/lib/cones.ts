// Maximal fanout-free cones of the logic view: a root (a net read by several gates, by none, or by
// something not plain combinational) with every static node that feeds only into it. Replacing a
// cone changes nothing but its root, which is what a local re-synthesis needs.
import type { LogicNode, LogicView } from '../../extract/types';
import { substitute, support, v, type Expr } from '../../logic/expr';

export interface Cone {
  root: LogicNode;
  /** Nodes of the cone, root first (pre-order: every node before the nodes feeding it). */
  nodes: LogicNode[];
  /** Names of the nets the cone reads from outside (primary inputs, other roots, state bits). */
  leaves: string[];
  /** The root's function over the leaves (composed on first read: a long chain is never composed unless asked for). */
  readonly fn: Expr;
  /** Devices of the cone's nodes (indices into the netlist). */
  devices: number[];
}

const combinational = (n: LogicNode) => n.kind === 'static';

/** Readers of each driven net by name (node indices; a node reading a net twice is listed twice). */
export function readersOf(view: LogicView): Map<string, number[]> {
  const readers = new Map<string, number[]>();
  view.nodes.forEach((n, i) => {
    for (const x of n.inputs) {
      const r = readers.get(x);
      if (r) r.push(i);
      else readers.set(x, [i]);
    }
  });
  return readers;
}

/**
 * Every cone with at least `minLeaves` and at most `maxLeaves` leaves whose nodes own their devices
 * alone. `protectedNets` (ports, nets with readers outside the logic view) are always roots.
 * Linear in the view: a node that is not a root has exactly one reader, so it is walked inside
 * exactly one cone.
 */
export function fanoutFreeCones(
  view: LogicView,
  maxLeaves: number,
  protectedNets: ReadonlySet<string> = new Set(),
  readers: ReadonlyMap<string, readonly number[]> = readersOf(view),
  minLeaves = 0,
): Cone[] {
  const nodes = view.nodes;
  // Last node of a name wins, as a name → node map built in view order would have it.
  const byName = new Map<string, number>();
  nodes.forEach((n, i) => byName.set(n.name, i));
  const state = new Set(view.stateBits);
  const root = new Uint8Array(nodes.length);
  nodes.forEach((n, i) => {
    if (!combinational(n) || state.has(n.name) || protectedNets.has(n.name)) root[i] = 1;
    else {
      const r = readers.get(n.name) ?? [];
      root[i] = r.length !== 1 || !combinational(nodes[r[0]]) ? 1 : 0;
    }
  });
  // How many times each device is listed by any node (a device two nodes list is shared).
  let maxDevice = -1;
  for (const n of nodes) for (const d of n.devices) if (d > maxDevice) maxDevice = d;
  const owners = new Int32Array(maxDevice + 1);
  for (const n of nodes) for (const d of n.devices) owners[d]++;
  // Per cone: how many of its nodes list each device (`stamp` marks a node's devices counted once).
  const inCone = new Int32Array(maxDevice + 1);
  const stamp = new Int32Array(maxDevice + 1).fill(-1);

  const cones: Cone[] = [];
  let mark = 0;
  const seen = new Uint8Array(nodes.length);
  nodes.forEach((top, i) => {
    if (!combinational(top) || !root[i]) return;
    const walked = coneFrom(i, nodes, byName, root, seen, maxLeaves);
    if (!walked || walked.leaves.size < minLeaves) return;
    const devices: number[] = [];
    for (const n of walked.nodes) {
      mark++;
      for (const d of n.devices) {
        if (stamp[d] === mark) continue;
        stamp[d] = mark;
        if (inCone[d]++ === 0) devices.push(d);
      }
    }
    // A device is the cone's to remove only if every node listing it is inside the cone.
    let own = true;
    for (const d of devices) {
      if (inCone[d] !== owners[d]) own = false;
      inCone[d] = 0;
    }
    if (own) cones.push(makeCone(top, walked.nodes, [...walked.leaves].sort(), devices));
  });
  return cones;
}

/** A cone whose function is composed the first time it is read, then kept. */
function makeCone(root: LogicNode, nodes: LogicNode[], leaves: string[], devices: number[]): Cone {
  let fn: Expr | undefined;
  return {
    root,
    nodes,
    leaves,
    devices,
    get fn() {
      fn ??= composeCone(root, nodes);
      return fn;
    },
  };
}

/**
 * The root's function over the leaves, composed node by node from the end of the pre-order (each
 * node after the nodes feeding it), so no recursion follows the chain. A net read before its value
 * is known (an uncut loop through the root) stays a variable where it is read.
 */
export function composeCone(root: LogicNode, nodes: readonly LogicNode[]): Expr {
  const memo = new Map<string, Expr>();
  for (let k = nodes.length - 1; k >= 0; k--) {
    const node = nodes[k];
    memo.set(node.name, substitute(node.fn, (x) => memo.get(x) ?? v(x)));
  }
  return memo.get(root.name) ?? v(root.name);
}

/**
 * The cone under the root at `start` (pre-order nodes, leaves), walked with an explicit stack so a
 * long single-reader chain costs heap rather than call depth; gives up as soon as the leaves pass
 * `maxLeaves`.
 */
function coneFrom(
  start: number,
  nodes: readonly LogicNode[],
  byName: ReadonlyMap<string, number>,
  root: Uint8Array,
  walked: Uint8Array,
  maxLeaves: number,
): { nodes: LogicNode[]; leaves: Set<string> } | undefined {
  const inside: LogicNode[] = [];
  const leaves = new Set<string>();
  const stack: string[] = [nodes[start].name];
  // One support set and one list reused for every node (a set per node is most of the garbage).
  const fanIn = new Set<string>();
  const deps: string[] = [];
  while (stack.length) {
    const name = stack.pop()!;
    const i = byName.get(name);
    if (i === undefined || (i !== start && root[i])) {
      leaves.add(name);
      if (leaves.size > maxLeaves) return undefined;
      continue;
    }
    // A node is walked once over all cones: it has one reader, so only this cone reaches it
    // (and a second visit is an uncut loop back to the root).
    if (walked[i]) continue;
    walked[i] = 1;
    inside.push(nodes[i]);
    fanIn.clear();
    support(nodes[i].fn, fanIn);
    deps.length = 0;
    for (const x of fanIn) deps.push(x);
    for (let k = deps.length - 1; k >= 0; k--) stack.push(deps[k]);
  }
  return { nodes: inside, leaves };
}
