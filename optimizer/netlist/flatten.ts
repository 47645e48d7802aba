// Flattens a Design into a FlatNetlist: instance paths kept on every device, nets named by their
// highest-level appearance ("XSLICE3.N5"), globals and ground shared, rails solved from DC
// sources. Limits are checked on the memoised hierarchy before any device is copied.
import { own } from './own';
import { InputError } from '../errors';
import { GROUND, type Cell, type Design, type Device, type FlatDevice, type FlatNet, type FlatNetlist, type Rail } from './ir';
import { hierarchyStats } from './hierarchy';
import { NameTable } from './name-table';
import { readerNumbering, type CellNumbering, type IdSequence } from './read-numbering';
import { withDefaults, type Limits } from './limits';
import { solveRails, type RailSource } from './rails';
import { empty } from './empty';

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
  const devices: FlatDevice[] = new Array(total);
  let nDev = 0;
  const newNet = (name: string, kind: FlatNet['kind']): number => {
    const id = nets.length;
    const net: FlatNet = { id, name };
    if (kind) net.kind = kind;
    nets.push(net);
    return id;
  };
  newNet(GROUND, undefined);
  const globals = new Map<string, number>([[GROUND, 0]]);
  for (const g of design.globals) if (!globals.has(g)) globals.set(g, newNet(g, own(design.cells[design.top].netKinds, g)));

  const compiled = new Map<string, CompiledCell>();
  const compiledOf = (cell: Cell): CompiledCell => {
    let c = compiled.get(cell.name);
    if (!c) {
      c = compileCell(cell, globals);
      compiled.set(cell.name, c);
    }
    return c;
  };

  /**
   * Gives an instance's local nets their flat ids: ports from the parent (the first `portLen`
   * entries of portIds), globals shared, the rest new. Plain arrays: a typed array per instance
   * costs several times more to allocate, and a large design has hundreds of thousands.
   */
  const bind = (c: CompiledCell, prefix: string, portIds: readonly number[] | null, portLen: number): number[] => {
    const ids: number[] = [];
    for (let i = 0; i < c.nets.length; i++) {
      const g = c.globalOf[i];
      if (g >= 0) ids.push(g);
      else if (portIds && i < c.portCount) ids.push(i < portLen ? portIds[i] : 0);
      else ids.push(newNet(prefix + c.nets[i], c.kinds[i]));
    }
    return ids;
  };
  /** Flat ids of the instance being bound, reused instance after instance (bind copies them). */
  const portScratch: number[] = [];

  // Explicit stack instead of recursion: depth is bounded by the limit, but this keeps the walk
  // independent of the engine's call-stack size. Each cell's local nets are numbered once
  // (compileCell), so an instance costs array indexing, not a name lookup per terminal.
  interface Frame {
    cell: Cell;
    c: CompiledCell;
    prefix: string;
    path: string[];
    ids: number[];
  }
  const top = design.cells[design.top];
  const topC = compiledOf(top);
  const frames: Frame[] = [{ cell: top, c: topC, prefix: '', path: [], ids: bind(topC, '', null, 0) }];
  const ports = top.ports.map((_, i) => frames[0].ids[i]);

  while (frames.length > 0) {
    const f = frames.pop()!;
    const { cell, c, ids } = f;
    const { devTermIds, devTermStart } = c;
    for (let k = 0; k < cell.devices.length; k++) {
      const d = cell.devices[k];
      const from = devTermStart[k];
      const n = devTermStart[k + 1] - from;
      const terminals = terminalList(ids, devTermIds, from, n);
      devices[nDev++] = flatDevice(d, f.prefix + d.name, terminals, f.path, cell.name);
    }
    // Children pushed in reverse so devices come out in file order.
    for (let k = cell.instances.length - 1; k >= 0; k--) {
      const inst = cell.instances[k];
      const child = design.cells[inst.cell];
      const cc = compiledOf(child);
      const from = c.instConnStart[k];
      const portLen = c.instConnStart[k + 1] - from;
      empty(portScratch);
      for (let i = 0; i < portLen; i++) portScratch.push(ids[c.instConnIds[from + i]]);
      const prefix = f.prefix + inst.name + '.';
      frames.push({ cell: child, c: cc, prefix, path: [...f.path, inst.name], ids: bind(cc, prefix, portScratch, portLen) });
    }
  }
  devices.length = nDev;

  const railList = rails(devices, nets);
  // The name index is built on first use: extraction and simulation walk nets by id and never ask,
  // and on a large design it is one of the costliest structures to build.
  let netByName: Map<string, number> | undefined;
  return {
    title: design.title,
    devices,
    nets,
    get netByName(): Map<string, number> {
      return (netByName ??= nameIndex(nets));
    },
    set netByName(m: Map<string, number>) {
      netByName = m;
    },
    rails: railList,
    ports,
    models: design.models,
  };
}

/** Net name → id, in id order (a later net of the same name wins, as when nets were added one by one). */
function nameIndex(nets: readonly FlatNet[]): Map<string, number> {
  const m = new Map<string, number>();
  for (let i = 0; i < nets.length; i++) m.set(nets[i].name, i);
  return m;
}

interface CompiledCell {
  /** Local net names, the cell's ports first (index i < portCount is port i). */
  nets: string[];
  portCount: number;
  kinds: FlatNet['kind'][];
  /** Flat id of a local net that is global (ground, .global), else -1. */
  globalOf: Int32Array;
  /** Local net of every device terminal, packed: device k's are devTermIds[devTermStart[k] ..< devTermStart[k+1]]. */
  devTermIds: Int32Array;
  devTermStart: Int32Array;
  /** The same for instance connections. */
  instConnIds: Int32Array;
  instConnStart: Int32Array;
}

/**
 * A flat device with every field of its source device. The common shapes are written as whole
 * literals (same key order as adding the optional fields one by one) so a million devices carry
 * no separate property store each.
 */
function flatDevice(d: Device, name: string, terminals: number[], path: string[], cell: string): FlatDevice {
  const { kind, params, loc } = d;
  if (d.op === undefined && d.waveform === undefined && loc !== undefined) {
    if (d.model === undefined && d.value !== undefined) return { name, kind, terminals, params, path, cell, value: d.value, loc };
    if (d.model !== undefined && d.value === undefined) return { name, kind, terminals, params, path, cell, model: d.model, loc };
  }
  const fd: FlatDevice = { name, kind, terminals, params, path, cell };
  if (d.op !== undefined) fd.op = d.op;
  if (d.value !== undefined) fd.value = d.value;
  if (d.model !== undefined) fd.model = d.model;
  if (d.waveform !== undefined) fd.waveform = d.waveform;
  if (loc !== undefined) fd.loc = loc;
  return fd;
}

/**
 * A device's flat terminal ids. The usual two-, three- and four-terminal lists are written as
 * literals: packed arrays (no holes for every later read to check) that the engine can allocate
 * straight into long-lived memory once it sees they all survive.
 */
function terminalList(ids: readonly number[], local: Int32Array, from: number, n: number): number[] {
  switch (n) {
    case 2:
      return [ids[local[from]], ids[local[from + 1]]];
    case 3:
      return [ids[local[from]], ids[local[from + 1]], ids[local[from + 2]]];
    case 4:
      return [ids[local[from]], ids[local[from + 1]], ids[local[from + 2]], ids[local[from + 3]]];
    default: {
      const out: number[] = [];
      for (let i = 0; i < n; i++) out.push(ids[local[from + i]]);
      return out;
    }
  }
}

/** Where each list starts when the lists are packed one after another (one more entry: the total). */
function offsetsOf(lists: readonly (readonly string[])[]): Int32Array {
  const start = new Int32Array(lists.length + 1);
  for (let k = 0; k < lists.length; k++) start[k + 1] = start[k] + lists[k].length;
  return start;
}

/** Local net indices of some name lists, packed into one array with start offsets. */
function pack(lists: string[][], idx: (n: string) => number): { ids: Int32Array; start: Int32Array } {
  const start = offsetsOf(lists);
  const ids = new Int32Array(start[lists.length]);
  let at = 0;
  for (const l of lists) for (let i = 0; i < l.length; i++) ids[at++] = idx(l[i]);
  return { ids, start };
}

function compileCell(cell: Cell, globals: Map<string, number>): CompiledCell {
  const given = readerNumbering(cell);
  const local = (given && fromReader(cell, given)) ?? numberLocally(cell);
  const nets = local.nets;
  const globalOf = new Int32Array(nets.length);
  for (let i = 0; i < nets.length; i++) globalOf[i] = globals.get(nets[i]) ?? -1;
  const kinds = cell.netKinds === undefined ? new Array<FlatNet['kind']>(nets.length).fill(undefined) : nets.map((n) => own(cell.netKinds, n));
  return { ...local, globalOf, kinds };
}

/** A cell's local nets and where each terminal and connection lands among them. */
type LocalNets = Pick<CompiledCell, 'nets' | 'portCount' | 'devTermIds' | 'devTermStart' | 'instConnIds' | 'instConnStart'>;

/** Numbers the local nets by name: ports, then device terminals, then instance connections, first seen first. */
function numberLocally(cell: Cell): LocalNets {
  // a typed-array table: a large flat cell looks up every terminal's net here
  const index = new NameTable();
  const idx = (n: string): number => index.add(n);
  for (const p of cell.ports) idx(p);
  const portCount = index.size;
  if (portCount !== cell.ports.length) {
    const dup = cell.ports.find((p, i) => cell.ports.indexOf(p) !== i);
    throw InputError.at('netlist.duplicate-port', `port ${dup} is listed twice in ${cell.name}`, cell.loc);
  }
  const dev = pack(
    cell.devices.map((d) => d.terminals),
    idx,
  );
  const inst = pack(
    cell.instances.map((i) => i.connections),
    idx,
  );
  return { nets: index.names, portCount, devTermIds: dev.ids, devTermStart: dev.start, instConnIds: inst.ids, instConnStart: inst.start };
}

/**
 * The same numbering as numberLocally, taken from the reader's: its numbers are renumbered in the
 * order numberLocally would meet them, with no name hashed. Undefined when the numbering no longer
 * describes the cell (edited since it was read: other ports or terminals), which is checked
 * terminal by terminal — a comparison of the very string the reader handed out, cheap. The
 * numbering depends only on the sequence of terminal names, so a sequence that still matches
 * gives the right answer whatever else changed.
 */
function fromReader(cell: Cell, given: CellNumbering): LocalNets | undefined {
  const { names } = given;
  const { ports } = cell;
  if (names.length < ports.length) return undefined;
  // reader's number → local number, -1 until met
  const local = new Int32Array(names.length).fill(-1);
  const nets: string[] = [];
  // The reader numbered the ports first, each once: port i is its net i.
  for (let i = 0; i < ports.length; i++) {
    if (names[i] !== ports[i]) return undefined;
    local[i] = nets.length;
    nets.push(names[i]);
  }
  const renumber = (lists: readonly (readonly string[])[], seq: IdSequence): { ids: Int32Array; start: Int32Array } | undefined => {
    const start = offsetsOf(lists);
    if (start[lists.length] !== seq.length) return undefined;
    const ids = new Int32Array(seq.length);
    const { chunks } = seq;
    let c = 0;
    let chunk = chunks[0];
    let at = 0;
    let out = 0;
    for (let k = 0; k < lists.length; k++) {
      const ts = lists[k];
      for (let j = 0; j < ts.length; j++) {
        if (at === chunk.length) {
          chunk = chunks[++c];
          at = 0;
        }
        const id = chunk[at++];
        if (ts[j] !== names[id]) return undefined;
        let n = local[id];
        if (n < 0) {
          n = local[id] = nets.length;
          nets.push(names[id]);
        }
        ids[out++] = n;
      }
    }
    return { ids, start };
  };
  const dev = renumber(
    cell.devices.map((d) => d.terminals),
    given.devTerms,
  );
  if (dev === undefined) return undefined;
  const inst = renumber(
    cell.instances.map((i) => i.connections),
    given.instConns,
  );
  if (inst === undefined) return undefined;
  return { nets, portCount: ports.length, devTermIds: dev.ids, devTermStart: dev.start, instConnIds: inst.ids, instConnStart: inst.start };
}

function rails(devices: FlatDevice[], nets: FlatNet[]): Rail[] {
  const sources: RailSource<number>[] = [];
  // indexed: a for-of loop run once over millions makes an iterator result per device
  for (let k = 0; k < devices.length; k++) {
    const d = devices[k];
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
