// The design-wide steps of extraction over a complete list of logic nodes: each node's fan-in
// names, the loop search that turns feedback into latches, the design's inputs and state bits, its
// family. Shared by a full extraction and the incremental view of an edited design.
import type { Diagnostic } from '../errors';
import { support } from '../logic/expr';
import type { FlatNetlist } from '../netlist/ir';
import { NameTable } from '../netlist/name-table';
import { markLoops, successors } from './loops';
import { fit } from './fit';
import type { DesignFamily, Family, LogicNode, LogicView } from './types';
import { empty } from '../netlist/empty';

export interface NodeSummary {
  view: Pick<LogicView, 'nodeByNet' | 'inputs' | 'stateBits' | 'rails' | 'family' | 'familyCounts'>;
  /** Warnings of the loop search (feedback not read as a latch). */
  loops: Diagnostic[];
}

export function summariseNodes(nl: FlatNetlist, nodes: LogicNode[]): NodeSummary {
  const nodeByNet = new Map<number, number>();
  // node names numbered in a typed-array table; nodeOfName[name number] = the node (the last one
  // of that name, as a Map set node by node would keep)
  const names = new NameTable();
  const nodeOfName = new Int32Array(nodes.length);
  // one support set reused for every node: a Set per node is most of a large design's garbage
  const s = new Set<string>();
  const list: string[] = [];
  for (let i = 0; i < nodes.length; i++) {
    const n = nodes[i];
    nodeByNet.set(n.net, i);
    s.clear();
    support(n.fn, s);
    if (n.enable) support(n.enable, s);
    empty(list);
    for (const x of s) list.push(x);
    n.inputs = fit(list);
    nodeOfName[names.add(n.name)] = i;
  }
  // one name lookup per fan-in: the loop search's successor lists and the design's inputs together
  const inputs = new Set<string>();
  const nodeOf = (name: string): number => {
    const k = names.get(name);
    return k < 0 ? -1 : nodeOfName[k];
  };
  const succ = successors(nodes, nodeOf, (name) => inputs.add(name));
  const loops = markLoops(nodes, succ);
  for (const r of nl.rails) inputs.delete(nl.nets[r.net].name);

  const familyCounts: Partial<Record<Family, number>> = {};
  // indexed loops: a for-of loop run once over a million nodes makes an iterator result per node
  for (let i = 0; i < nodes.length; i++) familyCounts[nodes[i].family] = (familyCounts[nodes[i].family] ?? 0) + 1;
  const fams = Object.keys(familyCounts) as Family[];
  const family: DesignFamily = fams.length === 0 ? 'none' : fams.length === 1 ? fams[0] : 'mixed';
  const rails = new Map<number, number>();
  for (const r of nl.rails) rails.set(r.net, r.volts);
  const stateBits: string[] = [];
  for (let i = 0; i < nodes.length; i++) if (nodes[i].kind === 'latch') stateBits.push(nodes[i].name);
  return { view: { nodeByNet, inputs: [...inputs].sort(), stateBits, rails, family, familyCounts }, loops };
}
