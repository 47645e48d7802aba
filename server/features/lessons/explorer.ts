// Builds the trade-off explorer's data for a design revision and a set of its proposals: the
// what-if inputs (baseline totals from the revision, each proposal's savings and margins with
// their stored inputs), read-only evidence, and the two-level side-by-side view where it applies.
// Only what the listed proposals and their revision say goes in: nothing else of the team.
import type { Db } from '@/server/db';
import type { Design, Proposal, Revision } from '@/server/db/models';
import { loadRevision } from '@/server/features/designs/engine';
import { partsOf } from '@/optimizer/cost/cost';
import { DEFAULT_PARTS_TABLE } from '@/optimizer/cost/parts-table';
import { extractLogic } from '@/optimizer/extract';
import { support } from '@/optimizer/logic/expr';
import { parseExpr } from '@/optimizer/logic/expr-parse';
import type { FlatNetlist } from '@/optimizer/netlist/ir';
import { applyProposals } from '@/optimizer/rewrite/apply';
import { fanoutFreeCones } from '@/optimizer/rules/lib/cones';
import { defaultSettings, MAX_SIDE_BY_SIDE_INPUTS, twoLevelView, type ChangedRegion, type ExplorerData, type ExplorerProposal, type RegionDevice, type TwoLevelView, type WhatIfInputs } from '@/optimizer/whatif';
import type { LogicView } from '@/optimizer/extract/types';
import type { Expr } from '@/optimizer/logic/expr';

export const EXPLORER_CAUTIONS = [
  'The margins here are first-order estimates at worst-case corners; moving a slider does not change the stored design.',
  'Before a rewrite goes on a board, simulate the exported deck and check it on the bench; use the parts’ data sheets for limits.',
  'Work on anything connected to mains, or anything safety-related, follows local codes and licensed practice.',
];

const pick = (s: Proposal['savings']) => ({
  transistors: s.transistors,
  resistors: s.resistors,
  diodes: s.diodes,
  capacitors: s.capacitors,
  gates: s.gates,
  areaMm2: s.areaMm2,
  cost: s.cost,
});

/** The devices an edit removes (as they stand in the revision) and adds, for the before/after drawing. */
function regionOf(p: Proposal, flat: FlatNetlist): ChangedRegion {
  const byName = new Map(flat.devices.map((d) => [d.name, d]));
  const device = (d: { name: string; kind: string; op?: string | undefined; value?: number | undefined }, terminals: string[]): RegionDevice => ({
    name: d.name,
    kind: d.kind,
    ...(d.op ? { op: d.op } : {}),
    terminals,
    ...(d.value !== undefined ? { value: d.value } : {}),
  });
  const moved = new Set(p.edit.reconnect.map((r) => r.device));
  const before = [...p.edit.removeDevices, ...moved].flatMap((name) => {
    const d = byName.get(name);
    return d ? [device(d, d.terminals.map((t) => flat.nets[t]!.name))] : [];
  });
  return {
    before,
    after: p.edit.addDevices.map((d) => device(d, [...d.terminals])),
    reconnect: p.edit.reconnect.map((r) => ({ ...r })),
    mergeNets: p.edit.mergeNets.map((m) => ({ ...m })),
  };
}

/** The cone rooted at `root` over exactly `leaves` (or, for a rewritten block, some of them). */
function coneFn(view: LogicView, nl: FlatNetlist, root: string, leaves: string[], subset = false): Expr | undefined {
  const ports = new Set(nl.ports.map((p) => nl.nets[p].name));
  const cone = fanoutFreeCones(view, Math.max(leaves.length, 2), ports).find((c) => c.root.name === root);
  if (!cone) return undefined;
  const want = new Set(leaves);
  const inside = cone.leaves.every((x) => want.has(x));
  // A rewrite may drop an input the assumptions make redundant (NAND(WR, SEL) → NOT WR).
  return inside && (subset || cone.leaves.length === want.size) ? cone.fn : undefined;
}

/**
 * The truth table, don't-cares and cover of a two-level-minimise proposal, rebuilt from its
 * revision (the block is the fanout-free cone its location names: root net, then its inputs).
 * Null when the block can no longer be found in the revision as stored.
 */
function twoLevelOf(p: Proposal, flat: FlatNetlist, view: LogicView, assumptions: Map<string, string>): TwoLevelView | null {
  const [root, ...leaves] = p.location.nets;
  if (!root || leaves.length < 1 || leaves.length > MAX_SIDE_BY_SIDE_INPUTS) return null;
  const before = coneFn(view, flat, root, leaves);
  if (!before) return null;
  let after: Expr | undefined;
  try {
    const nl = applyProposals(flat, [{ id: p.engineId, title: p.title, edit: p.edit, assumptions: p.assumptionIds, margins: [] }]);
    after = coneFn(extractLogic(nl), nl, root, leaves, true);
  } catch {
    after = undefined; // the rewritten block is shown from its cover alone
  }
  const leafSet = new Set(leaves);
  const relied = p.assumptionIds.flatMap((id) => {
    const text = assumptions.get(id);
    if (text === undefined) return [];
    const expr = parseExpr(text, `assumption ${id}`);
    return [...support(expr)].every((x) => leafSet.has(x)) ? [{ id, expr }] : [];
  });
  const colon = p.message.lastIndexOf(': ');
  return twoLevelView({
    output: root,
    inputs: leaves,
    before,
    ...(after ? { after } : {}),
    assumptions: relied,
    ...(colon >= 0 ? { coverText: p.message.slice(colon + 2) } : {}),
  });
}

export async function buildExplorer(db: Db, design: Design, revision: Revision, proposals: Proposal[]): Promise<ExplorerData> {
  const { flat } = loadRevision(revision);
  const baseline = partsOf(flat.devices, design.family);
  const ids = new Set(proposals.map((p) => p.id));
  const assumptionIds = [...new Set(proposals.flatMap((p) => p.assumptionIds))];
  const rows = assumptionIds.length ? await db.models.Assumption.findAll({ where: { id: assumptionIds, designId: design.id } }) : [];
  const assumptions = new Map(rows.map((a) => [a.id, a.expression]));
  let view: LogicView | undefined;
  const inputs: WhatIfInputs = {
    baseline: { ...baseline, areaMm2: Math.round(baseline.areaMm2 * 1e6) / 1e6, cost: Math.round(baseline.cost * 1e6) / 1e6 },
    currency: DEFAULT_PARTS_TABLE.currency,
    proposals: proposals.map((p) => ({
      id: p.id,
      ruleId: p.ruleId,
      title: p.title,
      savings: pick(p.savings),
      margins: p.margins,
      // Overlaps with proposals outside the set are not this explorer's business.
      overlapsWith: p.overlapsWith.filter((q) => ids.has(q)),
    })),
  };
  const out: ExplorerProposal[] = proposals.map((p) => {
    let twoLevel: TwoLevelView | null = null;
    if (p.ruleId === 'two-level-minimise') {
      view ??= extractLogic(flat);
      twoLevel = twoLevelOf(p, flat, view, assumptions);
    }
    const v = p.verification;
    return {
      id: p.id,
      ruleId: p.ruleId,
      title: p.title,
      message: p.message,
      verdict: p.verdict,
      marginStatus: p.marginStatus,
      status: p.status,
      evidence: {
        method: v.method,
        assumptions: v.assumptions.filter((id) => assumptions.has(id)).map((id) => ({ id, expression: assumptions.get(id)! })),
        ...(v.counterexample ? { counterexample: v.counterexample } : {}),
        ...(v.differing ? { differing: v.differing } : {}),
        ...(v.note ? { note: v.note } : {}),
      },
      location: p.location,
      region: regionOf(p, flat),
      twoLevel,
    };
  });
  return {
    design: {
      name: design.name,
      family: design.family,
      revision: revision.number,
      title: revision.summary.title,
      devices: revision.summary.devices,
      nets: revision.summary.nets,
      clockPeriodNs: design.clockPeriodNs,
    },
    inputs,
    proposals: out,
    defaults: defaultSettings(inputs),
    pricesNote: DEFAULT_PARTS_TABLE.note,
    cautions: EXPLORER_CAUTIONS,
  };
}
