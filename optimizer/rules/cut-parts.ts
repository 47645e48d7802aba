// A proposal split into parts that can be proved one by one, each on a small region cut at the nets
// the rewrite leaves unchanged (cut points): a design-wide edit made of one change per bit slice
// becomes one part per slice, and slices cut out alike share one proof through the proof cache.
import type { LogicView } from '../extract/types';
import type { FlatNetlist } from '../netlist/ir';
import { cutOut, editNetNames, indexOf, MAX_REGION_NODES, nodeOfNet, ownersOf, scratchMarks, terminalRows } from './region';
import { devicesOnTouchedNodes, inputNets } from './touched-nodes';
import type { Edit } from './types';

/**
 * The parts of one edit, kept in typed lists (a design-wide edit has hundreds of thousands):
 * part k's items, compared nets and core nodes. Items are numbered over the edit's lists in
 * order: removed devices, reconnections, added devices, merges.
 */
export class CutParts {
  constructor(
    readonly edit: Edit,
    readonly count: number,
    private readonly itemStart: Int32Array,
    private readonly items: Int32Array,
    private readonly changedStart: Int32Array,
    private readonly changedList: Int32Array,
    private readonly coreStart: Int32Array,
    private readonly coreList: Int32Array,
    /** Device index of each removed device and of each reconnected device, as the edit lists them. */
    private readonly removedDevice: Int32Array,
    private readonly movedDevice: Int32Array,
  ) {}

  /** Changed nets part k compares, by id (each named by its own name), ascending. */
  changed(k: number): Int32Array {
    return this.changedList.subarray(this.changedStart[k], this.changedStart[k + 1]);
  }

  /** Nodes cut out whole and composed in part k's proof: its changed nets and the unchanged nets it merges or moves loads onto. */
  core(k: number): Int32Array {
    return this.coreList.subarray(this.coreStart[k], this.coreStart[k + 1]);
  }

  /** Part k: its own edit, the device indices of its removed and reconnected devices, its nets and nodes. */
  part(k: number): CutPart {
    const e = this.edit;
    const r = e.removeDevices.length;
    const c = e.reconnect.length;
    const a = e.addDevices.length;
    const edit: Edit = { removeDevices: [], addDevices: [], reconnect: [], mergeNets: [] };
    const removed: number[] = [];
    const moved: number[] = [];
    for (let j = this.itemStart[k]; j < this.itemStart[k + 1]; j++) {
      const i = this.items[j];
      if (i < r) {
        edit.removeDevices.push(e.removeDevices[i]);
        removed.push(this.removedDevice[i]);
      } else if (i < r + c) {
        edit.reconnect.push(e.reconnect[i - r]);
        moved.push(this.movedDevice[i - r]);
      } else if (i < r + c + a) edit.addDevices.push(e.addDevices[i - r - c]);
      else edit.mergeNets.push(e.mergeNets[i - r - c - a]);
    }
    if (edit.addDevices.length && e.addModels?.length) edit.addModels = e.addModels;
    return { edit, removed, moved, changed: this.changed(k), core: this.core(k) };
  }
}

/** One part, as proved. */
export interface CutPart {
  edit: Edit;
  /** Device indices of edit.removeDevices, in order. */
  removed: number[];
  /** Device indices of edit.reconnect's devices, in order. */
  moved: number[];
  /** Changed nets the part compares, by id (each named by its own name), ascending. */
  changed: Int32Array;
  /** Nodes cut out whole and composed in the proof (a node may be listed twice). */
  core: Int32Array;
}

/** Counting sort of (part, value) pairs into compressed rows: start[k] … start[k + 1] in list. */
function rows(count: number, part: Int32Array, value: Int32Array, n: number): { start: Int32Array; list: Int32Array } {
  const start = new Int32Array(count + 1);
  for (let j = 0; j < n; j++) start[part[j] + 1]++;
  for (let k = 0; k < count; k++) start[k + 1] += start[k];
  const fill = start.slice(0, count);
  const list = new Int32Array(n);
  for (let j = 0; j < n; j++) list[fill[part[j]]++] = value[j];
  return { start, list };
}

/** What a part's region holds, before it is cut out (see cutRegion). */
export interface PartRegion {
  /** Devices by design index, ascending. */
  devices: number[];
  /** Driven nets the region keeps only so its core reads them in context; the proof takes their values as free. */
  cut: number[];
  /** Nets the region keeps though no device of it may touch them (compared nets, the edit's nets), by id. */
  keep: number[];
}

/** Vector sources by the nets they touch, and those of the rails (built once per design). */
interface Sources {
  byNet: Map<number, number[]>;
  onNet: Uint8Array;
  rails: number[];
}

const sourceCache = new WeakMap<FlatNetlist, Sources>();

function sourcesOf(nl: FlatNetlist): Sources {
  let m = sourceCache.get(nl);
  if (m) return m;
  m = { byNet: new Map(), onNet: new Uint8Array(nl.nets.length), rails: [] };
  for (const i of indexOf(nl).sources) {
    for (const t of nl.devices[i].terminals) {
      m.onNet[t] = 1;
      const list = m.byNet.get(t);
      if (!list) m.byNet.set(t, [i]);
      else if (!list.includes(i)) list.push(i);
    }
  }
  for (const r of nl.rails) for (const i of m.byNet.get(r.net) ?? []) if (!m.rails.includes(i)) m.rails.push(i);
  sourceCache.set(nl, m);
  return m;
}

/**
 * Splits a proposal's edit into parts whose changed nets depend on one another only through nets
 * the edit leaves unchanged. Two changes fall in one part when they touch a common net the edit
 * changes (an internal node, a net merged away, a net whose driving group loses or gains parts).
 * A driven net whose group the edit leaves alone — a kept shared driver others are merged onto, a
 * line that only loses a load — links nothing: it is compared in a part of its own, and a part
 * that merges or moves loads onto it composes its (unchanged) logic.
 *
 * Why the parts' proofs prove the whole: each part's changed nets are proved equal before and after
 * for every value of the nets the region cuts, so in the design, where those nets are either
 * unchanged or changed nets proved equal by their own parts, every changed net keeps its value
 * (induction along the logic's fan-in; latch nets are cut as state bits in both).
 *
 * @param changed the changed nets of the whole proposal (as the scan computes them): by id those
 *   named by their own name, and any other names
 * @returns the parts, or undefined when the edit cannot be split this way (an added or removed
 *   part that touches no net a proof could compare, a removed source, a driven net changed under
 *   a second name)
 */
export function cutParts(nl: FlatNetlist, view: LogicView, edit: Edit, changed: { ids: number[]; others: string[] }): CutParts | undefined {
  const { byName, onNetStart, onNetList } = indexOf(nl);
  const owners = ownersOf(view, nl.devices.length);
  const inputs = inputNets(nl, view);
  const netCount = nl.nets.length;
  const deviceCount = nl.devices.length;
  // Typed marks by net and device id: a design-wide edit names hundreds of thousands of each.
  const railNet = new Uint8Array(netCount);
  railNet[0] = 1;
  for (const r of nl.rails) railNet[r.net] = 1;
  const nodeOf = nodeOfNet(view, netCount);
  const isInput = (id: number) => nodeOf[id] < 0 && inputs[id] === 1;

  // New nets an edit names (an added driver's output) get ids after the design's.
  const newNet = new Map<string, number>();
  const netId = (name: string): number => {
    const id = nl.netByName.get(name);
    if (id !== undefined) return id;
    let k = newNet.get(name);
    if (k === undefined) newNet.set(name, (k = netCount + newNet.size));
    return k;
  };
  for (const r of edit.reconnect) netId(r.net);
  for (const d of edit.addDevices) for (const t of d.terminals) netId(t);
  for (const m of edit.mergeNets) netId(m.keep);
  const ids = netCount + newNet.size;

  const removed = new Uint8Array(deviceCount);
  const hit = new Uint8Array(deviceCount);
  const hitList: number[] = [];
  const hitDevice = (d: number) => {
    if (hit[d] === 0) {
      hit[d] = 1;
      hitList.push(d);
    }
  };
  const removedIds: number[] = [];
  for (const name of edit.removeDevices) {
    const i = byName.get(name);
    if (i === undefined || nl.devices[i].kind === 'vsource') return undefined;
    removed[i] = 1;
    removedIds.push(i);
    hitDevice(i);
  }
  const reconnectIds: number[] = [];
  for (const r of edit.reconnect) {
    const i = byName.get(r.device);
    if (i === undefined) return undefined;
    reconnectIds.push(i);
    hitDevice(i);
  }
  const mergedAway = new Uint8Array(netCount);
  const removeIds: number[] = [];
  for (const m of edit.mergeNets) {
    const id = nl.netByName.get(m.remove);
    if (id === undefined) return undefined;
    mergedAway[id] = 1;
    removeIds.push(id);
    for (let k = onNetStart[id]; k < onNetStart[id + 1]; k++) hitDevice(onNetList[k]);
  }
  for (const d of devicesOnTouchedNodes(nl, view, edit)) hitDevice(d);
  const addedOn = new Uint8Array(ids);
  for (const d of edit.addDevices) for (const t of d.terminals) addedOn[netId(t)] = 1;

  // Quiet: driven, its group holds no part the edit touches, nothing is added on it, and every net
  // merged into it brings no driver of its own (the merged net's group is removed whole).
  const quietMark = new Uint8Array(netCount); // 0 not yet known, 1 quiet, 2 not
  const quiet = (id: number): boolean => {
    if (id >= netCount) return false;
    if (quietMark[id] === 0) {
      const node = nodeOf[id];
      const q = node >= 0 && addedOn[id] === 0 && mergedAway[id] === 0 && !view.nodes[node].devices.some((d) => hit[d] === 1);
      quietMark[id] = q ? 1 : 2;
    }
    return quietMark[id] === 1;
  };
  edit.mergeNets.forEach((m, k) => {
    const keep = nl.netByName.get(m.keep);
    const gone = nodeOf[removeIds[k]];
    if (keep !== undefined && gone >= 0 && view.nodes[gone].devices.some((d) => removed[d] === 0)) quietMark[keep] = 2;
  });

  // Union-find over net ids (new nets after the design's).
  const parent = new Int32Array(ids).fill(-1);
  const find = (x: number): number => {
    if (parent[x] < 0) return (parent[x] = x);
    let r = x;
    while (parent[r] !== r) r = parent[r];
    while (parent[x] !== r) {
      const p = parent[x];
      parent[x] = r;
      x = p;
    }
    return r;
  };
  const union = (a: number, b: number) => {
    const ra = find(a);
    const rb = find(b);
    if (ra !== rb) parent[ra] = rb;
  };
  /** A net an item links through: not ground or a rail, not a quiet driven net, not an input a removed or moved part only read. */
  const links = (id: number, fromAdded: boolean) => !(id < netCount && (railNet[id] === 1 || quiet(id) || (!fromAdded && isInput(id))));

  // Each item joins its linking nets; the first is its atom. An item with none is not split.
  const itemAtoms: number[] = [];
  const atomOfDevice = new Int32Array(deviceCount).fill(-1);
  const item = (nets: readonly number[], fromAdded: boolean): number => {
    let first = -1;
    for (const id of nets) {
      if (!links(id, fromAdded)) continue;
      if (first < 0) first = id;
      union(first, id);
    }
    if (first >= 0) itemAtoms.push(first);
    return first;
  };
  for (const i of removedIds) if ((atomOfDevice[i] = item(nl.devices[i].terminals, false)) < 0) return undefined;
  for (let k = 0; k < reconnectIds.length; k++) {
    const i = reconnectIds[k];
    const atom = item([...nl.devices[i].terminals, netId(edit.reconnect[k].net)], false);
    if (atom < 0) return undefined;
    atomOfDevice[i] = atom;
  }
  for (const d of edit.addDevices) if (item(d.terminals.map(netId), true) < 0) return undefined;
  for (let k = 0; k < removeIds.length; k++) if (item([removeIds[k], netId(edit.mergeNets[k].keep)], false) < 0) return undefined;

  // Every group holding a part the edit touches changes with that item: its net joins the item
  // (through the item's atom, a net merged away it sat on, or an internal node it shares).
  for (const d of hitList) {
    let atom = atomOfDevice[d];
    for (const t of nl.devices[d].terminals) {
      if (parent[t] < 0 || railNet[t] === 1 || !(mergedAway[t] === 1 || nodeOf[t] < 0)) continue;
      if (atom < 0) atom = t;
      else union(atom, t);
    }
    if (atom < 0) return undefined;
    if (owners.first[d] >= 0) union(view.nodes[owners.first[d]].net, atom);
    for (const i of owners.more.get(d) ?? []) union(view.nodes[i].net, atom);
  }

  // Number the parts: one per root any item reaches, in the order met, then one per quiet net.
  const partOfRoot = new Int32Array(ids).fill(-1);
  let count = 0;
  const itemPart = new Int32Array(itemAtoms.length);
  itemAtoms.forEach((atom, j) => {
    const root = find(atom);
    if (partOfRoot[root] < 0) partOfRoot[root] = count++;
    itemPart[j] = partOfRoot[root];
  });
  for (const name of changed.others) {
    const id = nl.netByName.get(name);
    if (id !== undefined && nodeOf[id] >= 0) return undefined;
  }
  const changedPart: number[] = [];
  const changedNet: number[] = [];
  const corePart: number[] = [];
  const coreNode: number[] = [];
  for (const id of changed.ids) {
    const node = nodeOf[id];
    if (node < 0) continue; // undriven before: never compared
    let k: number;
    if (quiet(id)) k = count++;
    else {
      k = parent[id] < 0 ? -1 : partOfRoot[find(id)];
      if (k < 0) return undefined; // a changed net no item reaches: not split
    }
    changedPart.push(k);
    changedNet.push(id);
    corePart.push(k);
    coreNode.push(node);
  }
  // Unchanged nets a part merges into or moves loads onto: their logic is composed in its proof.
  const r = edit.removeDevices.length;
  const c = edit.reconnect.length;
  const a = edit.addDevices.length;
  const onto = (name: string, j: number) => {
    const id = nl.netByName.get(name);
    if (id !== undefined && nodeOf[id] >= 0 && quiet(id)) {
      corePart.push(itemPart[j]);
      coreNode.push(nodeOf[id]);
    }
  };
  edit.reconnect.forEach((x, j) => onto(x.net, r + j));
  edit.mergeNets.forEach((m, j) => onto(m.keep, r + c + a + j));

  const itemRows = rows(count, itemPart, Int32Array.from(itemAtoms, (_, j) => j), itemAtoms.length);
  const changedRows = rows(count, Int32Array.from(changedPart), Int32Array.from(changedNet), changedNet.length);
  for (let k = 0; k < count; k++) changedRows.list.subarray(changedRows.start[k], changedRows.start[k + 1]).sort();
  const coreRows = rows(count, Int32Array.from(corePart), Int32Array.from(coreNode), coreNode.length);
  return new CutParts(
    edit,
    count,
    itemRows.start,
    itemRows.list,
    changedRows.start,
    changedRows.list,
    coreRows.start,
    coreRows.list,
    Int32Array.from(removedIds),
    Int32Array.from(reconnectIds),
  );
}

/**
 * The part's core nodes with their parts, the parts the edit names, the drivers of every net those
 * read (the cut: kept for context, free in the proof) and the sources on any of their nets.
 * @returns undefined when the region would exceed MAX_REGION_NODES logic nodes
 */
export function partRegion(nl: FlatNetlist, view: LogicView, part: CutPart): PartRegion | undefined {
  const marks = scratchMarks(nl, view);
  const nodeOf = nodeOfNet(view, nl.nets.length);
  const stamp = ++marks.stamp;
  const core = part.core;
  const ring: number[] = [];
  const devices: number[] = [];
  const takeDevice = (d: number) => {
    if (marks.device[d] !== stamp) {
      marks.device[d] = stamp;
      devices.push(d);
    }
  };
  for (const i of core) marks.node[i] = stamp;
  const terms = terminalRows(nl);
  const readBy = (d: number, own: number) => {
    for (let k = terms.start[d]; k < terms.start[d + 1]; k++) {
      const t = terms.list[k];
      if (t === own) continue;
      const j = nodeOf[t];
      if (j >= 0 && marks.node[j] !== stamp) {
        marks.node[j] = stamp;
        ring.push(j);
      }
    }
  };
  for (const i of core) {
    for (const d of view.nodes[i].devices) {
      takeDevice(d);
      readBy(d, view.nodes[i].net);
    }
  }
  for (const list of [part.removed, part.moved]) {
    for (const i of list) {
      takeDevice(i);
      readBy(i, -1);
    }
  }
  if (core.length + ring.length > MAX_REGION_NODES) return undefined;
  for (const j of ring) for (const d of view.nodes[j].devices) takeDevice(d);
  const sources = sourcesOf(nl);
  for (const s of sources.rails) takeDevice(s);
  const n = devices.length;
  for (let k = 0; k < n; k++) {
    for (let j = terms.start[devices[k]]; j < terms.start[devices[k] + 1]; j++) {
      if (sources.onNet[terms.list[j]] === 1) for (const s of sources.byNet.get(terms.list[j])!) takeDevice(s);
    }
  }
  const keep = [...part.changed];
  for (const name of editNetNames(nl, part.edit)) {
    const id = nl.netByName.get(name);
    if (id !== undefined) keep.push(id);
  }
  return { devices: devices.sort((a, b) => a - b), cut: ring.map((j) => view.nodes[j].net), keep };
}

/** The part's region as a netlist of its own, its compared nets' names and its cut nets' names. */
export function cutRegion(nl: FlatNetlist, part: CutPart, r: PartRegion): { region: FlatNetlist; changed: string[]; cut: string[] } {
  const name = (id: number) => nl.nets[id].name;
  const changed = Array.from(part.changed, name).sort();
  return { region: cutOut(nl, new Set(r.devices), [...changed, ...editNetNames(nl, part.edit)]), changed, cut: r.cut.map(name).sort() };
}
