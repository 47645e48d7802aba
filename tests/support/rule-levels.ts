// ngspice checks of a rule's rewrite: write the design before and after a proposal as decks, run
// the DC operating point of every input combination (one ngspice run per deck) and read the
// nets' logic levels against a receiving family's thresholds; and re-run a deck at a margin's
// corner (supply and resistor deviations) to compare the rule's value with the simulator's.
import { writeSpice } from '@/optimizer/formats/spice/write';
import type { Corner } from '@/optimizer/margins/corners';
import type { Thresholds } from '@/optimizer/margins/defaults';
import type { FlatNetlist } from '@/optimizer/netlist/ir';
import { applyProposals, flatToDesign } from '@/optimizer/rewrite/apply';
import type { Proposal } from '@/optimizer/rules/types';
import { operatingPoints } from './ngspice';

export type Level = 0 | 1 | 'X';

export function levelOf(volts: number, t: Thresholds): Level {
  if (volts <= t.vil) return 0;
  if (volts >= t.vih) return 1;
  return 'X';
}

export function deckOf(nl: FlatNetlist): string {
  return writeSpice(flatToDesign(nl));
}

export interface LevelTable {
  /** Input combination per row. */
  points: Record<string, 0 | 1>[];
  volts: Record<string, number>[];
  levels: Record<string, Level>[];
}

/**
 * Operating points of `nl` for the given input combinations (default: all), inputs driven to 0 V
 * or `high` volts, probing the node voltage of each of `nets`.
 */
export function levelTable(
  nl: FlatNetlist,
  o: { inputs: string[]; nets: string[]; high: number; thresholds: Thresholds; points?: Record<string, 0 | 1>[] },
): LevelTable {
  const points = o.points ?? binaryPoints(o.inputs);
  const volts = operatingPoints(deckOf(nl), {
    combinations: points.map((p) => Object.fromEntries(o.inputs.map((i) => [i, p[i] ? o.high : 0]))),
    probe: o.nets,
  });
  return { points, volts, levels: volts.map((v) => Object.fromEntries(Object.entries(v).map(([n, x]) => [n, levelOf(x, o.thresholds)]))) };
}

/** Every 0/1 combination of `names` (first name = most significant bit). */
export function binaryPoints(names: string[]): Record<string, 0 | 1>[] {
  const out: Record<string, 0 | 1>[] = [];
  for (let m = 0; m < 2 ** names.length; m++) {
    out.push(Object.fromEntries(names.map((n, i) => [n, ((m >> (names.length - 1 - i)) & 1) as 0 | 1])));
  }
  return out;
}

export function applied(nl: FlatNetlist, p: Proposal): FlatNetlist {
  return applyProposals(nl, [p]);
}

/** Sign (+1 / −1) a corner gives a resistor role ("R_C +5 %, R_B −5 %"), 0 when not named. */
export function roleSign(corner: Corner, role: string): -1 | 0 | 1 {
  const m = new RegExp(`${role.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')} ([+−-])`).exec(corner.resistors);
  if (!m) return 0;
  return m[1] === '+' ? 1 : -1;
}

/**
 * A copy of `nl` at a corner: the supply rail's source set to the corner's supply and the named
 * resistors scaled by 1 ± tolerance as the corner's roles say.
 */
export function atCorner(nl: FlatNetlist, corner: Corner, roles: Record<string, string[]>, tolerance = 0.05, supplyRail = 'VCC'): FlatNetlist {
  const scale = new Map<string, number>();
  for (const [role, devices] of Object.entries(roles)) for (const d of devices) scale.set(d, 1 + roleSign(corner, role) * tolerance);
  const railNet = nl.netByName.get(supplyRail);
  const railSource = nl.rails.find((r) => r.net === railNet)?.source;
  return {
    ...nl,
    devices: nl.devices.map((d) => {
      if (d.name === railSource) return { ...d, value: corner.supply };
      const f = scale.get(d.name);
      return f !== undefined && d.value !== undefined ? { ...d, value: d.value * f } : d;
    }),
  };
}

/** |a − b| / |b| — relative difference from the simulator's figure. */
export function relativeDiff(rule: number, simulated: number): number {
  return Math.abs(rule - simulated) / Math.abs(simulated);
}
