// Contention and back-feed checks of a common override by switch-level simulation (Bryant 1984):
// the rewritten lines' region on every input combination, or — when the lines read more inputs
// than the exhaustive limit — each pair of lines with the override it now shares, every region of
// the same structure simulated once (support/region-sim).
import { evaluate, type Expr } from '../../logic/expr';
import type { MarginResult } from '../../margins/corners';
import type { Assumption, Edit, RuleContext } from '../types';
import { RegionSims, type RegionRun } from './region-sim';
import { sneakMargin } from './sneak-check';

type Vector = Record<string, 0 | 1>;

/** Whether a vector satisfies an assumption; one over nets outside the region says nothing here. */
function holds(a: Assumption, v: Vector): boolean {
  try {
    return evaluate(a.expr, v) === 1;
  } catch {
    return true;
  }
}

/**
 * Contention of the common override with the lines' normal drivers: vectors where the override
 * conducts and a line is driven both ways must be ruled out by the stated assumptions (those that
 * do are what the proposal relies on). Contention while the override is off is the design's own.
 */
function contention(ctx: RuleContext, bad: { vector: Vector; nets: string[] }[]): { margin: MarginResult; needs: Assumption[] } {
  const needs = ctx.assumptions.filter((a) => bad.some((b) => !holds(a, b.vector)));
  const left = bad.filter((b) => needs.every((a) => holds(a, b.vector)));
  const first = left[0];
  const margin: MarginResult = {
    name: 'contention',
    value: left.length,
    limit: 0,
    unit: 'vectors',
    status: left.length ? 'fail' : 'pass',
    corner: { supply: 0, resistors: 'nominal' },
    note: first
      ? `the override and a normal driver drive ${first.nets.join(', ')} both ways at ${Object.entries(first.vector).map(([k, v]) => `${k}=${v}`).join(' ')}; state an assumption that rules it out or keep the lines apart`
      : bad.length
        ? `${bad.length} contending vector(s) ruled out by ${needs.map((a) => a.id).join(', ')}`
        : 'no vector drives a line both ways (switch-level simulation, Bryant 1984)',
  };
  return { margin, needs };
}

/** The part of the edit that touches a region (its devices, and the diodes of the given lines); the edit indexed once. */
function editSplitter(edit: Edit): (names: Set<string>, lines: Set<string>) => Edit {
  const diodesOf = new Map<string, Edit['addDevices']>();
  for (const a of edit.addDevices) diodesOf.set(a.terminals[0], [...(diodesOf.get(a.terminals[0]) ?? []), a]);
  const reconnectOf = new Map<string, Edit['reconnect']>();
  for (const r of edit.reconnect) reconnectOf.set(r.device, [...(reconnectOf.get(r.device) ?? []), r]);
  const removed = new Set(edit.removeDevices);
  return (names, lines) => ({
    ...edit,
    removeDevices: [...names].filter((n) => removed.has(n)),
    reconnect: [...names].flatMap((n) => reconnectOf.get(n) ?? []),
    addDevices: [...lines].flatMap((l) => diodesOf.get(l) ?? []),
  });
}

export interface SwitchRegions {
  /** Line names of the members, by member. */
  lineOf: (m: number) => string;
  /** Devices of the region of some members (their lines, what drives them, the shared node's part). */
  regionOf: (at: number[]) => number[];
  /** Inputs of a region of some members. */
  inputsOf: (at: number[], region: number[]) => string[];
  /** The member whose override each member's line now shares. */
  keptOf: Map<number, number>;
  /** Nets watched beside the lines (a shared node the override now pulls). */
  alsoWatch: string[];
}

export function switchChecks(ctx: RuleContext, members: number[], on: Expr, edit: Edit, r: SwitchRegions, limit: number): { fight: MarginResult; backFeed: MarginResult; needs: Assumption[] } {
  const nl = ctx.netlist;
  const all = r.regionOf(members);
  const allInputs = r.inputsOf(members, all);
  const groups: { watch: number[]; with: number[] }[] = [];
  if (allInputs.length <= limit) groups.push({ watch: members, with: members });
  else {
    for (let k = 0; k < members.length; k += 2) {
      const watch = members.slice(k, k + 2);
      groups.push({ watch, with: [...new Set([...watch, ...watch.map((m) => r.keptOf.get(m)!)])] });
    }
  }
  const split = editSplitter(edit);
  const sim = new RegionSims(nl, limit);
  const bad: { vector: Vector; nets: string[] }[] = [];
  const runs: RegionRun[] = [];
  for (const g of groups) {
    const whole = g.with === members;
    const region = whole ? all : r.regionOf(g.with);
    const inputs = whole ? allInputs : r.inputsOf(g.with, region);
    const part = whole ? edit : split(new Set(region.map((d) => nl.devices[d].name)), new Set(g.with.map(r.lineOf)));
    const watch = [...g.watch.map(r.lineOf), ...r.alsoWatch];
    const run = sim.region(region, part, inputs, watch);
    runs.push(run);
    for (const b of run.contention()) if (evaluate(on, b.vector) === 1) bad.push(b);
  }
  const { margin: fight, needs } = contention(ctx, bad);
  const allowed = needs.length ? (v: Vector) => needs.every((a) => holds(a, v)) : undefined;
  const reports = runs.map((x) => x.sneak(allowed));
  const joined = { bad: reports.flatMap((x) => x.bad), vectors: reports.reduce((n, x) => n + x.vectors, 0) };
  return { fight, backFeed: { ...sneakMargin(joined), name: 'back-feed between lines' }, needs };
}
