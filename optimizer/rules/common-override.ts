// common-override: N override (clear/preset) transistors — NPN on resistor-pulled lines, NMOS on
// lines pulled up by a resistor or a load transistor — driven by one control, each pulling its own
// line, become one override on a node the lines already share, or the fewest common overrides that
// pull the lines through steering diodes; checked for sink current, forced β or on-resistance, the
// lines' low level against their receivers, contention under the assumptions, and back-feed.
import { z } from 'zod';
import { isRail, type ExtractContext } from '../extract/context';
import type { LogicNode } from '../extract/types';
import type { MapFamily } from '../logic/family-parts';
import type { MarginResult } from '../margins/corners';
import type { Model } from '../netlist/ir';
import { defineRule } from './define-rule';
import { chunked, worstPerName, type Chunk } from './support/chunks';
import { betaMinOfDevice } from './support/driver-margins';
import { describePlaces } from './support/finding-words';
import { mosParams } from './support/mos-params';
import { NetIndex } from './support/net-index';
import { findOverrides, lineInfo, readersByName, sharedNodeOf, type LineInfo, type Override, type SharedNode } from './support/override-lines';
import {
  addLoads,
  emptyLoad,
  hungLowLevel,
  mosSteeredLowLevel,
  overrideForcedBeta,
  overrideSinkCurrent,
  steeredLowLevel,
  type OverrideLoad,
  type OverrideSwitch,
} from './support/override-margins';
import { switchChecks, type SwitchRegions } from './support/override-switch';
import { emptyEdit, type Edit, type RuleContext } from './types';

const OptionsSchema = z.object({
  /** Fewest override transistors worth a finding. */
  minCopies: z.number().int().min(2),
  /** Inputs simulated exhaustively by the switch-level checks; beyond, a seeded sample of 2^limit. */
  sneakExhaustiveLimit: z.number().int().min(1).max(14),
  /**
   * Also propose one override on a node the lines already share, and take NMOS overrides. On by
   * default: extraction reads a line hung from a pulled-up node, diode-OR nodes and NMOS steering
   * nodes (extract/node-pull-ups.ts, extract/mos-steering.ts), so the scan proves these rewrites;
   * switch either off to keep to the bipolar steering form.
   */
  sharedNode: z.boolean(),
  mosLines: z.boolean(),
});

/** Generic silicon diode (textbook values) for designs that have no diode model of their own. */
export const STEERING_MODEL: Model = { name: 'DSTEER', type: 'd', params: { IS: 1e-14 } };

/** The diode-steered low level of an NPN override does not depend on how many lines share it. */
const LOW_LEVEL = 'diode-steered low level';

/** Up to this many lines the split is searched one part count at a time; beyond, by doubling and bisection. */
const LINEAR_SPLIT_LIMIT = 64;

function switchOf(ctx: RuleContext, o: Override): OverrideSwitch {
  return o.kind === 'npn' ? { kind: 'npn' } : { kind: 'nmos', ...mosParams(ctx.netlist, o.transistor) };
}

/** Line loads and receivers of the members, with prefix sums so a run's load costs O(1). */
class MemberLoads {
  private readonly prefix: OverrideLoad[] = [emptyLoad()];
  private readonly famPrefix = new Map<MapFamily, Int32Array>();
  readonly families: MapFamily[] = [];

  constructor(
    readonly members: number[],
    info: (m: number) => LineInfo,
  ) {
    const pos = new Map<MapFamily, number>();
    const infos = members.map(info);
    for (const li of infos) for (const f of li.receivers) if (!pos.has(f)) pos.set(f, pos.size);
    this.families = [...pos.keys()];
    for (const f of this.families) this.famPrefix.set(f, new Int32Array(members.length + 1));
    infos.forEach((li, k) => {
      const inputSiemens = li.inputPullUps.reduce((a, r) => a + 1 / r, 0);
      this.prefix.push(addLoads(this.prefix[k], { lineSiemens: li.pullUpSiemens, lines: li.pullUps, inputSiemens, inputs: li.inputPullUps.length, directSiemens: 0, loadAmps: li.loadAmps }));
      for (const f of this.families) {
        const a = this.famPrefix.get(f)!;
        a[k + 1] = a[k] + (li.receivers.includes(f) ? 1 : 0);
      }
    });
  }

  /** Load of members [from, to). */
  load(from: number, to: number): OverrideLoad {
    const a = this.prefix[from];
    const b = this.prefix[to];
    return {
      lineSiemens: b.lineSiemens - a.lineSiemens,
      lines: b.lines - a.lines,
      inputSiemens: b.inputSiemens - a.inputSiemens,
      inputs: b.inputs - a.inputs,
      directSiemens: 0,
      loadAmps: b.loadAmps - a.loadAmps,
    };
  }

  receivers(from: number, to: number): MapFamily[] {
    return this.families.filter((f) => this.famPrefix.get(f)![to] - this.famPrefix.get(f)![from] > 0);
  }
}

function overrideMargins(ctx: RuleContext, kept: Override, load: OverrideLoad, receivers: MapFamily[], low: (sw: OverrideSwitch) => MarginResult): MarginResult[] {
  const sw = switchOf(ctx, kept);
  const out: MarginResult[] = [overrideSinkCurrent({ vcc: kept.vcc, load, sw }, ctx.margins)];
  if (kept.kind === 'npn' && kept.baseOhms !== undefined) {
    out.push(
      overrideForcedBeta(
        { vcc: kept.vcc, load, baseResistor: kept.baseOhms, ...(kept.driveVolts !== undefined ? { driveVolts: kept.driveVolts } : {}), betaMin: betaMinOfDevice(ctx.netlist, kept.transistor, ctx.margins) },
        ctx.margins,
      ),
    );
  }
  if (receivers.length) out.push(low(sw));
  return out;
}

/** Margins of the steered runs: each run's override with its own lines' load and receivers. */
function steeredMargins(ctx: RuleContext, ov: Override[], loads: MemberLoads, chunks: Chunk[]): MarginResult[] {
  const out: MarginResult[] = [];
  let at = 0;
  for (const ch of chunks) {
    const size = 1 + ch.others.length;
    const from = at;
    at += size;
    if (size < 2) continue;
    const kept = ov[ch.keep];
    const load = loads.load(from, at);
    const receivers = loads.receivers(from, at);
    out.push(
      ...overrideMargins(ctx, kept, load, receivers, (sw) => (sw.kind === 'npn' ? steeredLowLevel(kept.vcc, receivers, ctx.margins) : mosSteeredLowLevel({ vcc: kept.vcc, load, sw, receivers }, ctx.margins))),
    );
  }
  return worstPerName(out);
}

/**
 * The fewest runs whose margins all pass; when none does, one run with its failing margins (the
 * attractive rewrite shown refused, with the reason). A failure of a check that does not depend
 * on the split, or of the finest split, refuses every split at once. The load of a run only grows
 * with its length, so beyond a few dozen lines the count is found by doubling and bisection.
 */
function fewestRuns(members: number[], marginsFor: (chunks: Chunk[]) => MarginResult[], sizeFree: (m: MarginResult) => boolean): { parts: number; margins: MarginResult[]; passes: boolean } {
  const fails = (ms: MarginResult[]) => ms.some((m) => m.status === 'fail');
  const at = (k: number) => marginsFor(chunked(members, k));
  const single = at(1);
  const refused = { parts: 1, margins: single, passes: false };
  if (!fails(single)) return { parts: 1, margins: single, passes: true };
  if (single.some((m) => m.status === 'fail' && sizeFree(m)) || members.length < 3) return refused;
  if (members.length <= LINEAR_SPLIT_LIMIT) {
    for (let k = 2; k < members.length; k++) {
      const m = at(k);
      if (!fails(m)) return { parts: k, margins: m, passes: true };
    }
    return refused;
  }
  const finest = members.length - 1;
  if (fails(at(finest))) return refused;
  let lo = 1;
  let hi = 2;
  while (hi < finest && fails(at(hi))) [lo, hi] = [hi, Math.min(finest, hi * 2)];
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (fails(at(mid))) lo = mid;
    else hi = mid;
  }
  return { parts: hi, margins: at(hi), passes: true };
}

function unusedName(taken: (n: string) => boolean, want: string): string {
  let name = want;
  for (let k = 2; taken(name); k++) name = `${want}${k}`;
  return name;
}

function removeOthers(ctx: RuleContext, ov: Override[], others: number[], edit: Edit): void {
  const nl = ctx.netlist;
  for (const o of others) edit.removeDevices.push(...[ov[o].transistor, ...ov[o].baseDevices].map((d) => nl.devices[d].name));
}

function steeringEdit(ctx: RuleContext, ov: Override[], chunks: Chunk[], control: string): Edit {
  const nl = ctx.netlist;
  const edit = emptyEdit();
  const diodeModel = Object.values(nl.models).find((m) => m.type.toLowerCase() === 'd');
  // Only names that could collide with an added diode's (…DOVR…) need remembering.
  const deviceNames = new Set<string>();
  for (const d of nl.devices) if (d.name.includes('DOVR')) deviceNames.add(d.name);
  const tag = control.replace(/[^A-Za-z0-9_]/g, '_');
  chunks.forEach((ch, ci) => {
    const members = [ch.keep, ...ch.others];
    if (members.length < 2) return;
    const common = unusedName((n) => nl.netByName.has(n), `${tag}_OVR${chunks.length > 1 ? ci : ''}`);
    edit.reconnect.push({ device: nl.devices[ov[ch.keep].transistor].name, terminal: 0, net: common });
    removeOthers(ctx, ov, ch.others, edit);
    for (const m of members) {
      const line = ctx.view.nodes[ov[m].node];
      const path = nl.devices[ov[m].transistor].path;
      const name = unusedName((n) => deviceNames.has(n), [...path, 'DOVR'].join('.'));
      deviceNames.add(name);
      edit.addDevices.push({ name, kind: 'diode', terminals: [line.name, common], model: diodeModel?.name ?? STEERING_MODEL.name, path: [...path] });
    }
  });
  if (!diodeModel && edit.addDevices.length) edit.addModels = [STEERING_MODEL];
  return edit;
}

/** One override kept, its collector or drain moved onto the shared node; the others go. */
function sharedNodeEdit(ctx: RuleContext, ov: Override[], node: SharedNode): Edit {
  const edit = emptyEdit();
  const [keep, ...others] = node.members;
  edit.reconnect.push({ device: ctx.netlist.devices[ov[keep].transistor].name, terminal: 0, net: ctx.netlist.nets[node.net].name });
  removeOthers(ctx, ov, others, edit);
  return edit;
}

/** Margins of one override on a shared node. */
function sharedNodeMargins(ctx: RuleContext, ov: Override[], node: SharedNode, info: (m: number) => LineInfo): MarginResult[] {
  const kept = ov[node.members[0]];
  const lines = node.members.map(info);
  const receivers = [...new Set(lines.flatMap((l) => l.receivers))];
  if (node.via === 'diode') {
    const load = lines.reduce(
      (a, l) => addLoads(a, { lineSiemens: l.pullUpSiemens, lines: l.pullUps, inputSiemens: l.inputPullUps.reduce((s, r) => s + 1 / r, 0), inputs: l.inputPullUps.length, directSiemens: 0, loadAmps: l.loadAmps }),
      emptyLoad(),
    );
    return overrideMargins(ctx, kept, load, receivers, (sw) => (sw.kind === 'npn' ? steeredLowLevel(kept.vcc, receivers, ctx.margins) : mosSteeredLowLevel({ vcc: kept.vcc, load, sw, receivers }, ctx.margins)));
  }
  // Lines hang from the node: its own pull-up, and each DTL input through its diode and the line's resistor.
  const load: OverrideLoad = { ...emptyLoad(), directSiemens: node.sourceOhms ? 1 / node.sourceOhms : 0 };
  const hung = node.members.map((m, k) => {
    const ohms = ov[m].hungFrom!.ohms;
    for (const rp of lines[k].inputPullUps) {
      load.lineSiemens += 1 / (rp + ohms);
      load.lines++;
    }
    return { ohms, inputSiemens: lines[k].inputPullUps.reduce((s, r) => s + 1 / r, 0), receivers: lines[k].receivers };
  });
  return overrideMargins(ctx, kept, load, receivers, (sw) => hungLowLevel({ vcc: kept.vcc, load, sw, lines: hung }, ctx.margins));
}

/** Everything else that drives each line (an active pull-up the extractor does not explain still contends). */
function driversOf(cx: ExtractContext, net: number): number[] {
  const out = new Set<number>();
  for (let i = cx.offsets[net]; i < cx.offsets[net + 1]; i++) {
    const d = cx.termDev[i];
    const k = cx.nl.devices[d].kind;
    if (cx.termIdx[i] === 1 || k === 'resistor' || k === 'diode' || k === 'capacitor' || k === 'gate') continue;
    out.add(d);
  }
  return [...out];
}

function regions(ctx: RuleContext, cx: ExtractContext, ov: Override[], chunks: Chunk[], node?: SharedNode): SwitchRegions {
  const nl = ctx.netlist;
  const keptOf = new Map<number, number>();
  for (const ch of chunks) for (const m of [ch.keep, ...ch.others]) keptOf.set(m, ch.keep);
  const linkOf = new Map<number, number>();
  node?.members.forEach((m, k) => linkOf.set(m, node.links[k]));
  // Per member, once: its line's devices, what else drives the line, its link to a shared node,
  // and the MOS gates among them (rails aside) — a pair of lines and its override reuse them.
  const gatesOf = (devs: Iterable<number>) => {
    const out: number[] = [];
    for (const d of devs) {
      const dev = nl.devices[d];
      if ((dev.kind === 'nmos' || dev.kind === 'pmos') && !isRail(cx, dev.terminals[1])) out.push(dev.terminals[1]);
    }
    return out;
  };
  const parts = new Map<number, { devs: number[]; gates: number[] }>();
  const partOf = (m: number) => {
    let p = parts.get(m);
    if (!p) {
      const n = ctx.view.nodes[ov[m].node];
      const devs = new Set<number>(n.devices);
      for (const d of driversOf(cx, n.net)) devs.add(d);
      const link = linkOf.get(m);
      if (link !== undefined) devs.add(link);
      parts.set(m, (p = { devs: [...devs], gates: gatesOf(devs) }));
    }
    return p;
  };
  const otherGates = node ? gatesOf(node.others) : [];
  return {
    lineOf: (m) => ctx.view.nodes[ov[m].node].name,
    regionOf: (at) => {
      const region = new Set<number>();
      for (const i of at) for (const d of partOf(i).devs) region.add(d);
      if (node) for (const d of node.others) region.add(d);
      return [...region];
    },
    inputsOf: (at) => {
      // A load transistor's gate on its own line (depletion) is not an input.
      const own = new Set(at.map((i) => ctx.view.nodes[ov[i].node].net));
      const names = new Set<string>();
      for (const i of at) for (const x of ctx.view.nodes[ov[i].node].inputs) names.add(x);
      for (const i of at) for (const g of partOf(i).gates) if (!own.has(g)) names.add(nl.nets[g].name);
      for (const g of otherGates) if (!own.has(g)) names.add(nl.nets[g].name);
      return [...names].sort();
    },
    keptOf,
    // A pull-up node is pulled low on purpose (nothing else reads it); a diode node must keep its value.
    alsoWatch: node?.via === 'diode' ? [nl.nets[node.net].name] : [],
  };
}

export const commonOverride = defineRule({
  id: 'common-override',
  meta: {
    description:
      'Finds override (clear/preset) transistors — NPN or NMOS — driven by one control, each pulling its own pulled-up line, and proposes one override on a node the lines already share, or the fewest common override transistors that pull the lines through steering diodes, checked for sink current, forced β or on-resistance, the lines\' low level against the receivers, contention and back-feed between lines.',
    messages: {
      share: '{count} override transistors on {control} ({where}) can be {drivers} common override transistor(s) steering the lines through {diodes} diodes',
      failing: '{count} override transistors on {control} ({where}) could share one override through steering diodes, but it fails {failed}',
      shareNode: '{count} override transistors on {control} ({where}) can be one override transistor on {node}, the node the lines already share through their {via}s; it carries every line\'s current — check the data sheets',
      failingNode: '{count} override transistors on {control} ({where}) could be one override on {node}, the node the lines already share, but it fails {failed}',
    },
    optionsSchema: OptionsSchema,
    defaultOptions: { minCopies: 2, sneakExhaustiveLimit: 10, sharedNode: true, mosLines: true },
  },
  find(ctx, options) {
    const nl = ctx.netlist;
    // the terminal index every rule of a scan shares (built once per frozen design)
    const cx = NetIndex.of(nl, ctx.view).context;
    const ov = findOverrides(ctx, cx, options.minCopies, options.mosLines);
    if (ov.length < options.minCopies) return;
    const byControl = new Map<string, number[]>();
    ov.forEach((o, i) => {
      const g = byControl.get(o.control);
      if (g) g.push(i);
      else byControl.set(o.control, [i]);
    });
    const readers = readersByName(ctx.view.nodes, new Set(ov.map((o) => ctx.view.nodes[o.node].name)));
    const infos = new Map<number, LineInfo>();
    const info = (m: number) => {
      let li = infos.get(m);
      if (!li) infos.set(m, (li = lineInfo(ctx, cx, ov[m], readers)));
      return li;
    };
    const report = (members: number[], control: string, parts: number, edit: Edit, electrical: MarginResult[], electricalPass: boolean, chunks: Chunk[], node?: SharedNode) => {
      const nodes = members.map((i) => ctx.view.nodes[ov[i].node]);
      const { fight, backFeed, needs } = switchChecks(ctx, members, ov[members[0]].on, edit, regions(ctx, cx, ov, chunks, node), options.sneakExhaustiveLimit);
      const margins = [...electrical, fight, backFeed];
      const passes = electricalPass && fight.status !== 'fail' && backFeed.status !== 'fail';
      const failed = margins.filter((m) => m.status === 'fail').map((m) => m.name).join(', ');
      const where = describePlaces(nodes);
      const nodeName = node ? nl.nets[node.net].name : '';
      ctx.report({
        messageId: node ? (passes ? 'shareNode' : 'failingNode') : passes ? 'share' : 'failing',
        data: node
          ? { count: members.length, control, where, node: nodeName, via: node.via, ...(failed ? { failed } : {}) }
          : { count: members.length, control, where, drivers: parts, diodes: edit.addDevices.length, ...(failed ? { failed } : {}) },
        location: {
          devices: members.flatMap((i) => [ov[i].transistor, ...ov[i].baseDevices].map((d) => nl.devices[d].name)),
          instances: [...new Set(members.map((i) => nl.devices[ov[i].transistor].path.join('.')).filter(Boolean))],
          nets: node ? [...nodes.map((n) => n.name), nodeName] : nodes.map((n) => n.name),
        },
        proposals: [
          {
            title: node
              ? `One override on ${control} acting on the shared node ${nodeName} for ${members.length} lines`
              : parts === 1
                ? `One override on ${control} for ${members.length} lines through steering diodes`
                : `${parts} common overrides on ${control} through steering diodes`,
            edit,
            assumptions: needs.map((a) => a.id),
            margins,
          },
        ],
      });
    };
    for (const [key, group] of byControl) {
      if (group.length < options.minCopies) continue;
      const control = key.slice(key.indexOf('|') + 1);
      // Lines that already share a node: one override acting on it, nothing added.
      const node = options.sharedNode ? sharedNodeOf(ctx, cx, ov, group, options.minCopies) : undefined;
      if (node) {
        const electrical = sharedNodeMargins(ctx, ov, node, node.via === 'diode' ? (m) => lineInfo(ctx, cx, ov[m], readers, node.net) : info);
        const chunks = [{ keep: node.members[0], others: node.members.slice(1) }];
        report(node.members, control, 1, sharedNodeEdit(ctx, ov, node), electrical, !electrical.some((m) => m.status === 'fail'), chunks, node);
      }
      const onNode = new Set(node?.members ?? []);
      const members = group.filter((m) => !onNode.has(m) && !ov[m].hungFrom);
      if (members.length < options.minCopies) continue;
      const loads = new MemberLoads(members, info);
      const npn = ov[members[0]].kind === 'npn';
      // A receiver whose threshold an NPN's steered low level misses fails every split: stop at once.
      const { parts, margins: electrical, passes } = fewestRuns(members, (chunks) => steeredMargins(ctx, ov, loads, chunks), (m) => npn && m.name === LOW_LEVEL);
      const chunks = chunked(members, parts);
      report(members, control, parts, steeringEdit(ctx, ov, chunks, control), electrical, passes, chunks);
    }
  },
});
