// Logic extraction: FlatNetlist → LogicView. Bipolar collector-node groups, MOS channel-connected
// components and gate-level primitives each give driven nets; then loops become latches, inputs
// and state bits are listed and families summed. Linear in the design apart from per-group work.
import type { FlatNetlist } from '../netlist/ir';
import { support } from '../logic/expr';
import { makeContext } from './context';
import { BaseResolver, extractBipolar } from './bipolar';
import { extractMos } from './mos';
import { extractGates } from './gates';
import { markLoops, successors } from './loops';
import { NameTable } from '../netlist/name-table';
import type { DesignFamily, Family, LogicNode, LogicView } from './types';

export type * from './types';

function* chain<T>(...lists: T[][]): Generator<T> {
  for (const l of lists) yield* l;
}

export function extractLogic(nl: FlatNetlist): LogicView {
  const cx = makeContext(nl);
  const nNets = nl.nets.length;
  // Nets something reads as a control: MOS gates, bipolar bases, gate-level inputs.
  const controlRead = new Uint8Array(nNets);
  for (const d of nl.devices) {
    if (d.kind === 'nmos' || d.kind === 'pmos' || d.kind === 'npn' || d.kind === 'pnp') controlRead[d.terminals[1]] = 1;
    else if (d.kind === 'gate' && d.op !== 'pullup' && d.op !== 'pulldown') for (let t = 1; t < d.terminals.length; t++) controlRead[d.terminals[t]] = 1;
  }
  const bases = new BaseResolver(cx);
  const bip = extractBipolar(cx, bases);
  for (const nd of bip) for (const g of nd.groups) for (const b of g.bases) for (const i of b.inputs) controlRead[i] = 1;
  const gates = extractGates(cx);
  const driven = new Set<number>();
  for (const n of bip) driven.add(n.net);
  for (const n of gates) driven.add(n.net);
  const mos = extractMos(cx, driven, (n) => controlRead[n] === 1);

  // One node per net: the first extractor to claim a net wins; a clash is reported.
  const nodes: LogicNode[] = [];
  const nodeByNet = new Map<number, number>();
  const claimed = new Uint8Array(nNets);
  for (const node of chain(gates, bip, mos)) {
    if (claimed[node.net] === 1) {
      cx.diagnostics.push({
        severity: 'warning',
        code: 'extract.mixed-drivers',
        message: `net ${node.name} is driven by devices of different kinds; only the first driver is in the logic view`,
      });
      continue;
    }
    claimed[node.net] = 1;
    nodeByNet.set(node.net, nodes.length);
    nodes.push(node);
  }
  // node names numbered in a typed-array table; nodeOfName[name number] = the node (the last one
  // of that name, as a Map set node by node would keep)
  const names = new NameTable();
  const nodeOfName = new Int32Array(nodes.length);
  // one support set reused for every node: a Set per node is most of a large design's garbage
  const s = new Set<string>();
  for (let i = 0; i < nodes.length; i++) {
    const n = nodes[i];
    s.clear();
    support(n.fn, s);
    if (n.enable) support(n.enable, s);
    n.inputs = [...s];
    nodeOfName[names.add(n.name)] = i;
  }
  // one name lookup per fan-in: the loop search's successor lists and the design's inputs together
  const inputs = new Set<string>();
  const nodeOf = (name: string): number => {
    const k = names.get(name);
    return k < 0 ? -1 : nodeOfName[k];
  };
  const succ = successors(nodes, nodeOf, (name) => inputs.add(name));
  cx.diagnostics.push(...markLoops(nodes, succ));

  const railNames = new Set(nl.rails.map((r) => nl.nets[r.net].name));
  for (const r of railNames) inputs.delete(r);

  // Transistors no group explains are reported, never dropped silently.
  const used = new Uint8Array(nl.devices.length);
  for (const n of nodes) for (const d of n.devices) used[d] = 1;
  const unexplained: string[] = [];
  for (let i = 0; i < nl.devices.length; i++) {
    const d = nl.devices[i];
    if (!used[i] && (d.kind === 'npn' || d.kind === 'pnp' || d.kind === 'nmos' || d.kind === 'pmos')) unexplained.push(d.name);
  }
  if (unexplained.length) {
    cx.diagnostics.push({
      severity: 'warning',
      code: 'extract.unexplained',
      message: `${unexplained.length} transistor(s) not part of any recognised logic group: ${unexplained.slice(0, 8).join(', ')}${unexplained.length > 8 ? ', …' : ''}`,
    });
  }

  const familyCounts: Partial<Record<Family, number>> = {};
  for (const n of nodes) familyCounts[n.family] = (familyCounts[n.family] ?? 0) + 1;
  const fams = Object.keys(familyCounts) as Family[];
  const family: DesignFamily = fams.length === 0 ? 'none' : fams.length === 1 ? fams[0] : 'mixed';
  const rails = new Map<number, number>();
  for (const r of nl.rails) rails.set(r.net, r.volts);
  return {
    title: nl.title,
    nodes,
    nodeByNet,
    inputs: [...inputs].sort(),
    stateBits: stateBitsOf(nodes),
    rails,
    family,
    familyCounts,
    diagnostics: cx.diagnostics,
  };
}

function stateBitsOf(nodes: LogicNode[]): string[] {
  const out: string[] = [];
  for (const n of nodes) if (n.kind === 'latch') out.push(n.name);
  return out;
}
