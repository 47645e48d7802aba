// The region a proposal changes, cut out of the design as a small FlatNetlist of its own: the
// logic of the changed nets' transitive fan-in, the devices the edit names, and the rails. Proofs
// and simulations then cost the size of the region, not of the whole board.
import type { LogicView } from '../extract/types';
import type { FlatDevice, FlatNet, FlatNetlist } from '../netlist/ir';
import { deviceIndex, type NameIndex } from '../rewrite/edits';
import type { Edit } from './types';

/** Device index by name, the sources, and the devices on each net (compressed rows: one typed list). */
export interface DesignIndex {
  byName: NameIndex;
  sources: number[];
  /** Devices on net n: onNetList[onNetStart[n] … onNetStart[n + 1]), each once, in design order. */
  onNetStart: Int32Array;
  onNetList: Int32Array;
}

const indexCache = new WeakMap<FlatNetlist, DesignIndex>();

/** Built once per design: two typed arrays rather than a list per net, so a large board stays small. */
export function indexOf(nl: FlatNetlist): DesignIndex {
  let idx = indexCache.get(nl);
  if (idx) return idx;
  const sources: number[] = [];
  const start = new Int32Array(nl.nets.length + 1);
  const distinct = (d: FlatDevice, k: number) => d.terminals.indexOf(d.terminals[k]) === k;
  nl.devices.forEach((d, i) => {
    if (d.kind === 'vsource') sources.push(i);
    for (let k = 0; k < d.terminals.length; k++) if (distinct(d, k)) start[d.terminals[k] + 1]++;
  });
  for (let n = 0; n < nl.nets.length; n++) start[n + 1] += start[n];
  const fill = start.slice(0, nl.nets.length);
  const list = new Int32Array(start[nl.nets.length]);
  nl.devices.forEach((d, i) => {
    for (let k = 0; k < d.terminals.length; k++) if (distinct(d, k)) list[fill[d.terminals[k]]++] = i;
  });
  idx = { byName: deviceIndex(nl), sources, onNetStart: start, onNetList: list };
  indexCache.set(nl, idx);
  return idx;
}

/** Logic nodes whose groups hold each device: the first in a typed list, any further ones aside. */
export interface Owners {
  first: Int32Array;
  more: Map<number, number[]>;
}

const ownerCache = new WeakMap<LogicView, Owners>();

/** Device index → nodes whose groups contain it (built once per view). */
export function ownersOf(view: LogicView, deviceCount: number): Owners {
  let o = ownerCache.get(view);
  if (o) return o;
  o = { first: new Int32Array(deviceCount).fill(-1), more: new Map() };
  view.nodes.forEach((node, i) => {
    for (const d of node.devices) {
      if (d < deviceCount && o!.first[d] < 0) o!.first[d] = i;
      else {
        const list = o!.more.get(d);
        if (list) list.push(i);
        else o!.more.set(d, [i]);
      }
    }
  });
  ownerCache.set(view, o);
  return o;
}

/** Every device's terminals in one typed list: device d's are list[start[d] … start[d + 1]). */
export interface TerminalRows {
  start: Int32Array;
  list: Int32Array;
}

const terminalCache = new WeakMap<FlatNetlist, TerminalRows>();

/** Built once per design: walking typed rows costs far less than each device's own array at 1M devices. */
export function terminalRows(nl: FlatNetlist): TerminalRows {
  let rows = terminalCache.get(nl);
  if (rows) return rows;
  const start = new Int32Array(nl.devices.length + 1);
  for (let d = 0; d < nl.devices.length; d++) start[d + 1] = start[d] + nl.devices[d].terminals.length;
  const list = new Int32Array(start[nl.devices.length]);
  for (let d = 0; d < nl.devices.length; d++) list.set(nl.devices[d].terminals, start[d]);
  rows = { start, list };
  terminalCache.set(nl, rows);
  return rows;
}

/**
 * Scratch marks by net, device and node, for walks that must see each once. Stamped per walk
 * (`++marks.stamp`, then a mark equal to the stamp means seen), so they are never cleared; one
 * set per design and view. A walk must end before the next one starts.
 */
export interface ScratchMarks {
  stamp: number;
  net: Int32Array;
  device: Int32Array;
  node: Int32Array;
}

const marksCache = new WeakMap<LogicView, ScratchMarks>();

export function scratchMarks(nl: FlatNetlist, view: LogicView): ScratchMarks {
  let m = marksCache.get(view);
  if (!m || m.net.length !== nl.nets.length || m.device.length !== nl.devices.length) {
    m = { stamp: 0, net: new Int32Array(nl.nets.length), device: new Int32Array(nl.devices.length), node: new Int32Array(view.nodes.length) };
    marksCache.set(view, m);
  }
  return m;
}

const nodeOfNetCache = new WeakMap<LogicView, Int32Array>();

/** Net id → index of the node driving it, or -1 (view.nodeByNet as a typed list, built once per view). */
export function nodeOfNet(view: LogicView, netCount: number): Int32Array {
  let a = nodeOfNetCache.get(view);
  if (!a || a.length < netCount) {
    a = new Int32Array(netCount).fill(-1);
    for (const [net, i] of view.nodeByNet) if (net < netCount) a[net] = i;
    nodeOfNetCache.set(view, a);
  }
  return a;
}

const nodeCache = new WeakMap<LogicView, Map<string, number>>();

function nodeIndex(view: LogicView): Map<string, number> {
  let m = nodeCache.get(view);
  if (!m) {
    m = new Map(view.nodes.map((n, i) => [n.name, i]));
    nodeCache.set(view, m);
  }
  return m;
}

/** Regions larger than this many logic nodes are not cut out (the whole design is used). */
export const MAX_REGION_NODES = 5000;

export function editNetNames(nl: FlatNetlist, edit: Edit): string[] {
  const names = new Set<string>();
  for (const r of edit.reconnect) names.add(r.net);
  for (const d of edit.addDevices) for (const t of d.terminals) if (nl.netByName.has(t)) names.add(t);
  for (const m of edit.mergeNets) names.add(m.keep).add(m.remove);
  return [...names];
}

/**
 * @param seeds net names whose values the proof compares
 * @returns the region, or the design itself when the fan-in is too large to be worth cutting
 */
export function regionOf(nl: FlatNetlist, view: LogicView, seeds: string[], edit: Edit): FlatNetlist {
  const nodeByName = nodeIndex(view);
  const take = new Set<number>();
  const stack = seeds.map((s) => nodeByName.get(nl.nets[nl.netByName.get(s) ?? -1]?.name ?? s)).filter((i): i is number => i !== undefined);
  while (stack.length) {
    const i = stack.pop()!;
    if (take.has(i)) continue;
    take.add(i);
    if (take.size > MAX_REGION_NODES) return nl;
    const node = view.nodes[i];
    for (const x of node.inputs) {
      const j = nodeByName.get(x);
      if (j !== undefined && !take.has(j)) stack.push(j);
    }
    // A net the node's parts read but its function no longer names (a rail-tied input folded the
    // term away) keeps its driver too: cut out, it would float in the region's simulation.
    for (const d of node.devices) {
      for (const t of nl.devices[d].terminals) {
        if (t === node.net) continue;
        const j = view.nodeByNet.get(t);
        if (j !== undefined && !take.has(j)) stack.push(j);
      }
    }
  }
  const deviceIds = new Set<number>();
  for (const i of take) for (const d of view.nodes[i].devices) deviceIds.add(d);
  const idx = indexOf(nl);
  for (const name of [...edit.removeDevices, ...edit.reconnect.map((r) => r.device)]) {
    const i = idx.byName.get(name);
    if (i !== undefined) deviceIds.add(i);
  }
  for (const i of idx.sources) deviceIds.add(i);
  if (deviceIds.size >= nl.devices.length) return nl;
  return cutOut(nl, deviceIds, [...seeds, ...editNetNames(nl, edit)]);
}

/**
 * The devices given, as a FlatNetlist of their own: the nets they touch renumbered in the order
 * met (ground and rails first), plus the named nets (which keep every name they are known by).
 */
export function cutOut(nl: FlatNetlist, deviceIds: Set<number>, keepNames: string[]): FlatNetlist {
  // Renumber only the nets the region touches (plus ground, rails and the edit's nets).
  const netMap = new Map<number, number>();
  const nets: FlatNet[] = [];
  const keepNet = (id: number) => {
    let k = netMap.get(id);
    if (k === undefined) {
      k = nets.length;
      netMap.set(id, k);
      nets.push({ ...nl.nets[id], id: k });
    }
    return k;
  };
  keepNet(0);
  for (const r of nl.rails) keepNet(r.net);
  for (const name of keepNames) {
    const id = nl.netByName.get(name);
    if (id !== undefined) keepNet(id);
  }
  const devices: FlatDevice[] = [...deviceIds].sort((a, b) => a - b).map((i) => {
    const d = nl.devices[i];
    return { ...d, terminals: d.terminals.map(keepNet) };
  });
  const netByName = new Map<string, number>();
  for (const [id, k] of netMap) netByName.set(nl.nets[id].name, k);
  // Other names of kept nets that the proof and the edit use (aliases left by merges).
  for (const name of keepNames) {
    const id = nl.netByName.get(name);
    if (id !== undefined) netByName.set(name, netMap.get(id)!);
  }
  return {
    title: `${nl.title} (region)`,
    devices,
    nets,
    netByName,
    rails: nl.rails.map((r) => ({ ...r, net: netMap.get(r.net)! })),
    ports: nl.ports.filter((p) => netMap.has(p)).map((p) => netMap.get(p)!),
    models: nl.models,
  };
}
