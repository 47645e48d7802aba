// Maximal fanout-free cones of the logic view: a root (a net read by several gates, by none, or by
// something not plain combinational) with every static node that feeds only into it. Replacing a
// cone changes nothing but its root, which is what a local re-synthesis needs.
import type { LogicNode, LogicView } from '../../extract/types';
import { substitute, support, v, type Expr } from '../../logic/expr';

export interface Cone {
  root: LogicNode;
  /** Nodes of the cone, root first. */
  nodes: LogicNode[];
  /** Names of the nets the cone reads from outside (primary inputs, other roots, state bits). */
  leaves: string[];
  /** The root's function over the leaves. */
  fn: Expr;
  /** Devices of the cone's nodes (indices into the netlist). */
  devices: number[];
}

const combinational = (n: LogicNode) => n.kind === 'static';

/** Readers of each driven net by name (node indices). */
export function readersOf(view: LogicView): Map<string, number[]> {
  const readers = new Map<string, number[]>();
  view.nodes.forEach((n, i) => {
    for (const x of n.inputs) readers.set(x, [...(readers.get(x) ?? []), i]);
  });
  return readers;
}

/**
 * Every cone with at most `maxLeaves` leaves whose nodes own their devices alone. `protectedNets`
 * (ports, nets with readers outside the logic view) are always roots.
 */
export function fanoutFreeCones(view: LogicView, maxLeaves: number, protectedNets: ReadonlySet<string> = new Set()): Cone[] {
  const byName = new Map(view.nodes.map((n) => [n.name, n]));
  const readers = readersOf(view);
  const state = new Set(view.stateBits);
  const isRoot = (n: LogicNode) => {
    if (!combinational(n) || state.has(n.name) || protectedNets.has(n.name)) return true;
    const r = readers.get(n.name) ?? [];
    return r.length !== 1 || !combinational(view.nodes[r[0]]);
  };
  const deviceOwners = new Map<number, number>();
  for (const n of view.nodes) for (const d of n.devices) deviceOwners.set(d, (deviceOwners.get(d) ?? 0) + 1);

  const cones: Cone[] = [];
  for (const root of view.nodes) {
    if (!combinational(root) || !isRoot(root)) continue;
    const cone = coneFrom(root, byName, isRoot, maxLeaves);
    if (!cone) continue;
    const { nodes, leaves, fn } = cone;
    const devices = [...new Set(nodes.flatMap((n) => n.devices))];
    // A device shared with a node outside the cone cannot be removed with it.
    const own = devices.every((d) => deviceOwners.get(d) === nodes.filter((n) => n.devices.includes(d)).length);
    if (!own) continue;
    cones.push({ root, nodes, leaves: [...leaves].sort(), fn, devices });
  }
  return cones;
}

/**
 * The cone under `root` (pre-order nodes, leaves, function over the leaves), walked with an
 * explicit stack so a long single-reader chain costs heap rather than call depth; gives up as soon
 * as the leaves pass `maxLeaves`.
 */
function coneFrom(
  root: LogicNode,
  byName: ReadonlyMap<string, LogicNode>,
  isRoot: (n: LogicNode) => boolean,
  maxLeaves: number,
): { nodes: LogicNode[]; leaves: Set<string>; fn: Expr } | undefined {
  const nodes: LogicNode[] = [];
  const leaves = new Set<string>();
  const memo = new Map<string, Expr>();
  const open = new Set<string>();
  const stack: { name: string; expanded: boolean }[] = [{ name: root.name, expanded: false }];
  while (stack.length) {
    const { name, expanded } = stack.pop()!;
    if (memo.has(name)) continue;
    const node = byName.get(name);
    if (!node || (node !== root && isRoot(node))) {
      leaves.add(name);
      if (leaves.size > maxLeaves) return undefined;
      memo.set(name, v(name));
      continue;
    }
    if (expanded) {
      open.delete(name);
      memo.set(name, substitute(node.fn, (x) => memo.get(x) ?? v(x)));
      continue;
    }
    if (open.has(name)) continue; // an uncut loop: the net stays a variable where it is read
    open.add(name);
    nodes.push(node);
    stack.push({ name, expanded: true });
    const deps = [...support(node.fn)].reverse();
    for (const dep of deps) if (!memo.has(dep)) stack.push({ name: dep, expanded: false });
  }
  return { nodes, leaves, fn: memo.get(root.name)! };
}
