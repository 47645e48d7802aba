// Checks an edit against the netlist it targets and lists what it touches, so rules that break
// their contract are caught before anything is applied and overlapping proposals can be found.
import { TERMINAL_NAMES, type DeviceKind, type FlatNetlist } from '../netlist/ir';
import { NameTable } from '../netlist/name-table';
import type { Edit } from '../rules/types';

/** Look-ups by name, as a Map's get and has. */
export interface NameIndex {
  get(name: string): number | undefined;
  has(name: string): boolean;
}

/** Device names numbered in a typed-array table: a million-device Map is slow to build and heavy. */
class DeviceNames implements NameIndex {
  constructor(
    private readonly table: NameTable,
    /** Device index by name number (the last device of a repeated name, as a Map built in order). */
    private readonly at: Int32Array,
  ) {}
  get(name: string): number | undefined {
    const id = this.table.get(name);
    return id < 0 ? undefined : this.at[id];
  }
  has(name: string): boolean {
    return this.table.get(name) >= 0;
  }
}

const indexCache = new WeakMap<FlatNetlist, NameIndex>();

/** Device index by name, built once per netlist (rules check thousands of edits on one design). */
export function deviceIndex(nl: FlatNetlist): NameIndex {
  let m = indexCache.get(nl);
  if (!m) {
    const table = new NameTable(nl.devices.length);
    const at = new Int32Array(nl.devices.length);
    for (let i = 0; i < nl.devices.length; i++) at[table.add(nl.devices[i].name)] = i;
    m = new DeviceNames(table, at);
    indexCache.set(nl, m);
  }
  return m;
}

const railCache = new WeakMap<FlatNetlist, Set<string>>();

function railNames(nl: FlatNetlist): Set<string> {
  let s = railCache.get(nl);
  if (!s) {
    s = new Set(nl.rails.map((r) => nl.nets[r.net].name));
    railCache.set(nl, s);
  }
  return s;
}

/** What an edit removes or modifies: the basis of overlap detection. */
export interface Touched {
  devices: Set<string>;
  nets: Set<string>;
  /** Names of devices it adds (two proposals adding the same name collide). */
  added: Set<string>;
}

export function touched(edit: Edit): Touched {
  return {
    devices: new Set([...edit.removeDevices, ...edit.reconnect.map((r) => r.device)]),
    nets: new Set(edit.mergeNets.flatMap((m) => [m.keep, m.remove])),
    added: new Set(edit.addDevices.map((d) => d.name)),
  };
}

/** Shared devices and nets of two touched sets (empty when they do not overlap). */
export function overlapOf(a: Touched, b: Touched): { devices: string[]; nets: string[] } {
  const devices = [...a.devices].filter((d) => b.devices.has(d));
  for (const d of a.added) if (b.added.has(d)) devices.push(d);
  const nets = [...a.nets].filter((n) => b.nets.has(n));
  return { devices, nets };
}

/** Terminal counts a device of each kind may have. */
export function terminalCounts(kind: DeviceKind): number[] {
  if (kind === 'gate') return [];
  const names = TERMINAL_NAMES[kind];
  // Bipolar transistors may omit the substrate; everything else has a fixed count.
  return kind === 'npn' || kind === 'pnp' ? [3, 4] : [names.length];
}

/** Problems that make an edit inapplicable to `nl` (empty when it is well formed). */
export function editProblems(nl: FlatNetlist, edit: Edit): string[] {
  const problems: string[] = [];
  const byName = deviceIndex(nl);
  const removed = new Set<string>();
  for (const name of edit.removeDevices) {
    if (!byName.has(name)) problems.push(`removes unknown device ${name}`);
    if (removed.has(name)) problems.push(`removes ${name} twice`);
    removed.add(name);
  }
  for (const r of edit.reconnect) {
    const i = byName.get(r.device);
    if (i === undefined) problems.push(`reconnects unknown device ${r.device}`);
    else if (removed.has(r.device)) problems.push(`reconnects ${r.device}, which it also removes`);
    else if (!Number.isInteger(r.terminal) || r.terminal < 0 || r.terminal >= nl.devices[i].terminals.length) {
      problems.push(`reconnects terminal ${r.terminal} of ${r.device}, which has ${nl.devices[i].terminals.length}`);
    }
    if (!r.net) problems.push(`reconnects ${r.device} to an empty net name`);
  }
  const railNets = railNames(nl);
  for (const m of edit.mergeNets) {
    if (!nl.netByName.has(m.keep)) problems.push(`merges into unknown net ${m.keep}`);
    if (!nl.netByName.has(m.remove)) problems.push(`merges unknown net ${m.remove}`);
    if (m.keep === m.remove) problems.push(`merges net ${m.keep} into itself`);
    if (railNets.has(m.remove) && railNets.has(m.keep)) problems.push(`merges two rails ${m.keep} and ${m.remove}`);
  }
  const added = new Set<string>();
  for (const d of edit.addDevices) {
    if ((byName.has(d.name) && !removed.has(d.name)) || added.has(d.name)) problems.push(`adds ${d.name}, a name already in use`);
    added.add(d.name);
    const counts = terminalCounts(d.kind);
    if (d.kind === 'gate') {
      if (!d.op) problems.push(`adds gate ${d.name} without an operation`);
      if (d.terminals.length < 1) problems.push(`adds gate ${d.name} without terminals`);
    } else if (!counts.includes(d.terminals.length)) {
      problems.push(`adds ${d.kind} ${d.name} with ${d.terminals.length} terminals (needs ${counts.join(' or ')})`);
    }
    if (d.terminals.some((t) => !t)) problems.push(`adds ${d.name} with an empty net name`);
  }
  return problems;
}
