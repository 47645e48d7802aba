// The small graph a picture draws: parts with named terminals on named nets, and the nets with
// their role (rail, ground, boundary to the rest of the design). Built from a FlatNetlist and a
// chosen set of devices; pure data, shared by the server (which builds it) and the client (which lays it out).
import { GROUND, TERMINAL_NAMES, type DeviceKind, type FlatNetlist, type GateOp } from '../netlist/ir';

export type PartRole = 'removed' | 'added' | 'changed' | 'neighbour' | 'plain';

export interface RegionTerminal {
  /** Terminal name (c/b/e, d/g/s/b, a/b, a/k, p/n; gates: y, in1…, en). */
  name: string;
  net: string;
}

export interface RegionPart {
  name: string;
  kind: DeviceKind;
  op?: GateOp;
  value?: number;
  model?: string;
  terminals: RegionTerminal[];
  /** removed (before view) / added (after view) are highlighted; changed = reconnected, kept. */
  role: PartRole;
}

export interface RegionNet {
  name: string;
  /** A supply rail's voltage; ground is a rail at 0 V. */
  railVolts?: number;
  /** The net also reaches parts outside the drawn set (drawn as a port). */
  boundary: boolean;
}

export interface RegionGraph {
  parts: RegionPart[];
  nets: RegionNet[];
}

/** Terminal names of a device in order; gates name their output y and inputs in1…, enables en. */
export function terminalNames(kind: DeviceKind, op: GateOp | undefined, count: number): string[] {
  if (kind !== 'gate') return TERMINAL_NAMES[kind].slice(0, count);
  if (op === 'bufif0' || op === 'bufif1' || op === 'notif0' || op === 'notif1' || op === 'latch') return ['y', 'in1', 'en'].slice(0, count);
  if (op === 'dff') return ['y', 'in1', 'clk'].slice(0, count);
  return ['y', ...Array.from({ length: count - 1 }, (_, i) => `in${i + 1}`)];
}

/** The graph of `indices` (device indices of nl) with each part's role from `roleOf`. */
export function graphOf(nl: FlatNetlist, indices: Iterable<number>, roleOf: (name: string) => PartRole = () => 'plain'): RegionGraph {
  const chosen = [...new Set(indices)].sort((a, b) => a - b);
  const inSet = new Set(chosen);
  const railVolts = new Map(nl.rails.map((r) => [r.net, r.volts]));
  const groundId = nl.netByName.get(GROUND);
  if (groundId !== undefined && !railVolts.has(groundId)) railVolts.set(groundId, 0);
  // Nets that also reach a device outside the set: one pass over every device.
  const outside = new Set<number>();
  nl.devices.forEach((d, i) => {
    if (!inSet.has(i)) for (const t of d.terminals) outside.add(t);
  });
  for (const p of nl.ports) outside.add(p);
  const parts: RegionPart[] = [];
  const netIds: number[] = [];
  const seen = new Set<number>();
  for (const i of chosen) {
    const d = nl.devices[i];
    const names = terminalNames(d.kind, d.op, d.terminals.length);
    parts.push({
      name: d.name,
      kind: d.kind,
      ...(d.op ? { op: d.op } : {}),
      ...(d.value !== undefined ? { value: d.value } : {}),
      ...(d.model ? { model: d.model } : {}),
      terminals: d.terminals.map((t, k) => ({ name: names[k] ?? `t${k}`, net: nl.nets[t].name })),
      role: roleOf(d.name),
    });
    for (const t of d.terminals) {
      if (!seen.has(t)) {
        seen.add(t);
        netIds.push(t);
      }
    }
  }
  const nets = netIds.map((id): RegionNet => {
    const volts = railVolts.get(id);
    return { name: nl.nets[id].name, ...(volts !== undefined ? { railVolts: volts } : {}), boundary: volts === undefined && outside.has(id) };
  });
  return { parts, nets };
}

/** Every device of the design except its supply sources (drawn as rail symbols instead). */
export function designGraph(nl: FlatNetlist): RegionGraph {
  const rails = new Set(nl.rails.map((r) => r.source).filter(Boolean));
  return graphOf(nl, nl.devices.flatMap((d, i) => (rails.has(d.name) ? [] : [i])));
}

/** The devices of one subcircuit instance (its path prefix, e.g. "XSLICE3" or "XSLICE3.XEN"). */
export function subcircuitGraph(nl: FlatNetlist, instance: string): RegionGraph {
  const prefix = instance.split('.').filter(Boolean);
  const under = nl.devices.flatMap((d, i) => (prefix.every((p, k) => d.path[k] === p) && d.path.length >= prefix.length ? [i] : []));
  return graphOf(nl, under);
}
