// Flattens a Design into a FlatNetlist: instance paths kept on every device, nets named by their
// highest-level appearance ("XSLICE3.N5"), globals and ground shared, rails solved from DC
// sources. Limits are checked on the memoised hierarchy before any device is copied.
import { InputError } from '../errors';
import { GROUND, type Cell, type Design, type FlatDevice, type FlatNet, type FlatNetlist, type Rail } from './ir';
import { hierarchyStats } from './hierarchy';
import { withDefaults, type Limits } from './limits';
import { solveRails, type RailSource } from './rails';

/**
 * Voltage given to a Verilog supply1 net: gate-level designs carry no voltages, and rail analyses
 * expect a positive supply; 5 V is the common logic supply (common practice).
 */
export const SUPPLY1_VOLTS = 5;

export function flatten(design: Design, limits: Partial<Limits> = {}): FlatNetlist {
  const lim = withDefaults(limits);
  const noun = design.format === 'verilog' ? 'module' : 'subcircuit';
  const stats = hierarchyStats(design, noun);
  const total = stats.flatDevices.get(design.top)!;
  if (total > lim.maxDevices) {
    throw InputError.at(
      'limits.devices',
      `the design would have ${total.toLocaleString('en-US')} devices after flattening; the limit is ${lim.maxDevices.toLocaleString('en-US')}`,
    );
  }
  const depth = stats.depth.get(design.top)!;
  if (depth > lim.maxDepth) {
    throw InputError.at('limits.depth', `the hierarchy is ${depth} levels deep; the limit is ${lim.maxDepth}`);
  }

  const nets: FlatNet[] = [];
  const netByName = new Map<string, number>();
  const devices: FlatDevice[] = new Array(total);
  let nDev = 0;
  const newNet = (name: string, kind: FlatNet['kind']): number => {
    const id = nets.length;
    const net: FlatNet = { id, name };
    if (kind) net.kind = kind;
    nets.push(net);
    netByName.set(name, id);
    return id;
  };
  newNet(GROUND, undefined);
  const globals = new Map<string, number>([[GROUND, 0]]);
  for (const g of design.globals) if (!globals.has(g)) globals.set(g, newNet(g, design.cells[design.top].netKinds?.[g]));

  // Explicit stack instead of recursion: depth is bounded by the limit, but this keeps the
  // walk's cost independent of the engine's call-stack size.
  interface Frame {
    cell: Cell;
    prefix: string;
    path: string[];
    local: Map<string, number>;
  }
  const top = design.cells[design.top];
  const frames: Frame[] = [{ cell: top, prefix: '', path: [], local: new Map() }];
  const ports = top.ports.map((p) => resolve(frames[0], p));

  function resolve(f: Frame, name: string): number {
    const g = globals.get(name);
    if (g !== undefined) return g;
    let id = f.local.get(name);
    if (id === undefined) {
      id = newNet(f.prefix + name, f.cell.netKinds?.[name]);
      f.local.set(name, id);
    }
    return id;
  }

  while (frames.length > 0) {
    const f = frames.pop()!;
    for (const d of f.cell.devices) {
      const terminals = new Array<number>(d.terminals.length);
      for (let i = 0; i < d.terminals.length; i++) terminals[i] = resolve(f, d.terminals[i]);
      const fd: FlatDevice = { name: f.prefix + d.name, kind: d.kind, terminals, params: d.params, path: f.path, cell: f.cell.name };
      if (d.op !== undefined) fd.op = d.op;
      if (d.value !== undefined) fd.value = d.value;
      if (d.model !== undefined) fd.model = d.model;
      if (d.waveform !== undefined) fd.waveform = d.waveform;
      if (d.loc !== undefined) fd.loc = d.loc;
      devices[nDev++] = fd;
    }
    // Children pushed in reverse so devices come out in file order.
    for (let k = f.cell.instances.length - 1; k >= 0; k--) {
      const inst = f.cell.instances[k];
      const child = design.cells[inst.cell];
      const local = new Map<string, number>();
      for (let i = 0; i < child.ports.length; i++) local.set(child.ports[i], resolve(f, inst.connections[i]));
      frames.push({ cell: child, prefix: f.prefix + inst.name + '.', path: [...f.path, inst.name], local });
    }
  }
  devices.length = nDev;

  return { title: design.title, devices, nets, netByName, rails: rails(devices, nets), ports, models: design.models };
}

function rails(devices: FlatDevice[], nets: FlatNet[]): Rail[] {
  const sources: RailSource<number>[] = [];
  for (const d of devices) {
    if (d.kind === 'vsource' && d.value !== undefined && d.waveform === undefined) {
      sources.push({ name: d.name, plus: d.terminals[0], minus: d.terminals[1], volts: d.value, loc: d.loc });
    }
  }
  const solved = solveRails(sources, 0, (id) => nets[id].name);
  if (solved.problems.length > 0) {
    throw new InputError(solved.problems.map((p) => ({ severity: 'error' as const, ...p })));
  }
  const out: Rail[] = [];
  for (const [net, volts] of solved.volts) {
    const r: Rail = { net, volts };
    const s = solved.sourceOf.get(net);
    if (s !== undefined) r.source = s;
    out.push(r);
  }
  for (const n of nets) {
    if ((n.kind === 'supply0' || n.kind === 'supply1') && !solved.volts.has(n.id)) {
      out.push({ net: n.id, volts: n.kind === 'supply1' ? SUPPLY1_VOLTS : 0 });
    }
  }
  return out.sort((a, b) => a.net - b.net);
}
