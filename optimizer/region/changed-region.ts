// The explorer's changed regions (devices as net-name lists, sent without the whole netlist) as the
// before/after graphs the drawing lays out. Several regions (every proposal switched on) draw as one.
import { GROUND, type DeviceKind, type GateOp } from '../netlist/ir';
import type { ChangedRegion, RegionDevice } from '../whatif/explorer-data';
import { terminalNames, type PartRole, type RegionGraph, type RegionNet, type RegionPart } from './graph';

const KINDS: ReadonlySet<string> = new Set<DeviceKind>(['npn', 'pnp', 'nmos', 'pmos', 'resistor', 'capacitor', 'diode', 'vsource', 'isource', 'gate']);

function part(d: RegionDevice, nets: string[], role: PartRole): RegionPart {
  // The server sends the engine's own kinds; an unknown one is a contract break, not a drawing to guess.
  if (!KINDS.has(d.kind)) throw new TypeError(`changed region: device ${d.name} has unknown kind "${d.kind}"`);
  const kind = d.kind as DeviceKind;
  const op = d.op as GateOp | undefined;
  const names = terminalNames(kind, op, nets.length);
  return {
    name: d.name,
    kind,
    ...(op ? { op } : {}),
    ...(d.value !== undefined ? { value: d.value } : {}),
    terminals: nets.map((net, k) => ({ name: names[k] ?? `t${k}`, net })),
    role,
  };
}

/**
 * Nets of the drawn parts. Only the changed parts travel with the explorer, so a net is drawn as
 * reaching the rest of the design unless two or more drawn parts share it; ground is a 0 V rail.
 */
function netsOf(parts: RegionPart[]): RegionNet[] {
  const uses = new Map<string, number>();
  for (const p of parts) for (const n of new Set(p.terminals.map((t) => t.net))) uses.set(n, (uses.get(n) ?? 0) + 1);
  return [...uses].map(([name, count]) => (name === GROUND ? { name, railVolts: 0, boundary: false } : { name, boundary: count < 2 }));
}

/** Before: removed parts (and the kept parts a rewrite rewires); after: added parts and the rewired ones. */
export function changedRegionGraphs(regions: readonly ChangedRegion[]): { before: RegionGraph; after: RegionGraph } {
  const before: RegionPart[] = [];
  const after: RegionPart[] = [];
  const seenBefore = new Set<string>();
  const seenAfter = new Set<string>();
  for (const r of regions) {
    const merged = new Map(r.mergeNets.map((m) => [m.remove, m.keep]));
    const rename = (net: string) => merged.get(net) ?? net;
    const moved = new Set(r.reconnect.map((c) => c.device));
    for (const d of r.before) {
      if (seenBefore.has(d.name)) continue;
      seenBefore.add(d.name);
      before.push(part(d, d.terminals, moved.has(d.name) ? 'changed' : 'removed'));
      if (!moved.has(d.name)) continue;
      // The same part after the rewrite: its moved terminals on their new nets.
      const nets = d.terminals.map((n, k) => rename(r.reconnect.find((c) => c.device === d.name && c.terminal === k)?.net ?? n));
      if (!seenAfter.has(d.name)) {
        seenAfter.add(d.name);
        after.push(part(d, nets, 'changed'));
      }
    }
    for (const d of r.after) {
      if (seenAfter.has(d.name)) continue;
      seenAfter.add(d.name);
      after.push(part(d, d.terminals.map(rename), 'added'));
    }
  }
  return { before: { parts: before, nets: netsOf(before) }, after: { parts: after, nets: netsOf(after) } };
}
