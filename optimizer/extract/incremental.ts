// Logic view of an edited design without extracting it whole: only the driven nets whose groups the
// edit can change are extracted again (from a small cut of the edited netlist around them); every
// other node is the unedited view's, with device indices moved to the edited netlist's numbering.
import type { FlatDevice, FlatNetlist } from '../netlist/ir';
import { extractLogic } from './index';
import { BaseResolver, extractBipolar } from './bipolar';
import { makeContext } from './context';
import { summariseNodes } from './summary';
import type { BaseDrive, DriverGroup, Family, LogicNode, LogicView, PullUp, SwitchNetwork } from './types';

/** The parts of a rewrite the view depends on (the shape of a proposal's edit). */
export interface EditShape {
  removeDevices: readonly string[];
  reconnect: readonly { device: string; net: string }[];
  addDevices: readonly { name: string; terminals: readonly string[] }[];
  mergeNets: readonly { keep: string; remove: string }[];
}

/**
 * Share of changed nodes above which a whole extraction is cheaper: measured on generated RTL
 * boards, an edit changing two thirds of the nodes costs about twice a whole extraction this way.
 */
export const DEFAULT_MAX_CHANGED_SHARE = 0.25;

/** Devices on each net of a design, in compressed rows (built once per frozen design). */
const onNetCache = new WeakMap<FlatNetlist, { start: Int32Array; list: Int32Array }>();

function devicesOnNets(nl: FlatNetlist): { start: Int32Array; list: Int32Array } {
  let idx = onNetCache.get(nl);
  if (idx) return idx;
  const start = new Int32Array(nl.nets.length + 1);
  for (const d of nl.devices) for (const t of d.terminals) start[t + 1]++;
  for (let n = 0; n < nl.nets.length; n++) start[n + 1] += start[n];
  const fill = start.slice(0, nl.nets.length);
  const list = new Int32Array(start[nl.nets.length]);
  nl.devices.forEach((d, i) => {
    for (const t of d.terminals) list[fill[t]++] = i;
  });
  idx = { start, list };
  if (Object.isFrozen(nl.devices)) onNetCache.set(nl, idx);
  return idx;
}

const mapNet = (s: SwitchNetwork, dev: (d: number) => number): SwitchNetwork =>
  s.type === 'switch' ? { ...s, device: dev(s.device) } : { ...s, parts: s.parts.map((p) => mapNet(p, dev)) };

/** A node with every device index and net id passed through the maps (a fresh, unfrozen object). */
function remapNode(n: LogicNode, dev: (d: number) => number, net: (x: number) => number): LogicNode {
  const pu = (p: PullUp): PullUp => ({ ...p, device: dev(p.device), rail: net(p.rail) });
  const base = (b: BaseDrive): BaseDrive => ({
    ...b,
    transistor: dev(b.transistor),
    inputs: b.inputs.map(net),
    baseResistors: b.baseResistors.map((r) => ({ ...r, device: dev(r.device), from: net(r.from) })),
    inputDiodes: b.inputDiodes.map(dev),
    levelShiftDiodes: b.levelShiftDiodes.map(dev),
    ...(b.diodePullUp ? { diodePullUp: pu(b.diodePullUp) } : {}),
    ...(b.bleed !== undefined ? { bleed: dev(b.bleed) } : {}),
    devices: b.devices.map(dev),
  });
  const group = (g: DriverGroup): DriverGroup => ({
    ...g,
    ...(g.pullDown ? { pullDown: mapNet(g.pullDown, dev) } : {}),
    ...(g.pullUp ? { pullUp: mapNet(g.pullUp, dev) } : {}),
    bases: g.bases.map(base),
    devices: g.devices.map(dev),
  });
  return {
    ...n,
    net: net(n.net),
    inputs: [...n.inputs],
    devices: n.devices.map(dev),
    ...(n.pullUp ? { pullUp: pu(n.pullUp) } : {}),
    pullUps: n.pullUps.map(pu),
    groups: n.groups.map(group),
    ...(n.partner !== undefined ? { partner: net(n.partner) } : {}),
  };
}

/**
 * @param before the unedited design and its view
 * @param after `applyProposals(before.nl, [proposal], { share: true })`: the same net ids, the
 *   devices in order less the removed ones, then the added ones
 * @param options.maxChangedShare above this share of the view's nodes changed (default 1/4), the
 *   edited design is extracted whole: cutting and re-numbering then cost more than they save
 * @returns the view extractLogic(after) gives, in the same node order (its diagnostics excepted:
 *   the unedited view's extractor warnings are kept, loop warnings found anew)
 */
export function extractEdited(
  before: { nl: FlatNetlist; view: LogicView },
  after: FlatNetlist,
  edit: EditShape,
  options: { maxChangedShare?: number } = {},
): LogicView {
  // An edit of more parts than the allowance of nodes changes at least about as many: extract whole.
  const allowed = (options.maxChangedShare ?? DEFAULT_MAX_CHANGED_SHARE) * before.view.nodes.length;
  if (edit.removeDevices.length + edit.reconnect.length > allowed) return extractLogic(after);
  const edited = editedNodes(before, after, edit, allowed);
  if (!edited) return extractLogic(after);
  const { dirty, toNew } = edited;
  // Kept nodes from the unedited view, changed ones from the cut, in extractLogic's order: gate
  // level by first driving gate, bipolar by first transistor collected on the net, MOS by net id.
  const nodes: LogicNode[] = [];
  before.view.nodes.forEach((n, i) => {
    if (!dirty[i]) nodes.push(remapNode(n, (d) => toNew[d], (x) => x));
  });
  for (const n of edited.nodes) nodes.push(n);
  const cls = (f: Family) => (f === 'gate' ? 0 : f === 'rtl' || f === 'dtl' ? 1 : 2);
  const keyOf = (n: LogicNode): number => {
    if (cls(n.family) === 2) return n.net;
    let best = Infinity;
    for (const d of n.devices) {
      const dev = after.devices[d];
      if (dev.terminals[0] !== n.net) continue;
      if (n.family === 'gate' ? dev.kind === 'gate' && dev.op !== 'pullup' && dev.op !== 'pulldown' : dev.kind === 'npn') best = Math.min(best, d);
    }
    return best;
  };
  const order = nodes.map((n, i) => ({ c: cls(n.family), k: keyOf(n), i }));
  order.sort((x, y) => x.c - y.c || x.k - y.k);
  const sorted = order.map((o) => nodes[o.i]);
  return finish(after, before.view, sorted);
}

/** The nodes an edit can change, extracted again from the edited design (see `editedNodes`). */
export interface EditedNodes {
  /** 1 at each node of the unedited view the edit can change; every other node stays as it is. */
  dirty: Uint8Array;
  /** Nets (edited numbering) of those nodes and of the nets the edit touches. */
  dirtyNets: Set<number>;
  /** The edited design's nodes on those nets, device indices in the edited numbering (unless not renumbered). */
  nodes: LogicNode[];
  /** Old device index → new (−1 when removed). */
  toNew: Int32Array;
}

/**
 * The nodes of the edited design that the edit can change, extracted from a cut around them; the
 * unedited view's other nodes are the edited view's too (device indices through `toNew`).
 * @param allowed most changed nodes worth the cut (undefined beyond, and when `after` is not the
 *   shared-ids copy `applyProposals(…, { share: true })` gives)
 */
export function editedNodes(
  before: { nl: FlatNetlist; view: LogicView },
  after: FlatNetlist,
  edit: EditShape,
  allowed = Infinity,
  /** false: the nodes keep the cut's device numbering (for callers that read only their functions). */
  renumber = true,
): EditedNodes | undefined {
  const nl = before.nl;
  const removed = new Set(edit.removeDevices);
  // Old device index → new (−1 when removed); new → old (−1 when added).
  const toNew = new Int32Array(nl.devices.length);
  let k = 0;
  for (let i = 0; i < nl.devices.length; i++) toNew[i] = removed.has(nl.devices[i].name) ? -1 : k++;
  const shareLike =
    after.nets.length >= nl.nets.length &&
    after.devices.length === k + edit.addDevices.length &&
    nl.nets.every((n, i) => after.nets[i].name === n.name);
  if (!shareLike) return undefined;
  // Old net id → its id after the edit (itself, or the kept net of a merge): one name lookup a net.
  const canonOf = new Int32Array(nl.nets.length);
  for (let i = 0; i < nl.nets.length; i++) canonOf[i] = after.netByName.get(nl.nets[i].name) ?? i;
  const canon = (oldNet: number): number => canonOf[oldNet];
  const isRail = new Uint8Array(after.nets.length);
  for (const r of after.rails) isRail[r.net] = 1;

  // Nets the edit touches (in the edited numbering): every terminal of a removed, reconnected or
  // added device, before and after, and both sides of every merge.
  const touched = new Set<number>();
  const touch = (n: number) => {
    if (!isRail[n]) touched.add(n);
  };
  const byName = new Map<string, number>();
  const moved = new Set([...edit.reconnect.map((r) => r.device), ...edit.addDevices.map((d) => d.name)]);
  for (let i = 0; i < nl.devices.length; i++) {
    const name = nl.devices[i].name;
    if (removed.has(name) || moved.has(name)) for (const t of nl.devices[i].terminals) touch(canon(t));
  }
  for (let i = 0; i < after.devices.length; i++) {
    const d = after.devices[i];
    if (moved.has(d.name)) {
      byName.set(d.name, i);
      for (const t of d.terminals) touch(t);
    }
  }
  const mergedAway: number[] = [];
  for (const m of edit.mergeNets) {
    const gone = nl.netByName.get(m.remove);
    if (gone !== undefined) mergedAway.push(gone);
    for (const name of [m.keep, m.remove]) {
      const id = after.netByName.get(name);
      if (id !== undefined) touch(id);
    }
  }

  // Devices on a net of the edited design, from the unedited index, the merges and the moved parts.
  const old = devicesOnNets(nl);
  const mergedInto = new Map<number, number[]>();
  for (const g of mergedAway) (mergedInto.get(canon(g)) ?? mergedInto.set(canon(g), []).get(canon(g))!).push(g);
  const movedOn = new Map<number, number[]>();
  for (const i of byName.values()) for (const t of new Set(after.devices[i].terminals)) (movedOn.get(t) ?? movedOn.set(t, []).get(t)!).push(i);
  const fromOld = (o: number, into: Set<number>) => {
    for (let j = old.start[o]; j < old.start[o + 1]; j++) if (toNew[old.list[j]] >= 0) into.add(toNew[old.list[j]]);
  };
  const onAfterNet = (n: number, into: Set<number>) => {
    if (n < nl.nets.length) fromOld(n, into);
    for (const g of mergedInto.get(n) ?? []) fromOld(g, into);
    for (const i of movedOn.get(n) ?? []) into.add(i);
  };

  // Nodes the edit can change: those on a touched net or holding a device on one; latches too,
  // since a loop the edit opens or closes changes them and their kind before loop marking is gone.
  const oldView = before.view;
  const dirtyNets = new Set<number>(touched);
  const dirty = new Uint8Array(oldView.nodes.length);
  // Past the allowance the whole extraction is cheaper: stop counting there.
  let changedCount = 0;
  for (let i = 0; i < oldView.nodes.length; i++) {
    const n = oldView.nodes[i];
    let hit = n.kind === 'latch' || touched.has(canon(n.net));
    for (let j = 0; !hit && j < n.devices.length; j++) {
      const d = n.devices[j];
      if (toNew[d] < 0) hit = true;
      else for (const t of nl.devices[d].terminals) if (touched.has(canon(t))) hit = true;
    }
    if (hit) {
      dirty[i] = 1;
      dirtyNets.add(canon(n.net));
      if (++changedCount > allowed) return undefined;
    }
  }
  // The cut: every net of a changed node's devices and of the parts on touched nets, then every
  // device on those nets, so each changed net sees its full neighbourhood as the whole design does.
  const ring = new Set<number>(dirtyNets);
  const addTerms = (d: FlatDevice) => {
    for (const t of d.terminals) if (!isRail[t]) ring.add(t);
  };
  oldView.nodes.forEach((n, i) => {
    if (dirty[i]) for (const d of n.devices) if (toNew[d] >= 0) addTerms(after.devices[toNew[d]]);
  });
  const onTouched = new Set<number>();
  for (const n of touched) onAfterNet(n, onTouched);
  for (const d of onTouched) addTerms(after.devices[d]);
  const picked = new Set<number>();
  for (const n of ring) onAfterNet(n, picked);
  after.devices.forEach((d, i) => {
    if (d.kind === 'vsource' || d.kind === 'isource') picked.add(i);
  });
  const cut = [...picked].sort((a, b) => a - b);

  // The cut as a netlist of its own: the edited design's nets (same ids) and device objects, so the
  // extractor's walks see the same shapes and no net needs renumbering.
  const devices = cut.map((i) => after.devices[i]);
  const cutNl: FlatNetlist = { ...after, devices };
  // A cut of bipolar parts only needs its changed collector nets analysed; with gates or MOS parts
  // the claims between extractors and the MOS drive analysis read every net, so it is extracted whole.
  let localNodes: LogicNode[];
  if (devices.every((d) => d.kind !== 'gate' && d.kind !== 'nmos' && d.kind !== 'pmos')) {
    const only = new Uint8Array(after.nets.length);
    for (const n of dirtyNets) only[n] = 1;
    const cx = makeContext(cutNl);
    localNodes = extractBipolar(cx, new BaseResolver(cx), only);
  } else localNodes = extractLogic(cutNl).nodes;

  const nodes: LogicNode[] = [];
  for (const n of localNodes) {
    if (dirtyNets.has(n.net)) nodes.push(renumber ? remapNode(n, (d) => cut[d], (x) => x) : n);
  }
  return { dirty, dirtyNets, nodes, toNew };
}

/** The whole-view steps of extractLogic on the combined nodes: fan-in lists, loops, inputs, family. */
function finish(after: FlatNetlist, oldView: LogicView, nodes: LogicNode[]): LogicView {
  const { view, loops } = summariseNodes(after, nodes);
  return {
    title: after.title,
    nodes,
    ...view,
    diagnostics: [...oldView.diagnostics.filter((d) => d.code !== 'extract.loop'), ...loops],
  };
}
