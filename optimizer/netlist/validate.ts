// Structural checks every reader runs on the Design it built: unknown cells and models, port count
// mismatches, recursive instantiation, duplicate names, shorted rails in the top cell (errors) and
// nets only one terminal touches (warnings). Nets nothing drives are inputs, never errors.
import { own } from './own';
import type { Diagnostic } from '../errors';
import { GROUND, type Cell, type Design } from './ir';
import { solveRails, type RailSource } from './rails';
import { NetUse } from './net-use';
import { Repeats } from './name-table';

export interface ValidateOptions {
  /** What the format calls a cell: "subcircuit" (SPICE) or "module" (Verilog). */
  cellNoun?: string;
  /** Report transistors and diodes whose model is missing (SPICE decks need a .model card). */
  requireModels?: boolean;
  /**
   * Terminal counts per cell that the reader gathered while building the cells (they must match
   * the cells' final ports, devices and instances); cells without one are counted here.
   */
  netUse?: ReadonlyMap<Cell, NetUse>;
  /**
   * The hashes of each cell's device names and of its instance names, added by the reader as it
   * built the lists (so no list of millions is walked again to hash them). The two are checked
   * apart, so a reader gives them only where a device's name and an instance's can never coincide
   * (in a deck an instance's starts with X and a device's never does); cells without an entry get
   * one check over both lists.
   */
  nameHashes?: ReadonlyMap<Cell, { devices: Repeats; instances: Repeats }>;
}

const NEEDS_MODEL = new Set(['npn', 'pnp', 'nmos', 'pmos', 'diode']);

export function validateDesign(design: Design, opts: ValidateOptions = {}): Diagnostic[] {
  const noun = opts.cellNoun ?? 'subcircuit';
  const out: Diagnostic[] = [];
  const modelNames = new Set(Object.keys(design.models).map((m) => m.toUpperCase()));
  const cellNames = new Set(Object.keys(design.cells));
  const globals = new Set([GROUND, ...design.globals]);
  if (!own(design.cells, design.top)) {
    out.push({ severity: 'error', code: 'netlist.no-top', message: `top ${noun} ${design.top} is not defined` });
  }
  for (const cell of Object.values(design.cells)) {
    checkNames(cell, out, opts.nameHashes?.get(cell));
    for (const inst of cell.instances) {
      const child = own(design.cells, inst.cell);
      if (!child) {
        out.push({ severity: 'error', code: 'netlist.unknown-cell', message: `unknown ${noun} ${inst.cell} (used by ${inst.name})`, loc: inst.loc });
      } else if (child.ports.length !== inst.connections.length) {
        out.push({
          severity: 'error',
          code: 'netlist.port-count',
          message: `${inst.name} connects ${inst.connections.length} net${inst.connections.length === 1 ? '' : 's'} but ${noun} ${child.name} has ${child.ports.length} port${child.ports.length === 1 ? '' : 's'}`,
          loc: inst.loc,
        });
      }
    }
    // indexed loops over the devices: a for-of loop makes an iterator result per device until the
    // engine optimises the function, and these run once over millions
    for (let k = 0; k < cell.devices.length; k++) {
      const d = cell.devices[k];
      if (d.model !== undefined && !modelNames.has(d.model.toUpperCase())) {
        out.push({ severity: 'error', code: 'netlist.unknown-model', message: `unknown model ${d.model} (used by ${d.name})`, loc: d.loc });
      } else if (d.model === undefined && opts.requireModels && NEEDS_MODEL.has(d.kind)) {
        out.push({ severity: 'error', code: 'netlist.missing-model', message: `${d.name} needs a model`, loc: d.loc });
      }
    }
    singleTerminalNets(cell, globals, cell.name === design.top, out, opts.netUse?.get(cell));
  }
  out.push(...recursion(design, cellNames, noun));
  const top = own(design.cells, design.top);
  if (top) out.push(...topRails(top));
  return out;
}

/** @param hashes the hashes of the cell's device and instance names, where its reader gathered them */
function checkNames(cell: Cell, out: Diagnostic[], hashes?: { devices: Repeats; instances: Repeats }): void {
  // Exact comparison: deck readers have already upper-cased names, and Verilog names are case-sensitive.
  // Devices and instances share one name space; large flat cells have millions of names.
  const { devices, instances } = cell;
  const repeated = (x: { name: string; loc?: Diagnostic['loc'] }) =>
    out.push({ severity: 'error', code: 'netlist.duplicate-name', message: `duplicate name ${x.name} in ${cell.name}`, loc: x.loc });
  if (hashes !== undefined) {
    for (const k of hashes.devices.find((k) => devices[k].name)) repeated(devices[k]);
    for (const k of hashes.instances.find((k) => instances[k].name)) repeated(instances[k]);
  } else {
    const seen = new Repeats(devices.length + instances.length);
    for (const d of devices) seen.add(d.name);
    for (const i of instances) seen.add(i.name);
    const entry = (k: number) => (k < devices.length ? devices[k] : instances[k - devices.length]);
    for (const k of seen.find((k) => entry(k).name)) repeated(entry(k));
  }
  const ports = new Set<string>();
  for (const p of cell.ports) {
    if (ports.has(p)) out.push({ severity: 'error', code: 'netlist.duplicate-port', message: `port ${p} is listed twice in ${cell.name}`, loc: cell.loc });
    ports.add(p);
  }
}

function singleTerminalNets(cell: Cell, globals: Set<string>, isTop: boolean, out: Diagnostic[], given?: NetUse): void {
  let use = given;
  if (use === undefined) {
    // Each net numbered on first sight and counted in a typed array: one map probe per terminal.
    use = new NetUse(cell.ports);
    for (const d of cell.devices) {
      const ts = d.terminals;
      for (let k = 0; k < ts.length; k++) use.touch(ts[k]);
    }
    for (const i of cell.instances) for (const t of i.connections) use.touch(t);
  }
  const counts = use.counts;
  const lonely = new Set<string>();
  const names = use.names;
  // A supply net (a Verilog constant such as 1'b1, or a supply0/supply1 net) is a rail: one tie-off is normal.
  const kinds = cell.netKinds;
  const isSupply = (n: string) => kinds !== undefined && (kinds[n] === 'supply0' || kinds[n] === 'supply1');
  for (let i = 0; i < names.length; i++) if (counts[i] === 1 && !globals.has(names[i]) && !isSupply(names[i])) lonely.add(names[i]);
  if (lonely.size === 0) return;
  const ports = new Set(cell.ports);
  // A second walk finds where each lonely net is used; lonely nets are few, so this stays cheap.
  const where = new Map<string, Diagnostic['loc']>();
  for (const d of cell.devices) for (const t of d.terminals) if (lonely.has(t)) where.set(t, d.loc);
  for (const i of cell.instances) for (const t of i.connections) if (lonely.has(t)) where.set(t, i.loc);
  for (const net of lonely) {
    if (ports.has(net)) {
      if (!isTop) out.push({ severity: 'warning', code: 'netlist.unused-port', message: `port ${net} of ${cell.name} connects to nothing inside it`, loc: cell.loc });
      continue;
    }
    out.push({ severity: 'warning', code: 'netlist.single-terminal', message: `net ${net} in ${cell.name} touches only one terminal`, loc: where.get(net) });
  }
}

/** Iterative depth-first search so a deep chain of cells cannot overflow the stack. */
function recursion(design: Design, cellNames: Set<string>, noun: string): Diagnostic[] {
  const out: Diagnostic[] = [];
  const state = new Map<string, 1 | 2>(); // 1 on the path, 2 done
  for (const start of cellNames) {
    if (state.has(start)) continue;
    const stack: { cell: string; next: number }[] = [{ cell: start, next: 0 }];
    state.set(start, 1);
    while (stack.length > 0) {
      const top = stack[stack.length - 1];
      const insts = design.cells[top.cell].instances;
      if (top.next >= insts.length) {
        state.set(top.cell, 2);
        stack.pop();
        continue;
      }
      const inst = insts[top.next++];
      if (!cellNames.has(inst.cell)) continue;
      const s = state.get(inst.cell);
      if (s === 1) {
        const from = stack.findIndex((f) => f.cell === inst.cell);
        const cycle = [...stack.slice(from).map((f) => f.cell), inst.cell].join(' → ');
        out.push({ severity: 'error', code: 'netlist.recursive', message: `recursive instantiation of ${noun} ${inst.cell}: ${cycle}`, loc: inst.loc });
      } else if (s === undefined) {
        state.set(inst.cell, 1);
        stack.push({ cell: inst.cell, next: 0 });
      }
    }
  }
  return out;
}

function topRails(top: Cell): Diagnostic[] {
  const sources: RailSource<string>[] = [];
  for (let k = 0; k < top.devices.length; k++) {
    const d = top.devices[k];
    if (d.kind === 'vsource' && d.value !== undefined && d.waveform === undefined) {
      sources.push({ name: d.name, plus: d.terminals[0], minus: d.terminals[1], volts: d.value, loc: d.loc });
    }
  }
  return solveRails(sources, GROUND, (n) => n).problems.map((p) => ({ severity: 'error' as const, ...p }));
}
