// Part counts: transistors, resistors, diodes, capacitors and gates, in total, per subcircuit and
// per instance path, computed on the hierarchy (memoised) so counting never needs a flattened copy.
// Sources are stimulus and supplies, not parts. A gate-level pullup/pulldown is a resistor on a board.
import type { Device, DeviceKind, FlatNetlist, GateOp } from './ir';
import type { Design } from './ir';
import { hierarchyStats, occurrences } from './hierarchy';

export interface PartCounts {
  transistors: number;
  resistors: number;
  diodes: number;
  capacitors: number;
  gates: number;
}

export interface CellCounts {
  /** Parts written directly in the cell. */
  own: PartCounts;
  /** Parts of one instance of the cell, its sub-instances included. */
  total: PartCounts;
  /** How many times the cell occurs in the flattened design. */
  instances: number;
}

export interface CountReport extends PartCounts {
  bySubcircuit: Record<string, CellCounts>;
  /** Instance path ("X3.XEN") → parts of that instance; capped at `maxInstances` entries. */
  byInstance: Record<string, PartCounts>;
  byInstanceTruncated: boolean;
}

export function zeroCounts(): PartCounts {
  return { transistors: 0, resistors: 0, diodes: 0, capacitors: 0, gates: 0 };
}

const BUCKET: Record<DeviceKind, keyof PartCounts | null> = {
  npn: 'transistors',
  pnp: 'transistors',
  nmos: 'transistors',
  pmos: 'transistors',
  resistor: 'resistors',
  diode: 'diodes',
  capacitor: 'capacitors',
  vsource: null,
  isource: null,
  gate: 'gates',
};

export function bucketOf(kind: DeviceKind, op?: GateOp): keyof PartCounts | null {
  if (kind === 'gate' && (op === 'pullup' || op === 'pulldown')) return 'resistors';
  return BUCKET[kind];
}

function add(into: PartCounts, from: PartCounts, times = 1): void {
  into.transistors += from.transistors * times;
  into.resistors += from.resistors * times;
  into.diodes += from.diodes * times;
  into.capacitors += from.capacitors * times;
  into.gates += from.gates * times;
}

function countDevices(devices: Iterable<Pick<Device, 'kind' | 'op'>>): PartCounts {
  const c = zeroCounts();
  for (const d of devices) {
    const b = bucketOf(d.kind, d.op);
    if (b) c[b]++;
  }
  return c;
}

/** Counts of a flattened netlist (every device once). */
export function countFlat(flat: FlatNetlist): PartCounts {
  return countDevices(flat.devices);
}

export function countParts(design: Design, maxInstances = 10_000): CountReport {
  const stats = hierarchyStats(design, design.format === 'verilog' ? 'module' : 'subcircuit');
  const occ = occurrences(design, stats);
  const totals = new Map<string, PartCounts>();
  const bySubcircuit: Record<string, CellCounts> = {};
  for (const name of stats.order) {
    const cell = design.cells[name];
    const own = countDevices(cell.devices);
    const total = { ...own };
    for (const inst of cell.instances) add(total, totals.get(inst.cell)!);
    totals.set(name, total);
    if (name !== design.top) bySubcircuit[name] = { own, total, instances: occ.get(name) ?? 0 };
  }
  const byInstance: Record<string, PartCounts> = {};
  let listed = 0;
  let truncated = false;
  // Breadth-first so a capped listing shows the upper levels of the hierarchy first.
  const queue: { cell: string; prefix: string }[] = [{ cell: design.top, prefix: '' }];
  for (let qi = 0; qi < queue.length && !truncated; qi++) {
    const { cell, prefix } = queue[qi];
    for (const inst of design.cells[cell].instances) {
      if (listed >= maxInstances) {
        truncated = true;
        break;
      }
      const p = prefix + inst.name;
      byInstance[p] = totals.get(inst.cell)!;
      listed++;
      queue.push({ cell: inst.cell, prefix: p + '.' });
    }
  }
  return { ...totals.get(design.top)!, bySubcircuit, byInstance, byInstanceTruncated: truncated };
}
