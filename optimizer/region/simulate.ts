// Before/after switch-level simulation of a region with one stimulus: the whole design is
// simulated (the region's drivers outside it matter), the region's nets are recorded as lanes,
// aligned by name, and the first step where a lane present on both sides differs is marked.
import type { FlatNetlist } from '../netlist/ir';
import { expandStimulus, simulate, type Level, type Stimulus } from '../verify/switch-sim';
import type { Region } from './region';

export interface Lane {
  net: string;
  /** Inputs come first, then the region's other nets. */
  role: 'input' | 'net';
  before?: Level[];
  after?: Level[];
  /** First step where before and after differ (absent when they agree or one side lacks the net). */
  firstDifference?: number;
}

export interface RegionSimulation {
  steps: number;
  /** Per step, the input values applied (a clocked stimulus has two steps per vector). */
  applied: Record<string, 0 | 1 | 'X'>[];
  lanes: Lane[];
  /** Earliest differing step over every lane. */
  firstDifference?: { step: number; nets: string[] };
  contention: { side: 'before' | 'after'; net: string; step: number }[];
  floating: { side: 'before' | 'after'; net: string; step: number }[];
}

/** Lanes beyond this many are left out (the rest of the region is in the drawing). */
export const MAX_LANES = 40;

export function simulateRegion(before: FlatNetlist, after: FlatNetlist, region: Region, stimulus: Stimulus): RegionSimulation {
  const applied = expandStimulus(stimulus);
  // Inputs missing from one side are dropped there: forcing a net the rewrite removed would invent it.
  const only = (nl: FlatNetlist): Stimulus => {
    const keep = (v: Record<string, 0 | 1 | 'X'>) => Object.fromEntries(Object.entries(v).filter(([k]) => nl.netByName.has(k)));
    return stimulus.kind === 'clocked'
      ? { kind: 'clocked', clock: stimulus.clock, vectors: stimulus.vectors.map(keep) }
      : { kind: 'vectors', vectors: stimulus.vectors.map(keep) };
  };
  const inputs = [...new Set(applied.flatMap((v) => Object.keys(v)))];
  const railed = (g: Region['before']) => new Set(g.nets.filter((n) => n.railVolts !== undefined).map((n) => n.name));
  const rails = new Set([...railed(region.before), ...railed(region.after)]);
  const netNames: string[] = [];
  const seen = new Set<string>(inputs);
  for (const g of [region.before, region.after]) {
    for (const n of g.nets) {
      if (rails.has(n.name) || seen.has(n.name)) continue;
      seen.add(n.name);
      netNames.push(n.name);
    }
  }
  const watched = [...inputs, ...netNames].slice(0, MAX_LANES);
  const watchIn = (nl: FlatNetlist) => watched.filter((n) => nl.netByName.has(n));
  const b = simulate(before, only(before), { watch: watchIn(before) });
  const a = simulate(after, only(after), { watch: watchIn(after) });
  const inputSet = new Set(inputs);
  // A side shows a net only where that side's drawing has it: a net the rewrite emptied is gone.
  const drawnBefore = new Set(region.before.nets.map((n) => n.name));
  const drawnAfter = new Set(region.after.nets.map((n) => n.name));
  const lanes: Lane[] = watched.map((net) => {
    const lane: Lane = { net, role: inputSet.has(net) ? 'input' : 'net' };
    if (b.waveforms[net] && (inputSet.has(net) || drawnBefore.has(net))) lane.before = b.waveforms[net];
    if (a.waveforms[net] && (inputSet.has(net) || drawnAfter.has(net))) lane.after = a.waveforms[net];
    if (lane.before && lane.after) {
      const k = lane.before.findIndex((x, i) => x !== lane.after![i]);
      if (k >= 0) lane.firstDifference = k;
    }
    return lane;
  });
  const diffs = lanes.filter((l) => l.firstDifference !== undefined);
  const step = diffs.length ? Math.min(...diffs.map((l) => l.firstDifference!)) : undefined;
  const within = new Set(watched);
  return {
    steps: applied.length,
    applied,
    lanes,
    ...(step !== undefined ? { firstDifference: { step, nets: diffs.filter((l) => l.firstDifference === step).map((l) => l.net) } } : {}),
    contention: [
      ...b.contention.filter((c) => within.has(c.net)).map((c) => ({ side: 'before' as const, net: c.net, step: c.step })),
      ...a.contention.filter((c) => within.has(c.net)).map((c) => ({ side: 'after' as const, net: c.net, step: c.step })),
    ].slice(0, 50),
    floating: [
      ...b.floatingReads.filter((c) => within.has(c.net)).map((c) => ({ side: 'before' as const, net: c.net, step: c.step })),
      ...a.floatingReads.filter((c) => within.has(c.net)).map((c) => ({ side: 'after' as const, net: c.net, step: c.step })),
    ].slice(0, 50),
  };
}
