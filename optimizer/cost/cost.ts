// Part counts by kind, board area and price of a netlist or an edit, savings per proposal, and a
// board's use of its budget. For gate-level designs the transistor, resistor and diode figures
// are those of each gate mapped to a target family (static CMOS unless stated).
import { InternalError } from '../errors';
import { addParts, gateParts, type MapFamily, type PartCount, ZERO_PARTS } from '../logic/family-parts';
import type { DeviceKind, FlatNetlist, GateOp } from '../netlist/ir';
import { deviceIndex } from '../rewrite/edits';
import type { Edit } from '../rules/types';
import { DEFAULT_PARTS_TABLE, PART_KINDS, type PartKind, type PartsTable } from './parts-table';

export type KindCounts = Record<PartKind, number>;

export const zeroKinds = (): KindCounts => Object.fromEntries(PART_KINDS.map((k) => [k, 0])) as KindCounts;

export interface Savings {
  transistors: number;
  resistors: number;
  diodes: number;
  capacitors: number;
  gates: number;
  areaMm2: number;
  cost: number;
}

export interface Budget {
  parts?: number;
  areaMm2?: number;
  cost?: number;
}

type DeviceLike = { kind: DeviceKind; op?: GateOp; terminals: readonly unknown[] };

/** Part kind a device is bought as; sources are not parts. A gate-level pull-up is a resistor. */
export function partKindOf(d: { kind: DeviceKind; op?: GateOp }): PartKind | null {
  if (d.kind === 'vsource' || d.kind === 'isource') return null;
  if (d.kind === 'gate' && (d.op === 'pullup' || d.op === 'pulldown')) return 'resistor';
  return d.kind;
}

export function countKinds(devices: Iterable<{ kind: DeviceKind; op?: GateOp }>): KindCounts {
  const c = zeroKinds();
  for (const d of devices) {
    const k = partKindOf(d);
    if (k) c[k]++;
  }
  return c;
}

/**
 * Discrete parts a gate-level primitive costs in `family` (inverter, NAND, NOR native; AND/OR as
 * NAND/NOR plus an inverter; XOR/XNOR as four NAND-2; tri-state buffer as a buffer plus a switch).
 * CMOS counts after Weste & Harris (from memory): tri-state inverter 4, latch of two transmission
 * gates and two inverters plus a clock inverter 10 (common practice).
 */
export function gateEquivalent(op: GateOp, fanIn: number, family: MapFamily): PartCount {
  const n = Math.max(1, fanIn);
  const nand = family === 'rtl' ? 'nor' : 'nand';
  const nor = family === 'dtl' ? 'nand' : 'nor';
  const g = (o: 'not' | 'nand' | 'nor', k: number) => gateParts(family, o, k);
  switch (op) {
    case 'not':
      return g('not', 1);
    case 'buf':
      return addParts(g('not', 1), g('not', 1));
    case 'nand':
      return family === 'rtl' ? addParts(addParts(g('nor', n), g('not', 1), n), g('not', 1)) : g('nand', n);
    case 'nor':
      return family === 'dtl' ? addParts(addParts(g('nand', n), g('not', 1), n), g('not', 1)) : g('nor', n);
    case 'and':
      return addParts(gateEquivalent('nand', n, family), g('not', 1));
    case 'or':
      return addParts(gateEquivalent('nor', n, family), g('not', 1));
    case 'xor':
    case 'xnor': {
      // n-input parity as a chain of two-input stages of four NAND-2 each (+ inverter for xnor).
      const stage = addParts({ ...ZERO_PARTS }, g(nand, 2), 4);
      const chain = addParts({ ...ZERO_PARTS }, stage, Math.max(1, n - 1));
      return op === 'xnor' ? addParts(chain, g('not', 1)) : chain;
    }
    case 'bufif0':
    case 'bufif1':
    case 'notif0':
    case 'notif1':
      if (family === 'cmos' || family === 'gate') return { transistors: op.startsWith('not') ? 4 : 6, resistors: 0, diodes: 0, gates: 1 };
      return addParts(g(nor, 2), g('not', 1));
    case 'latch':
      return family === 'cmos' || family === 'gate' ? { transistors: 10, resistors: 0, diodes: 0, gates: 1 } : addParts({ ...ZERO_PARTS }, g(nand, 2), 4);
    case 'dff':
      return family === 'cmos' || family === 'gate' ? { transistors: 18, resistors: 0, diodes: 0, gates: 1 } : addParts({ ...ZERO_PARTS }, g(nand, 2), 8);
    case 'pullup':
    case 'pulldown':
      return { transistors: 0, resistors: 1, diodes: 0, gates: 0 };
  }
  throw new InternalError(`no part equivalent for gate ${op as string}`);
}

/** Parts of a set of devices: gates counted as gates and, mapped to `family`, as discrete parts. */
export function partsOf(devices: Iterable<DeviceLike>, family: MapFamily = 'cmos', table: PartsTable = DEFAULT_PARTS_TABLE): Savings {
  const s: Savings = { transistors: 0, resistors: 0, diodes: 0, capacitors: 0, gates: 0, areaMm2: 0, cost: 0 };
  for (const d of devices) {
    const kind = partKindOf(d);
    if (!kind) continue;
    s.areaMm2 += table.parts[kind].areaMm2;
    s.cost += table.parts[kind].price;
    if (d.kind === 'gate') {
      if (kind === 'gate') s.gates++;
      const eq = gateEquivalent(d.op ?? 'buf', Math.max(1, d.terminals.length - 1), family);
      s.transistors += eq.transistors;
      s.resistors += eq.resistors;
      s.diodes += eq.diodes;
      continue;
    }
    if (kind === 'npn' || kind === 'pnp' || kind === 'nmos' || kind === 'pmos') s.transistors++;
    else if (kind === 'resistor') s.resistors++;
    else if (kind === 'diode') s.diodes++;
    else if (kind === 'capacitor') s.capacitors++;
  }
  return s;
}

function minus(a: Savings, b: Savings): Savings {
  return {
    transistors: a.transistors - b.transistors,
    resistors: a.resistors - b.resistors,
    diodes: a.diodes - b.diodes,
    capacitors: a.capacitors - b.capacitors,
    gates: a.gates - b.gates,
    areaMm2: roundMoney(a.areaMm2 - b.areaMm2),
    cost: roundMoney(a.cost - b.cost),
  };
}

const roundMoney = (x: number) => Math.round(x * 1e6) / 1e6;

/** Removed minus added parts of one edit: what accepting it saves (negative = it costs). */
export function editSavings(nl: FlatNetlist, edit: Edit, family: MapFamily = 'cmos', table: PartsTable = DEFAULT_PARTS_TABLE): Savings {
  const byName = deviceIndex(nl);
  const removed = edit.removeDevices.map((name) => {
    const i = byName.get(name);
    if (i === undefined) throw new InternalError(`savings of an edit removing unknown device ${name}`);
    return nl.devices[i];
  });
  return minus(partsOf(removed, family, table), partsOf(edit.addDevices, family, table));
}

export function sumSavings(list: Savings[]): Savings {
  return list.reduce(
    (a, b) => ({
      transistors: a.transistors + b.transistors,
      resistors: a.resistors + b.resistors,
      diodes: a.diodes + b.diodes,
      capacitors: a.capacitors + b.capacitors,
      gates: a.gates + b.gates,
      areaMm2: roundMoney(a.areaMm2 + b.areaMm2),
      cost: roundMoney(a.cost + b.cost),
    }),
    { transistors: 0, resistors: 0, diodes: 0, capacitors: 0, gates: 0, areaMm2: 0, cost: 0 },
  );
}

export interface BudgetLine {
  used: number;
  limit?: number;
  /** used − limit: positive means over budget. */
  over?: number;
  ok: boolean;
}

/** A board's use of its budget, before or after a set of savings. */
export function budgetReport(
  totals: Savings,
  budget: Budget,
  savings?: Savings,
): { parts: BudgetLine; areaMm2: BudgetLine; cost: BudgetLine } {
  const after = savings ? minus(totals, savings) : totals;
  const line = (used: number, limit?: number): BudgetLine =>
    limit === undefined ? { used, ok: true } : { used, limit, over: roundMoney(used - limit), ok: used <= limit };
  return {
    // Discrete parts on the board; gate-level designs count their gates mapped to the family.
    parts: line(after.transistors + after.resistors + after.diodes + after.capacitors, budget.parts),
    areaMm2: line(roundMoney(after.areaMm2), budget.areaMm2),
    cost: line(roundMoney(after.cost), budget.cost),
  };
}
