// The region a proposal changes: the parts it removes, adds or reconnects plus one ring of
// neighbours (parts sharing a non-rail net with them), as a graph before and after the rewrite.
import type { FlatNetlist } from '../netlist/ir';
import { applyProposals } from '../rewrite/apply';
import type { Edit } from '../rules/types';
import { graphOf, type PartRole, type RegionGraph } from './graph';

/** Neighbours beyond this many are left out (a clock net can reach hundreds of parts). */
export const MAX_RING = 300;

export interface Region {
  before: RegionGraph;
  after: RegionGraph;
  /** Names of the parts the edit removes (highlighted in the before view). */
  removed: string[];
  /** Names of the parts the edit adds (highlighted in the after view). */
  added: string[];
  /** Kept parts with a terminal moved to another net. */
  reconnected: string[];
  /** Neighbours left out because the ring was larger than MAX_RING. */
  ringTruncated: number;
}

/** Region of one edit on `nl`; `after` may be passed when the caller already applied it. */
export function extractRegion(nl: FlatNetlist, edit: Edit, after?: FlatNetlist): Region {
  const out = after ?? applyProposals(nl, [{ id: 'region', title: 'region', edit, assumptions: [], margins: [] }]);
  const removed = [...new Set(edit.removeDevices)];
  const added = [...new Set(edit.addDevices.map((d) => d.name))];
  const reconnected = [...new Set(edit.reconnect.map((r) => r.device))];
  const core = new Set([...removed, ...added, ...reconnected]);

  // Nets the change touches, by name: every net of a core part in either netlist, and merged nets.
  const coreNets = new Set<string>();
  const railNames = new Set([...nl.rails.map((r) => nl.nets[r.net].name), ...out.rails.map((r) => out.nets[r.net].name), '0']);
  const collect = (net: FlatNetlist) => {
    for (const d of net.devices) if (core.has(d.name)) for (const t of d.terminals) coreNets.add(net.nets[t].name);
  };
  collect(nl);
  collect(out);
  for (const m of edit.mergeNets) coreNets.add(m.keep).add(m.remove);
  for (const r of railNames) coreNets.delete(r);
  // A merged-away name lives on in `out` under the kept net's id: both names resolve there.

  const ring = new Set<string>();
  const leftOut = new Set<string>();
  const addRing = (net: FlatNetlist) => {
    const ids = new Set([...coreNets].map((n) => net.netByName.get(n)).filter((x): x is number => x !== undefined));
    for (const d of net.devices) {
      if (core.has(d.name) || ring.has(d.name)) continue;
      if (!d.terminals.some((t) => ids.has(t))) continue;
      if (net.rails.some((r) => r.source === d.name)) continue;
      if (ring.size >= MAX_RING) leftOut.add(d.name);
      else ring.add(d.name);
    }
  };
  addRing(nl);
  addRing(out);

  const roleIn = (highlight: Set<string>, highlightRole: PartRole) => (name: string): PartRole =>
    highlight.has(name) ? highlightRole : reconnected.includes(name) ? 'changed' : 'neighbour';
  const pick = (net: FlatNetlist, own: Set<string>) => net.devices.flatMap((d, i) => (own.has(d.name) || ring.has(d.name) || reconnected.includes(d.name) ? [i] : []));
  const removedSet = new Set(removed);
  const addedSet = new Set(added);
  return {
    before: graphOf(nl, pick(nl, removedSet), roleIn(removedSet, 'removed')),
    after: graphOf(out, pick(out, addedSet), roleIn(addedSet, 'added')),
    removed,
    added,
    reconnected,
    ringTruncated: leftOut.size,
  };
}
