// Devices whose logic group an edit changes through the nets it touches: every device on an
// internal node (a net no stage drives and none reads as an input) that the edit joins, leaves,
// lands on or removes parts from. Joining the emitter nodes of two stacks changes both stacks.
import type { LogicView } from '../extract/types';
import type { FlatNetlist } from '../netlist/ir';
import { indexOf } from './region';
import type { Edit } from './types';

const inputCache = new WeakMap<LogicView, Set<string>>();

const inputNetCache = new WeakMap<LogicView, Uint8Array>();

/** 1 for each net that is a primary input or state bit of the view, by net id (built once per view and design). */
export function inputNets(nl: FlatNetlist, view: LogicView): Uint8Array {
  let a = inputNetCache.get(view);
  if (!a || a.length !== nl.nets.length) {
    a = new Uint8Array(nl.nets.length);
    for (const name of inputsOf(view)) {
      const id = nl.netByName.get(name);
      if (id !== undefined && nl.nets[id].name === name) a[id] = 1;
    }
    inputNetCache.set(view, a);
  }
  return a;
}

/** Primary inputs and state bits of a view, by name (built once per view). */
function inputsOf(view: LogicView): Set<string> {
  let s = inputCache.get(view);
  if (!s) inputCache.set(view, (s = new Set([...view.inputs, ...view.stateBits])));
  return s;
}

/**
 * Devices on the internal nodes an edit touches: the kept and removed nets of a merge, the nets of
 * removed and reconnected devices, the nets reconnected onto and the existing nets an added device
 * lands on. A driven net or an input is left out: its readers see the same value after the edit
 * (the driven net itself is compared by name), and a control line can reach most of a board.
 * Each device once, in the order met.
 */
export function devicesOnTouchedNodes(nl: FlatNetlist, view: LogicView, edit: Edit): number[] {
  const known = touchedCache.get(edit);
  if (known && known.nl === nl && known.view === view) return known.devices;
  const devices = touchedDevices(nl, view, edit);
  touchedCache.set(edit, { nl, view, devices });
  return devices;
}

/** The last answer per edit: the scan asks twice for one proposal (changed nets, then its parts). */
const touchedCache = new WeakMap<Edit, { nl: FlatNetlist; view: LogicView; devices: number[] }>();

function touchedDevices(nl: FlatNetlist, view: LogicView, edit: Edit): number[] {
  const { byName, onNetStart, onNetList } = indexOf(nl);
  const inputs = inputNets(nl, view);
  const rails = new Set(nl.rails.map((r) => r.net));
  const seenNet = new Set<number>();
  const seenDevice = new Set<number>();
  const out: number[] = [];
  const touch = (id: number | undefined) => {
    if (id === undefined || seenNet.has(id)) return;
    seenNet.add(id);
    if (id === 0 || rails.has(id) || view.nodeByNet.has(id) || inputs[id] === 1) return;
    for (let k = onNetStart[id]; k < onNetStart[id + 1]; k++) {
      const d = onNetList[k];
      if (!seenDevice.has(d)) {
        seenDevice.add(d);
        out.push(d);
      }
    }
  };
  const byNet = (name: string) => touch(nl.netByName.get(name));
  for (const m of edit.mergeNets) {
    byNet(m.keep);
    byNet(m.remove);
  }
  for (const name of [...edit.removeDevices, ...edit.reconnect.map((r) => r.device)]) {
    const i = byName.get(name);
    if (i !== undefined) for (const t of nl.devices[i].terminals) touch(t);
  }
  for (const r of edit.reconnect) byNet(r.net);
  for (const d of edit.addDevices) for (const t of d.terminals) byNet(t);
  return out;
}
