// Runs every enabled rule over a frozen netlist and logic view. A rule that throws, or proposes an
// edit that does not fit the design, becomes a recorded rule error and the scan goes on; findings
// get stable ids; proposals that change the same device or net are returned as an overlap graph.
import { InputError, RuleError } from '../errors';
import type { LogicView } from '../extract/types';
import type { MapFamily } from '../logic/family-parts';
import { exactMinimiser, type Minimiser } from '../logic/minimiser';
import { DEFAULT_MARGIN_SETTINGS, type MarginSettings } from '../margins/defaults';
import type { FlatNetlist } from '../netlist/ir';
import { deviceIndex, editProblems, type NameIndex } from '../rewrite/edits';
import { renderMessage } from './define-rule';
import { deepFreeze } from './freeze';
import { sealSettings } from './support/driver-margins';
import { RULES } from './index';
import type { Assumption, Edit, Finding, FindingReport, Rule, RuleContext } from './types';

export interface RunOptions {
  /** The rule map to draw from (default: every rule in the catalogue). */
  rules?: Record<string, Rule>;
  /** Rule ids to run (default: all in the map). */
  enabled?: string[];
  /** Per-rule options, validated by each rule's schema over its defaults. */
  ruleOptions?: Record<string, unknown>;
  assumptions?: Assumption[];
  margins?: MarginSettings;
  minimiser?: Minimiser;
  targetFamily?: MapFamily;
  clockPeriod?: number;
}

export interface RuleErrorRecord {
  ruleId: string;
  message: string;
  element?: string;
}

export interface OverlapGraph {
  /** Proposal ids. */
  nodes: string[];
  edges: { a: string; b: string; devices: string[]; nets: string[] }[];
}

export interface RunResult {
  findings: Finding[];
  ruleErrors: RuleErrorRecord[];
  overlaps: OverlapGraph;
}

/** FNV-1a, 32 bits, as 8 hex digits: short stable ids from canonical text. */
export function stableHash(text: string): string {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return (h >>> 0).toString(16).padStart(8, '0');
}

function resolveOptions(rule: Rule, given: unknown): unknown {
  const merged = given && typeof given === 'object' ? { ...(rule.meta.defaultOptions as object), ...given } : rule.meta.defaultOptions;
  const parsed = rule.meta.optionsSchema.safeParse(merged);
  if (!parsed.success) {
    const detail = parsed.error.issues.map((i) => `${i.path.join('.') || 'options'}: ${i.message}`).join('; ');
    throw InputError.at('rules.bad-options', `options for rule ${rule.id} are invalid: ${detail}`);
  }
  return parsed.data;
}

export async function runRules(netlist: FlatNetlist, view: LogicView, options: RunOptions = {}): Promise<RunResult> {
  const ruleMap = options.rules ?? RULES;
  const enabled = options.enabled ?? Object.keys(ruleMap);
  const unknown = enabled.filter((id) => !Object.prototype.hasOwnProperty.call(ruleMap, id));
  if (unknown.length) throw InputError.at('rules.unknown', `unknown rule id(s): ${unknown.join(', ')} (known: ${Object.keys(ruleMap).join(', ')})`);
  for (const id of Object.keys(options.ruleOptions ?? {})) {
    if (!enabled.includes(id)) throw InputError.at('rules.unknown', `options given for rule ${id}, which is not enabled`);
  }
  const resolved = enabled.map((id) => [ruleMap[id], resolveOptions(ruleMap[id], options.ruleOptions?.[id])] as const);

  deepFreeze(netlist);
  deepFreeze(view);
  const assumptions = deepFreeze([...(options.assumptions ?? [])]);
  // a frozen copy the rules share, so margin results can be remembered by their inputs
  const margins = sealSettings(options.margins ?? DEFAULT_MARGIN_SETTINGS);
  const findings: Finding[] = [];
  const ruleErrors: RuleErrorRecord[] = [];
  const usedIds = new Set<string>();

  for (const [rule, ruleOptions] of resolved) {
    const reports: FindingReport[] = [];
    const ctx: RuleContext = {
      netlist,
      view,
      assumptions,
      margins,
      minimiser: options.minimiser ?? exactMinimiser,
      targetFamily: options.targetFamily ?? 'cmos',
      clockPeriod: options.clockPeriod,
      report(f) {
        renderMessage(rule.id, rule.meta.messages, f.messageId, f.data); // unknown id → InternalError now
        reports.push(f);
      },
      reportError(element, message) {
        ruleErrors.push({ ruleId: rule.id, message: new RuleError(rule.id, message, element).message, element });
      },
    };
    try {
      await rule.find(ctx, ruleOptions);
    } catch (err) {
      const e = err instanceof RuleError ? err : new RuleError(rule.id, err instanceof Error ? err.message : String(err));
      ruleErrors.push({ ruleId: rule.id, message: e.message, ...(e.element ? { element: e.element } : {}) });
      continue;
    }
    for (const r of reports) {
      const location = { devices: r.location.devices ?? [], instances: r.location.instances ?? [], nets: r.location.nets ?? [] };
      const bad = r.proposals.flatMap((p) => editProblems(netlist, p.edit));
      const knownAssumptions = new Set(assumptions.map((a) => a.id));
      for (const p of r.proposals) for (const a of p.assumptions ?? []) if (!knownAssumptions.has(a)) bad.push(`relies on unknown assumption ${a}`);
      if (bad.length) {
        const element = location.devices[0] ?? location.nets[0];
        ruleErrors.push({ ruleId: rule.id, message: new RuleError(rule.id, `proposal does not fit the design: ${bad.slice(0, 3).join('; ')}`, element).message, ...(element ? { element } : {}) });
        continue;
      }
      const canonical = JSON.stringify([rule.id, r.messageId, [...location.devices].sort(), [...location.nets].sort(), r.data ?? {}]);
      let id = `${rule.id}-${stableHash(canonical)}`;
      for (let k = 2; usedIds.has(id); k++) id = `${rule.id}-${stableHash(canonical)}-${k}`;
      usedIds.add(id);
      findings.push({
        id,
        ruleId: rule.id,
        messageId: r.messageId,
        data: { ...(r.data ?? {}) },
        message: renderMessage(rule.id, rule.meta.messages, r.messageId, r.data),
        location,
        proposals: r.proposals.map((p, k) => ({
          id: r.proposals.length === 1 ? id : `${id}.${k + 1}`,
          title: p.title,
          edit: p.edit,
          assumptions: [...(p.assumptions ?? [])],
          margins: [...(p.margins ?? [])],
        })),
      });
    }
  }
  return { findings, ruleErrors, overlaps: overlapGraph(findings, netlist) };
}

/**
 * Pairs of proposals that change a common device or net (alternatives of one finding included).
 * Each name touched gets a slot number in the order first met (devices with added names, then
 * nets, proposal by proposal) and remembers the first and last proposal that touched it; only a
 * name that three or more proposals touch gets a list. A finding that spans every slice of a large
 * design touches millions of names, so nothing else is kept per name; each pair keeps the first
 * slot it shares, and what a pair shares is found by marking names rather than building sets per
 * proposal. Edges come in the order of the first shared name, pairs of one name in proposal order.
 * Given the netlist the proposals target, its device and net names are numbered by its indexes
 * instead of new maps.
 */
export function overlapGraph(findings: Finding[], netlist?: FlatNetlist): OverlapGraph {
  const proposals = findings.flatMap((f) => f.proposals);
  const count = proposals.length;
  // At most one slot per name listed: sized once, so the tables never grow and copy.
  let names = 0;
  for (const p of proposals) names += p.edit.removeDevices.length + p.edit.reconnect.length + p.edit.addDevices.length + 2 * p.edit.mergeNets.length;
  /** First and last proposal to touch each slot (proposals come in order, so a slot's are increasing). */
  const first = new Int32Array(names);
  const last = new Int32Array(names);
  let slots = 0;
  /** Every proposal touching a slot, for slots touched by three or more. */
  const more = new Map<number, number[]>();
  /** Least slot each pair of proposals shares, by j · count + i (j < i). */
  const pairSlot = new Map<number, number>();
  const meet = (j: number, i: number, slot: number): void => {
    const key = j * count + i;
    const s = pairSlot.get(key);
    if (s === undefined || slot < s) pairSlot.set(key, slot);
  };
  const touch = (slot: number, i: number): void => {
    if (last[slot] === i) return;
    if (first[slot] === last[slot]) meet(first[slot], i, slot);
    else {
      let list = more.get(slot);
      if (!list) more.set(slot, (list = [first[slot], last[slot]]));
      for (const j of list) meet(j, i, slot);
      list.push(i);
    }
    last[slot] = i;
  };
  const open = (i: number): number => {
    first[slots] = i;
    last[slots] = i;
    return slots++;
  };
  // Names of the design's devices and nets are numbered by the netlist's own indexes (slot + 1 in
  // a typed array, 0 while unmet); other names (added devices, unknown nets) go in maps.
  const devIds = netlist ? deviceIndex(netlist) : undefined;
  const devSlot = new Int32Array(netlist ? netlist.devices.length : 0);
  const netSlot = new Int32Array(netlist ? netlist.nets.length : 0);
  const devices = new Map<string, number>();
  const nets = new Map<string, number>();
  const noteIn = (table: Int32Array, id: number, i: number): void => {
    const slot = table[id] - 1;
    if (slot < 0) table[id] = open(i) + 1;
    else touch(slot, i);
  };
  const noteName = (map: Map<string, number>, name: string, i: number): void => {
    const slot = map.get(name);
    if (slot === undefined) map.set(name, open(i));
    else touch(slot, i);
  };
  const noteDevice = (name: string, i: number): void => {
    const id = devIds?.get(name);
    if (id === undefined) noteName(devices, name, i);
    else noteIn(devSlot, id, i);
  };
  const noteNet = (name: string, i: number): void => {
    const id = netlist?.netByName.get(name);
    if (id === undefined) noteName(nets, name, i);
    else noteIn(netSlot, id, i);
  };
  for (let i = 0; i < proposals.length; i++) {
    const e = proposals[i].edit;
    for (const d of e.removeDevices) noteDevice(d, i);
    for (const r of e.reconnect) noteDevice(r.device, i);
    for (const d of e.addDevices) noteDevice(d.name, i);
    for (const m of e.mergeNets) {
      noteNet(m.keep, i);
      noteNet(m.remove, i);
    }
  }
  // A pair's edge sits at the first slot the two share; pairs of one slot in proposal order.
  const order = [...pairSlot].sort((x, y) => x[1] - y[1] || x[0] - y[0]);
  const edges: OverlapGraph['edges'] = [];
  const shared = order.length ? new SharedNames(netlist) : undefined;
  for (const [key] of order) {
    const j = Math.floor(key / count);
    const i = key - j * count;
    edges.push({ a: proposals[j].id, b: proposals[i].id, ...shared!.between(proposals[j].edit, proposals[i].edit) });
  }
  return { nodes: proposals.map((p) => p.id), edges };
}

/**
 * Names of one kind marked with stamps: by the design's index where it numbers the name (a typed
 * array, no map entry per name), in a map otherwise. A new stamp forgets every earlier mark.
 */
class NameMarks {
  private readonly byId: Int32Array;
  private readonly byName = new Map<string, number>();
  constructor(
    size: number,
    private readonly idOf: (name: string) => number | undefined,
  ) {
    this.byId = new Int32Array(size);
  }
  get(name: string): number {
    const id = this.idOf(name);
    return id === undefined ? (this.byName.get(name) ?? 0) : this.byId[id];
  }
  set(name: string, stamp: number): void {
    const id = this.idOf(name);
    if (id === undefined) this.byName.set(name, stamp);
    else this.byId[id] = stamp;
  }
}

/**
 * What two edits both change, as overlapOf(touched(a), touched(b)) gives it: a's removed or
 * reconnected devices that b removes or reconnects, then a's added names that b adds, and a's
 * merged nets that b merges, each in a's order without repeats. Marks instead of sets per edit.
 */
class SharedNames {
  private stamp = 0;
  private readonly devices: NameMarks;
  private readonly added: NameMarks;
  private readonly nets: NameMarks;
  constructor(netlist?: FlatNetlist) {
    const devIds: NameIndex | undefined = netlist ? deviceIndex(netlist) : undefined;
    this.devices = new NameMarks(netlist ? netlist.devices.length : 0, (n) => devIds?.get(n));
    this.added = new NameMarks(0, () => undefined);
    this.nets = new NameMarks(netlist ? netlist.nets.length : 0, (n) => netlist?.netByName.get(n));
  }

  between(a: Edit, b: Edit): { devices: string[]; nets: string[] } {
    const inB = ++this.stamp;
    for (const d of b.removeDevices) this.devices.set(d, inB);
    for (const r of b.reconnect) this.devices.set(r.device, inB);
    for (const d of b.addDevices) this.added.set(d.name, inB);
    for (const m of b.mergeNets) {
      this.nets.set(m.keep, inB);
      this.nets.set(m.remove, inB);
    }
    // a's names are marked as met once read, so a repeat is skipped (its first reading decided)
    const met = ++this.stamp;
    const devices: string[] = [];
    const nets: string[] = [];
    const visit = (marks: NameMarks, name: string, out: string[]): void => {
      const m = marks.get(name);
      if (m === met) return;
      if (m === inB) out.push(name);
      marks.set(name, met);
    };
    for (const d of a.removeDevices) visit(this.devices, d, devices);
    for (const r of a.reconnect) visit(this.devices, r.device, devices);
    for (const d of a.addDevices) visit(this.added, d.name, devices);
    for (const m of a.mergeNets) {
      visit(this.nets, m.keep, nets);
      visit(this.nets, m.remove, nets);
    }
    return { devices, nets };
  }
}
