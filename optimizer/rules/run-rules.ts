// Runs every enabled rule over a frozen netlist and logic view. A rule that throws, or proposes an
// edit that does not fit the design, becomes a recorded rule error and the scan goes on; findings
// get stable ids; proposals that change the same device or net are returned as an overlap graph.
import { InputError, RuleError } from '../errors';
import type { LogicView } from '../extract/types';
import type { MapFamily } from '../logic/family-parts';
import { exactMinimiser, type Minimiser } from '../logic/minimiser';
import { DEFAULT_MARGIN_SETTINGS, type MarginSettings } from '../margins/defaults';
import type { FlatNetlist } from '../netlist/ir';
import { editProblems, overlapOf, touched, type Touched } from '../rewrite/edits';
import { renderMessage } from './define-rule';
import { deepFreeze } from './freeze';
import { sealSettings } from './support/driver-margins';
import { RULES } from './index';
import type { Assumption, Finding, FindingReport, Rule, RuleContext } from './types';

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
  return { findings, ruleErrors, overlaps: overlapGraph(findings) };
}

/**
 * Pairs of proposals that change a common device or net (alternatives of one finding included).
 * Each name touched gets a slot number in the order first met (devices with added names, then
 * nets, proposal by proposal) and remembers the last proposal that touched it; only a name that a
 * second proposal touches gets a list. A finding that spans every slice of a large design touches
 * millions of names, so nothing else is kept per name, and each proposal's touched sets are built
 * only when it is in a pair. Edges come in the order of the first shared name.
 */
export function overlapGraph(findings: Finding[]): OverlapGraph {
  const proposals = findings.flatMap((f) => f.proposals);
  const devices = new Map<string, number>();
  const nets = new Map<string, number>();
  /** Last proposal to touch each slot. */
  const last: number[] = [];
  /** Proposals touching a slot, for slots touched by two or more. */
  const lists = new Map<number, number[]>();
  const note = (map: Map<string, number>, name: string, i: number): void => {
    const slot = map.get(name);
    if (slot === undefined) {
      map.set(name, last.length);
      last.push(i);
    } else if (last[slot] !== i) {
      let list = lists.get(slot);
      if (!list) lists.set(slot, (list = [last[slot]]));
      list.push(i);
      last[slot] = i;
    }
  };
  for (let i = 0; i < proposals.length; i++) {
    const e = proposals[i].edit;
    for (const d of e.removeDevices) note(devices, d, i);
    for (const r of e.reconnect) note(devices, r.device, i);
    for (const d of e.addDevices) note(devices, d.name, i);
    for (const m of e.mergeNets) {
      note(nets, m.keep, i);
      note(nets, m.remove, i);
    }
  }
  const sets = new Map<number, Touched>();
  const setOf = (i: number): Touched => {
    let t = sets.get(i);
    if (!t) sets.set(i, (t = touched(proposals[i].edit)));
    return t;
  };
  const pairs = new Set<number>();
  const edges: OverlapGraph['edges'] = [];
  for (const slot of [...lists.keys()].sort((a, b) => a - b)) {
    const list = lists.get(slot)!;
    for (let x = 0; x < list.length; x++) {
      for (let y = x + 1; y < list.length; y++) {
        const key = list[x] * proposals.length + list[y];
        if (pairs.has(key)) continue;
        pairs.add(key);
        const o = overlapOf(setOf(list[x]), setOf(list[y]));
        edges.push({ a: proposals[list[x]].id, b: proposals[list[y]].id, ...o });
      }
    }
  }
  return { nodes: proposals.map((p) => p.id), edges };
}
