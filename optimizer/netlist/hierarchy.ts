// Walks a design's cell hierarchy once, bottom-up, without recursion: flattened device count,
// depth and occurrence count per cell, memoised, so a design that would flatten to 10^12 devices
// is measured (and refused) in time linear in the size of the file, not of the flattened result.
import { own } from './own';
import { InputError } from '../errors';
import type { Design } from './ir';

export interface HierarchyStats {
  /** Devices in each cell after flattening it (its own plus its instances'). */
  flatDevices: Map<string, number>;
  /** Depth of each cell's subtree (a cell with no instances has depth 1). */
  depth: Map<string, number>;
  /** Cells reachable from the top, children before parents. */
  order: string[];
}

export function hierarchyStats(design: Design, noun = 'subcircuit'): HierarchyStats {
  const flatDevices = new Map<string, number>();
  const depth = new Map<string, number>();
  const order: string[] = [];
  const onPath = new Set<string>();
  if (!own(design.cells, design.top)) throw InputError.at('netlist.no-top', `top ${noun} ${design.top} is not defined`);
  const stack: { cell: string; next: number }[] = [{ cell: design.top, next: 0 }];
  onPath.add(design.top);
  while (stack.length > 0) {
    const frame = stack[stack.length - 1];
    const cell = design.cells[frame.cell];
    if (frame.next < cell.instances.length) {
      const inst = cell.instances[frame.next++];
      const child = own(design.cells, inst.cell);
      if (!child) throw InputError.at('netlist.unknown-cell', `unknown ${noun} ${inst.cell} (used by ${inst.name})`, inst.loc);
      if (child.ports.length !== inst.connections.length) {
        throw InputError.at(
          'netlist.port-count',
          `${inst.name} connects ${inst.connections.length} nets but ${noun} ${child.name} has ${child.ports.length} ports`,
          inst.loc,
        );
      }
      if (onPath.has(inst.cell)) {
        throw InputError.at('netlist.recursive', `recursive instantiation of ${noun} ${inst.cell}`, inst.loc);
      }
      if (!flatDevices.has(inst.cell)) {
        onPath.add(inst.cell);
        stack.push({ cell: inst.cell, next: 0 });
      }
      continue;
    }
    let n = cell.devices.length;
    let d = 1;
    for (const inst of cell.instances) {
      n += flatDevices.get(inst.cell)!;
      d = Math.max(d, 1 + depth.get(inst.cell)!);
    }
    flatDevices.set(frame.cell, n);
    depth.set(frame.cell, d);
    order.push(frame.cell);
    onPath.delete(frame.cell);
    stack.pop();
  }
  return { flatDevices, depth, order };
}

/** How many times each reachable cell occurs in the flattened design (the top occurs once). */
export function occurrences(design: Design, stats: HierarchyStats): Map<string, number> {
  const occ = new Map<string, number>([[design.top, 1]]);
  for (let i = stats.order.length - 1; i >= 0; i--) {
    const name = stats.order[i];
    const k = occ.get(name) ?? 0;
    for (const inst of design.cells[name].instances) occ.set(inst.cell, (occ.get(inst.cell) ?? 0) + k);
  }
  return occ;
}
