// The scan pipeline: extract logic, run the rules, then for every proposal prove the changed nets
// equivalent under the assumptions it relies on, take the rule's margin checks and price its
// savings, and give a verdict: ready, failing-margins, refuted (or unproved when no proof ran).
import { extractLogic } from '../extract';
import { extractEdited } from '../extract/incremental';
import type { LogicView } from '../extract/types';
import { combinationalModel, ENABLE_SUFFIX, NEXT_SUFFIX } from '../extract/compose';
import { and, evaluate, v, type Expr } from '../logic/expr';
import { editSavings, type Savings } from '../cost/cost';
import { DEFAULT_PARTS_TABLE, type PartsTable } from '../cost/parts-table';
import type { MarginResult } from '../margins/corners';
import type { FlatNetlist } from '../netlist/ir';
import { partKey, PartTable } from '../region/part-key';
import { positions, proofKey, type ProofKey } from '../region/proof-key';
import { applyProposals } from '../rewrite/apply';
import { checkEquivalence, type EquivResult } from '../verify/equivalence';
import { cutParts, cutRegion, partRegion } from './cut-parts';
import { indexOf, MAX_REGION_NODES, ownersOf, regionOf, scratchMarks, terminalRows } from './region';
import { simulationCheck } from './sim-check';
import { devicesOnTouchedNodes } from './touched-nodes';
import { runRules, type OverlapGraph, type RuleErrorRecord, type RunOptions } from './run-rules';
import type { Assumption, Finding, Proposal } from './types';

export type Verdict = 'ready' | 'failing-margins' | 'refuted' | 'unproved';

export interface Verification {
  status: 'proved' | 'refuted' | 'unproved';
  method: string;
  /** Ids of the assumptions the proof used (proved) or was run under (refuted). */
  assumptions: string[];
  counterexample?: Record<string, 0 | 1>;
  /** Nets whose values differ on the counterexample, before and after. */
  differing?: { name: string; before: 0 | 1; after: 0 | 1 }[];
  /** Nets compared. */
  compared: string[];
  /** Input vectors the switch-level check simulated before and after (0 when it did not run). */
  simulatedVectors: number;
  note?: string;
}

export interface ScannedProposal {
  proposal: Proposal;
  verification: Verification;
  margins: MarginResult[];
  savings: Savings;
  verdict: Verdict;
}

export interface ScannedFinding {
  finding: Finding;
  proposals: ScannedProposal[];
}

export interface ScanResult {
  view: LogicView;
  findings: ScannedFinding[];
  ruleErrors: RuleErrorRecord[];
  overlaps: OverlapGraph;
}

/** Pluggable so a server can run proofs in a worker thread; the default is in-process. */
export type Verifier = (before: Record<string, Expr>, after: Record<string, Expr>, assumptions: Assumption[]) => EquivResult;

export interface ScanOptions extends RunOptions {
  view?: LogicView;
  /** Designs up to this many devices get the switch-level before/after check (default 20000). */
  simulateUpTo?: number;
  partsTable?: PartsTable;
  verifier?: Verifier;
}

const defaultVerifier: Verifier = (before, after, assumptions) =>
  checkEquivalence(before, after, { assumptions: assumptions.map((a) => ({ name: a.id, expr: a.expr })) });

interface Changed {
  /** Names, sorted, each once (built when first read). */
  readonly names: string[];
  /** The nets among them named by their own name, by id. */
  ids: number[];
  /** The other names (a net's second name, a net the edit creates). */
  others: string[];
}

/**
 * Nets an edit changes: terminals of removed, reconnected and added devices, merged nets, and
 * every driven net whose logic group contains a removed or reconnected device (a base resistor
 * moved changes the collector node it feeds). A merge moves every device on the removed net onto
 * the kept one, so the groups holding those devices change too.
 */
function changedNets(nl: FlatNetlist, view: LogicView, p: Proposal): Changed {
  // Nets gathered by id and devices by index (numbers, not names): a design-wide edit names
  // hundreds of thousands of each, and a one-slice edit must not cost the design's size.
  const marks = scratchMarks(nl, view);
  const stamp = ++marks.stamp;
  const netIds: number[] = [];
  const markNet = (id: number) => {
    if (marks.net[id] !== stamp) {
      marks.net[id] = stamp;
      netIds.push(id);
    }
  };
  const others = new Set<string>();
  const { byName: index, onNetStart, onNetList } = indexOf(nl);
  const hit: number[] = [];
  const hitDevice = (i: number) => {
    if (marks.device[i] !== stamp) {
      marks.device[i] = stamp;
      hit.push(i);
    }
  };
  const byName = (name: string) => {
    const id = nl.netByName.get(name);
    if (id !== undefined && nl.nets[id].name === name) markNet(id);
    else others.add(name);
  };
  for (const list of [p.edit.removeDevices, p.edit.reconnect.map((r) => r.device)]) {
    for (const name of list) {
      const i = index.get(name);
      if (i === undefined) continue;
      hitDevice(i);
      for (const t of nl.devices[i].terminals) markNet(t);
    }
  }
  for (const m of p.edit.mergeNets) {
    const id = nl.netByName.get(m.remove);
    if (id !== undefined) for (let k = onNetStart[id]; k < onNetStart[id + 1]; k++) hitDevice(onNetList[k]);
  }
  // Internal nodes the edit joins or leaves (a kept emitter node other stacks now share) change
  // every group on them, so the driven outputs of those groups are compared too.
  for (const d of devicesOnTouchedNodes(nl, view, p.edit)) hitDevice(d);
  const owners = ownersOf(view, nl.devices.length);
  const nodeName = (i: number) => {
    const node = view.nodes[i];
    if (nl.nets[node.net].name === node.name) markNet(node.net);
    else byName(node.name);
  };
  for (const d of hit) {
    if (d < owners.first.length && owners.first[d] >= 0) nodeName(owners.first[d]);
    for (const i of owners.more.get(d) ?? []) nodeName(i);
  }
  for (const r of p.edit.reconnect) byName(r.net);
  for (const d of p.edit.addDevices) for (const t of d.terminals) byName(t);
  for (const m of p.edit.mergeNets) {
    byName(m.keep);
    byName(m.remove);
  }
  const rails = new Set(nl.rails.map((r) => nl.nets[r.net].name));
  const ids: number[] = [];
  const otherNames: string[] = [];
  for (const id of netIds) if (!rails.has(nl.nets[id].name)) ids.push(id);
  for (const n of others) if (!rails.has(n)) otherNames.push(n);
  let names: string[] | undefined;
  return {
    ids,
    others: otherNames,
    // Sorted names are built only when asked for: a design-wide edit proved by parts needs none.
    get names() {
      if (!names) {
        const all = [...ids.map((id) => nl.nets[id].name), ...otherNames].sort();
        // Two nets of one name (or a name also met as text) count once, as in a set of names.
        names = all.filter((n, k) => k === 0 || n !== all[k - 1]);
      }
      return names;
    },
  };
}

const NOTHING_DRIVEN = 'the rewrite changes no driven net the extractor can see';

/** A proof already run in this scan, reusable by any proposal whose region has the same key. */
interface CachedProof {
  key: ProofKey;
  at?: Map<string, number>;
  verification: Verification;
  /** Positions, in the proposal's assumption list, of the assumptions the verdict names. */
  assumptionAt: number[];
}

/** Proofs of one scan by canonical region key (see region/proof-key): slices repeat regions. */
export type ProofCache = Map<string, CachedProof>;

/** The functions a proof compares, or the verdict when there is nothing to compare. */
type Problem =
  | { done: Verification }
  | { done?: undefined; compared: string[]; beforeFns: Record<string, Expr>; afterFns: Record<string, Expr>; inputs: string[]; compareNames: [string, string][] };

/** The view as the proof composes it: nets in `cut` are free values, not their drivers' logic. */
function cutView(view: LogicView, cut?: ReadonlySet<string>): LogicView {
  if (!cut || cut.size === 0) return view;
  return { ...view, nodes: view.nodes.filter((n) => !cut.has(n.name)), inputs: [...view.inputs, ...cut] };
}

function problemOf(
  nl: FlatNetlist,
  view: LogicView,
  after: FlatNetlist,
  edit: Proposal['edit'],
  changed: string[],
  used: Assumption[],
  cut?: ReadonlySet<string>,
): Problem {
  // Only the groups the edit touches are extracted again; every other node is the region's own.
  const afterView = extractEdited({ nl, view }, after, edit);
  const driven = (view: LogicView, nl: FlatNetlist, name: string) => {
    const id = nl.netByName.get(name);
    return id !== undefined && view.nodeByNet.has(id);
  };
  const readAfter = new Set<string>();
  for (const n of afterView.nodes) for (const i of n.inputs) readAfter.add(i);
  // A net merged away still names the kept net, which carries its loads now (an input it was the
  // double inverse of, say), whether or not the region holds a stage that reads it.
  const mergedAway = new Set(edit.mergeNets.filter((m) => after.netByName.has(m.remove)).map((m) => m.remove));
  const compared = changed.filter(
    (n) => driven(view, nl, n) && (mergedAway.has(n) || driven(afterView, after, n) || readAfter.has(after.nets[after.netByName.get(n) ?? 0]?.name)),
  );
  if (compared.length === 0) {
    return { done: { status: 'unproved', method: 'none', assumptions: used.map((a) => a.id), compared, simulatedVectors: 0, note: NOTHING_DRIVEN } };
  }
  const bModel = combinationalModel(cutView(view, cut), compared.map((n) => nl.nets[nl.netByName.get(n)!].name));
  const afterNames = compared.map((n) => after.nets[after.netByName.get(n)!].name);
  const drivenAfter = afterNames.filter((n) => afterView.nodeByNet.has(after.netByName.get(n)!));
  const aModel = combinationalModel(cutView(afterView, cut), drivenAfter);
  const beforeFns: Record<string, Expr> = {};
  const afterFns: Record<string, Expr> = {};
  compared.forEach((name, k) => {
    const bName = nl.nets[nl.netByName.get(name)!].name;
    const b = bModel.outputs[bName];
    const a = aModel.outputs[afterNames[k]] ?? v(afterNames[k]);
    const enBefore = bModel.outputs[bName + ENABLE_SUFFIX];
    if (!enBefore) {
      beforeFns[name] = b;
      afterFns[name] = a;
      return;
    }
    // A tri-state line's value is unspecified where no stage drives it before the rewrite: compare
    // only where some stage drives, and require the rewritten line to be driven there too.
    beforeFns[name] = and(enBefore, b);
    afterFns[name] = and(enBefore, a);
    const enAfter = aModel.outputs[afterNames[k] + ENABLE_SUFFIX];
    if (enAfter) {
      beforeFns[name + ENABLE_SUFFIX] = enBefore;
      afterFns[name + ENABLE_SUFFIX] = and(enBefore, enAfter);
    }
  });
  const compareNames = compared.map((n, k): [string, string] => [nl.nets[nl.netByName.get(n)!].name, afterNames[k]]);
  // The switch-level check drives the region's own inputs; a cut net keeps its driver there.
  const inputs = cut ? [...new Set([...view.inputs, ...view.stateBits])] : bModel.inputs;
  return { compared, beforeFns, afterFns, inputs, compareNames };
}

/** Can this verdict be told to another region? Only when every name in it maps by position. */
function cacheable(r: Verification): boolean {
  if (r.status === 'proved') return true;
  if (r.status === 'unproved') return r.note === NOTHING_DRIVEN;
  return r.method !== 'switch-level'; // a switch-level refutation names devices: it is redone
}

/**
 * A cached verdict in this region's names. A refutation's counterexample is re-simulated here:
 * both sides evaluated on it, under the assumptions, must differ exactly where the cached one did.
 */
function reuse(hit: CachedProof, key: ProofKey, used: Assumption[], problem: () => Problem): Verification | undefined {
  const at = (hit.at ??= positions(hit.key));
  const name = (n: string): string | undefined => {
    const k = at.get(n);
    if (k !== undefined) return key.names[k];
    for (const s of [ENABLE_SUFFIX, NEXT_SUFFIX]) {
      const j = n.endsWith(s) ? at.get(n.slice(0, -s.length)) : undefined;
      if (j !== undefined) return key.names[j] + s;
    }
    return undefined;
  };
  const names = (list: string[]) => list.map(name);
  const r = hit.verification;
  const compared = names(r.compared);
  if (compared.some((n) => n === undefined)) return undefined;
  const assumptions = hit.assumptionAt.map((k) => used[k].id);
  if (r.status !== 'refuted') return { ...r, assumptions, compared: compared as string[] };
  const cexNames = names(Object.keys(r.counterexample ?? {}));
  const differing = (r.differing ?? []).map((d) => ({ ...d, name: name(d.name) }));
  if (cexNames.some((n) => n === undefined) || differing.some((d) => d.name === undefined)) return undefined;
  const values = Object.values(r.counterexample ?? {});
  const pairs = cexNames.map((n, i) => [n as string, values[i]] as const).sort((x, y) => (x[0] < y[0] ? -1 : x[0] > y[0] ? 1 : 0));
  const counterexample = Object.fromEntries(pairs) as Record<string, 0 | 1>;
  const p = problem();
  if (p.done) return undefined;
  if (evaluate(and(...used.map((a) => a.expr)), counterexample) !== 1) return undefined;
  const seen = Object.keys(p.beforeFns)
    .sort()
    .map((n) => ({ name: n, before: evaluate(p.beforeFns[n], counterexample), after: evaluate(p.afterFns[n], counterexample) }))
    .filter((o) => o.before !== o.after);
  if (JSON.stringify(seen) !== JSON.stringify(differing)) return undefined;
  return { ...r, assumptions, counterexample, differing: seen, compared: p.compared };
}

/**
 * Equivalence of the changed nets, each as a function of the primary inputs and state bits.
 * A net the rewrite leaves undriven and unread (an internal node of removed parts) is skipped;
 * one that stays read but loses its driver is compared as a free variable, which refutes.
 * With a cache, a region whose canonical key was proved before in this scan reuses that verdict.
 * When the changed nets' fan-in is beyond the switch-level check's size (a design-wide edit, a
 * deep ripple chain), the edit is first proved part by part on regions cut at the nets it leaves
 * unchanged (see cut-parts), each part simulated on its own; only if a part is not proved that
 * way is the whole region or design used.
 */
export function verifyProposal(
  before: { nl: FlatNetlist; view: LogicView },
  p: Proposal,
  assumptions: Assumption[],
  verifier: Verifier = defaultVerifier,
  simulateUpTo = 20_000,
  cache?: ProofCache,
): Verification {
  const changedSet = changedNets(before.nl, before.view, p);
  // Work on the changed nets' fan-in cut out of the design, so a proof costs the region's size;
  // more driven nets changed than a region may hold means the whole design at once.
  const driven = changedSet.ids.filter((id) => before.view.nodeByNet.has(id)).length;
  const nl =
    driven > MAX_REGION_NODES
      ? before.nl
      : regionOf(before.nl, before.view, changedSet.names.filter((n) => before.view.nodeByNet.has(before.nl.netByName.get(n) ?? -1)), p.edit);
  const used = assumptions.filter((a) => p.assumptions.includes(a.id));
  const check: RegionCheck = { used, verifier, simulateUpTo, cache };
  // A region small enough for the switch-level check is proved whole (the check then sees every
  // path between parts); a larger one gets no such check whole, so its parts are checked instead.
  if (nl.devices.length > simulateUpTo) {
    const byParts = verifyByParts(before, p, changedSet, check);
    if (byParts) return byParts;
  }
  return verifyRegion(nl, nl === before.nl ? before.view : undefined, p.edit, changedSet.names, check);
}

interface RegionCheck {
  used: Assumption[];
  verifier: Verifier;
  simulateUpTo: number;
  cache?: ProofCache;
}

/** The proof of one region (or the whole design) before and after an edit, through the cache. */
function verifyRegion(nl: FlatNetlist, view: LogicView | undefined, edit: Proposal['edit'], changed: string[], check: RegionCheck, cut?: string[]): Verification {
  const { used, verifier, simulateUpTo, cache } = check;
  const after = applyProposals(nl, [{ id: 'region', title: '', edit, assumptions: [], margins: [] }], { share: true });
  let problem: Problem | undefined;
  const cutSet = cut && new Set(cut);
  const problemNow = () => (problem ??= problemOf(nl, view ?? extractLogic(nl), after, edit, changed, used, cutSet));
  const key = cache ? proofKey(nl, after, changed, used, `simulate:${nl.devices.length <= simulateUpTo}`, cut) : undefined;
  const hit = key && cache!.get(key.key);
  if (hit) {
    const reused = reuse(hit, key, used, problemNow);
    if (reused) return reused;
  }
  const r = prove(nl, after, problemNow(), used, verifier, simulateUpTo);
  if (key && !hit && cacheable(r)) {
    const ids = used.map((a) => a.id);
    const assumptionAt = r.assumptions.map((id) => ids.indexOf(id));
    if (!assumptionAt.includes(-1)) cache!.set(key.key, { key, verification: r, assumptionAt });
  }
  return r;
}

/** A part's proof, reusable by any part with the same key (region/part-key). */
interface PartProof {
  verification: Verification;
  /** Places (in the key) of the compared nets. */
  comparedAt: Set<number>;
  /** Positions, in the proposal's assumption list, of the assumptions the verdict names. */
  assumptionAt: number[];
}

/** Part proofs of one scan, beside its region proofs. */
const partProofs = new WeakMap<ProofCache, PartTable<PartProof>>();

/**
 * A design-wide edit proved part by part (cut-parts): every part proved, or nothing to compare,
 * gives the proposal's verdict; any part refuted or unproved gives undefined, and the caller
 * proves the whole design (a cut can refute what the wider logic makes true). Only proved parts
 * are reused, so a part's key need not carry names.
 */
function verifyByParts(before: { nl: FlatNetlist; view: LogicView }, p: Proposal, changed: Changed, check: RegionCheck): Verification | undefined {
  const parts = cutParts(before.nl, before.view, p.edit, changed);
  if (!parts || parts.count === 0) return undefined;
  let proofs: PartTable<PartProof> | undefined;
  if (check.cache) {
    proofs = partProofs.get(check.cache);
    if (!proofs) partProofs.set(check.cache, (proofs = new PartTable()));
  }
  const { byName } = indexOf(before.nl);
  const deviceIndex = (name: string) => byName.get(name);
  const terminals = terminalRows(before.nl);
  const extra = `simulate-up-to:${check.simulateUpTo}`;
  const ids = check.used.map((a) => a.id);
  const compared: string[] = [];
  const methods = new Set<string>();
  const usedIds = new Set<string>();
  let vectors = 0;
  for (let k = 0; k < parts.count; k++) {
    const part = parts.part(k);
    const region = partRegion(before.nl, before.view, part);
    if (!region) return undefined;
    const key = partKey(before.nl, {
      devices: region.devices,
      keep: region.keep,
      cut: region.cut,
      changed: part.changed,
      edit: part.edit,
      removed: part.removed,
      moved: part.moved,
      assumptions: check.used,
      extra,
      terminals,
      deviceIndex,
    });
    let known = proofs?.get(key);
    if (!known) {
      const { region: nl, changed: names, cut } = cutRegion(before.nl, part, region);
      const r = verifyRegion(nl, undefined, part.edit, names, { ...check, cache: undefined }, cut);
      if (r.status === 'refuted' || (r.status === 'unproved' && r.note !== NOTHING_DRIVEN)) return undefined;
      const compares = new Set(r.compared);
      const comparedAt = new Set<number>();
      part.changed.forEach((id, j) => compares.has(before.nl.nets[id].name) && comparedAt.add(key.places[j]));
      known = { verification: r, comparedAt, assumptionAt: r.assumptions.map((id) => ids.indexOf(id)) };
      proofs?.set(key, known);
    }
    const r = known.verification;
    if (r.status !== 'proved') continue; // nothing to compare in this part
    for (let j = 0; j < part.changed.length; j++) if (known.comparedAt.has(key.places[j])) compared.push(before.nl.nets[part.changed[j]].name);
    methods.add(r.method);
    for (const j of known.assumptionAt) usedIds.add(ids[j]);
    vectors = Math.max(vectors, r.simulatedVectors);
  }
  const assumptions = ids.filter((id) => usedIds.has(id));
  if (compared.length === 0) return { status: 'unproved', method: 'none', assumptions, compared, simulatedVectors: 0, note: NOTHING_DRIVEN };
  compared.sort();
  return {
    status: 'proved',
    method: [...methods].sort().join('+'),
    assumptions,
    compared,
    simulatedVectors: vectors,
    note: `proved in ${parts.count} part${parts.count === 1 ? '' : 's'}, each cut out at the nets the rewrite leaves unchanged`,
  };
}

function prove(nl: FlatNetlist, after: FlatNetlist, problem: Problem, used: Assumption[], verifier: Verifier, simulateUpTo: number): Verification {
  if (problem.done) return problem.done;
  const { compared, beforeFns, afterFns } = problem;
  let r: EquivResult;
  try {
    r = verifier(beforeFns, afterFns, used);
  } catch (err) {
    return { status: 'unproved', method: 'none', assumptions: used.map((a) => a.id), compared, simulatedVectors: 0, note: err instanceof Error ? err.message : String(err) };
  }
  if (r.verdict === 'refuted') {
    return { status: 'refuted', method: r.method, assumptions: used.map((a) => a.id), counterexample: r.counterexample, differing: r.outputs, compared, simulatedVectors: 0 };
  }
  if (nl.devices.length > simulateUpTo) {
    return { status: 'proved', method: r.method, assumptions: r.assumptionsUsed, compared, simulatedVectors: 0, note: 'design too large for the switch-level check' };
  }
  // The logic is proved; now look for contention and floating nodes the rewrite introduces, and for
  // a compared net whose switch-level value changes (a sneak path the extracted logic cannot see).
  const sim = simulationCheck(nl, after, problem.inputs, used, problem.compareNames);
  if (sim.problem) {
    return {
      status: 'refuted',
      method: 'switch-level',
      assumptions: used.map((a) => a.id),
      counterexample: sim.problem.vector,
      compared,
      simulatedVectors: sim.vectors,
      note: `after the rewrite net ${sim.problem.net} ${sim.problem.kind === 'contention' ? 'is driven both ways' : sim.problem.kind === 'floating' ? 'floats while read' : 'changes value at switch level'} (${sim.problem.detail.slice(0, 4).join(', ')})`,
    };
  }
  return { status: 'proved', method: r.method, assumptions: r.assumptionsUsed, compared, simulatedVectors: sim.vectors };
}

export function verdictOf(verification: Verification, margins: MarginResult[]): Verdict {
  if (verification.status === 'refuted') return 'refuted';
  if (verification.status === 'unproved') return 'unproved';
  return margins.some((m) => m.status === 'fail') ? 'failing-margins' : 'ready';
}

export async function scan(netlist: FlatNetlist, options: ScanOptions = {}): Promise<ScanResult> {
  const view = options.view ?? extractLogic(netlist);
  const run = await runRules(netlist, view, options);
  const assumptions = options.assumptions ?? [];
  const family = options.targetFamily ?? 'cmos';
  const proofs: ProofCache = new Map();
  const findings = run.findings.map((finding) => ({
    finding,
    proposals: finding.proposals.map((proposal) => {
      const verification = verifyProposal({ nl: netlist, view }, proposal, assumptions, options.verifier, options.simulateUpTo, proofs);
      return {
        proposal,
        verification,
        margins: proposal.margins,
        savings: editSavings(netlist, proposal.edit, family, options.partsTable ?? DEFAULT_PARTS_TABLE),
        verdict: verdictOf(verification, proposal.margins),
      };
    }),
  }));
  return { view, findings, ruleErrors: run.ruleErrors, overlaps: run.overlaps };
}
