// common-override: N override (clear/preset) transistors driven by one control, each pulling its
// own pulled-up line, become the fewest common override transistors that pull the lines through
// steering diodes — checked for sink current, forced β, the steered low level against the lines'
// receivers, contention with the normal drivers under the assumptions, and back-feed between lines.
import { z } from 'zod';
import type { LogicNode } from '../extract/types';
import { evaluate, exprToString, type Expr } from '../logic/expr';
import type { MapFamily } from '../logic/family-parts';
import type { MarginResult } from '../margins/corners';
import type { Model } from '../netlist/ir';
import { defineRule } from './define-rule';
import { chunked, fewestParts, worstPerName, type Chunk } from './support/chunks';
import { NetIndex } from './support/net-index';
import { betaMinOfDevice } from './support/driver-margins';
import { steeredForcedBeta, steeredLowLevel, steeredSinkCurrent } from './support/override-margins';
import { describePlaces } from './support/finding-words';
import { deviceOwnerCounts } from './support/same-function';
import { RegionSims } from './support/region-sim';
import { sneakMargin } from './support/sneak-check';
import { emptyEdit, type Assumption, type Edit, type RuleContext } from './types';

const OptionsSchema = z.object({
  /** Fewest override transistors worth a finding. */
  minCopies: z.number().int().min(2),
  /** Inputs simulated exhaustively by the switch-level checks; beyond, a seeded sample of 2^limit. */
  sneakExhaustiveLimit: z.number().int().min(1).max(14),
});

/** Generic silicon diode (textbook values) for designs that have no diode model of their own. */
export const STEERING_MODEL: Model = { name: 'DSTEER', type: 'd', params: { IS: 1e-14 } };

/**
 * A candidate override on one line: a lone NPN from the line to ground beside another pull-down.
 * Every such switch is a candidate; the ones whose control several lines share are the overrides.
 */
export interface Override {
  node: number;
  transistor: number;
  /** The transistor's base network (removed with it). */
  baseDevices: number[];
  /** family | condition — equal keys are the same override control. */
  control: string;
  /** Condition under which the override conducts. */
  on: Expr;
  baseOhms?: number;
  driveVolts?: number;
}

export function findOverrides(ctx: RuleContext): Override[] {
  const { netlist: nl, view } = ctx;
  const owners = deviceOwnerCounts(view, nl.devices.length);
  const lowRails = new Set(nl.rails.filter((r) => r.volts <= 0).map((r) => r.net));
  const out: Override[] = [];
  view.nodes.forEach((node, ni) => {
    if (node.kind !== 'static' && node.kind !== 'wired') return;
    if (node.family !== 'rtl' && node.family !== 'dtl') return;
    if (!node.pullUps.some((u) => u.kind === 'resistor' && u.ohms !== undefined)) return;
    const branches = node.groups.flatMap((g) => (g.pullDown ? (g.pullDown.type === 'parallel' ? g.pullDown.parts : [g.pullDown]) : []));
    // A line with nothing but the override is a plain inverter of the control: another rule's.
    if (branches.length < 2) return;
    for (const br of branches) {
      if (br.type !== 'switch') continue;
      const q = nl.devices[br.device];
      if (q.kind !== 'npn' || q.terminals[0] !== node.net || !lowRails.has(q.terminals[2])) continue;
      const base = node.groups.flatMap((g) => g.bases).find((b) => b.transistor === br.device);
      if (!base || base.kind === 'direct') continue;
      if (![br.device, ...base.devices].every((d) => owners[d] === 1)) continue;
      const ohms = base.baseResistors.map((r) => r.ohms).filter((x): x is number => x !== undefined);
      const dtl = base.kind === 'diode-and' && base.diodePullUp?.ohms !== undefined;
      const vcc = node.pullUp?.railVolts;
      out.push({
        node: ni,
        transistor: br.device,
        baseDevices: base.devices,
        control: `${node.family}|${exprToString(br.on)}`,
        on: br.on,
        ...(dtl ? { baseOhms: base.diodePullUp!.ohms } : ohms.length ? { baseOhms: Math.max(...ohms) } : {}),
        ...(dtl && vcc !== undefined ? { driveVolts: vcc - base.levelShiftDiodes.length * ctx.margins.vDiode } : {}),
      });
    }
  });
  return out;
}

/** Families of the stages that read a line (the line's own family when nothing here reads it). */
function receiverFamilies(readers: Map<string, LogicNode[]>, line: LogicNode): MapFamily[] {
  const r = readers.get(line.name) ?? [];
  return r.length ? r.map((n) => n.family) : [line.family];
}

/** Per line, the diode-input receivers' pull-ups (asked of the index once per line, not per split). */
function inputPullUpsOf(loads: NetIndex, memo: Map<number, number[]>, net: number): number[] {
  let r = memo.get(net);
  if (!r) {
    r = loads.driverLoads(net).diodeInputs.map((d) => d.pullUpOhms);
    memo.set(net, r);
  }
  return r;
}

/** The steered low level against the receivers depends on which lines share a part, not on how many parts there are. */
const LOW_LEVEL = 'diode-steered low level';

function chunkMargins(ctx: RuleContext, ov: Override[], chunk: Chunk, loads: NetIndex, readers: Map<string, LogicNode[]>, pullUpMemo: Map<number, number[]>): MarginResult[] {
  const members = [chunk.keep, ...chunk.others];
  if (members.length < 2) return [];
  const nodes = members.map((i) => ctx.view.nodes[ov[i].node]);
  const vcc = nodes[0].pullUp!.railVolts;
  const load = {
    linePullUps: nodes.flatMap((n) => n.pullUps.map((u) => u.ohms).filter((x): x is number => x !== undefined)),
    inputPullUps: nodes.flatMap((n) => inputPullUpsOf(loads, pullUpMemo, n.net)),
  };
  const kept = ov[chunk.keep];
  const out: MarginResult[] = [steeredSinkCurrent({ vcc, load }, ctx.margins)];
  if (kept.baseOhms !== undefined) {
    out.push(
      steeredForcedBeta(
        { vcc, load, baseResistor: kept.baseOhms, ...(kept.driveVolts !== undefined ? { driveVolts: kept.driveVolts } : {}), betaMin: betaMinOfDevice(ctx.netlist, kept.transistor, ctx.margins) },
        ctx.margins,
      ),
    );
  }
  out.push(steeredLowLevel(vcc, nodes.flatMap((n) => receiverFamilies(readers, n)), ctx.margins));
  return out;
}

function unusedName(taken: (n: string) => boolean, want: string): string {
  let name = want;
  for (let k = 2; taken(name); k++) name = `${want}${k}`;
  return name;
}

function steeringEdit(ctx: RuleContext, ov: Override[], chunks: Chunk[], control: string): Edit {
  const nl = ctx.netlist;
  const edit = emptyEdit();
  const diodeModel = Object.values(nl.models).find((m) => m.type.toLowerCase() === 'd');
  const deviceNames = new Set(nl.devices.map((d) => d.name));
  const tag = control.replace(/[^A-Za-z0-9_]/g, '_');
  chunks.forEach((ch, ci) => {
    const members = [ch.keep, ...ch.others];
    if (members.length < 2) return;
    const common = unusedName((n) => nl.netByName.has(n), `${tag}_OVR${chunks.length > 1 ? ci : ''}`);
    edit.reconnect.push({ device: nl.devices[ov[ch.keep].transistor].name, terminal: 0, net: common });
    for (const o of ch.others) edit.removeDevices.push(...[ov[o].transistor, ...ov[o].baseDevices].map((d) => nl.devices[d].name));
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

/** Whether a vector satisfies an assumption; one over nets outside the region says nothing here. */
function holds(a: Assumption, v: Record<string, 0 | 1>): boolean {
  try {
    return evaluate(a.expr, v) === 1;
  } catch {
    return true;
  }
}

/**
 * Contention of the common override with the lines' normal drivers: the rewritten region is
 * simulated at switch level; vectors where the override conducts and a line is driven both ways
 * must be ruled out by the stated assumptions (those that do are what the proposal relies on).
 * Contention while the override is off is the design's own, not this rewrite's.
 */
function contention(ctx: RuleContext, bad: { vector: Record<string, 0 | 1>; nets: string[] }[]): { margin: MarginResult; needs: Assumption[] } {
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

/** The region of some lines: their own devices and the other devices that drive them. */
function regionOf(ctx: RuleContext, ov: Override[], at: number[], drivers: Map<number, number[]>): number[] {
  const region = new Set<number>();
  for (const i of at) {
    const n = ctx.view.nodes[ov[i].node];
    for (const d of n.devices) region.add(d);
    for (const d of drivers.get(n.net) ?? []) region.add(d);
  }
  return [...region];
}

function inputsOf(ctx: RuleContext, ov: Override[], at: number[], region: number[]): string[] {
  const nl = ctx.netlist;
  const gates = region.flatMap((d) => (nl.devices[d].kind === 'nmos' || nl.devices[d].kind === 'pmos' ? [nl.nets[nl.devices[d].terminals[1]].name] : []));
  return [...new Set([...at.flatMap((i) => ctx.view.nodes[ov[i].node].inputs), ...gates])].sort();
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

/**
 * Contention and back-feed by switch-level simulation. When all the lines' inputs fit the
 * exhaustive limit the whole region is simulated at once; beyond, each pair of lines is simulated
 * with the kept override(s) of its part(s) — the lines meet only at the common override nets, so
 * a pair with its override shows any line-to-line path, and each small region is simulated
 * exhaustively instead of a whole-region sample whose cost grows with every line.
 */
function switchChecks(ctx: RuleContext, ov: Override[], members: number[], chunks: Chunk[], edit: Edit, drivers: Map<number, number[]>, limit: number): { fight: MarginResult; backFeed: MarginResult; needs: Assumption[] } {
  const nl = ctx.netlist;
  const on = ov[members[0]].on;
  const lineOf = (i: number) => ctx.view.nodes[ov[i].node].name;
  const all = regionOf(ctx, ov, members, drivers);
  const allInputs = inputsOf(ctx, ov, members, all);
  const groups: { watch: number[]; with: number[] }[] = [];
  if (allInputs.length <= limit) groups.push({ watch: members, with: members });
  else {
    const keptOf = new Map<number, number>();
    for (const ch of chunks) for (const m of [ch.keep, ...ch.others]) keptOf.set(m, ch.keep);
    for (let k = 0; k < members.length; k += 2) {
      const watch = members.slice(k, k + 2);
      groups.push({ watch, with: [...new Set([...watch, ...watch.map((m) => keptOf.get(m)!)])] });
    }
  }
  const split = editSplitter(edit);
  const sim = new RegionSims(nl, limit);
  const bad: { vector: Record<string, 0 | 1>; nets: string[] }[] = [];
  const runs: { region: number[]; edit: Edit; inputs: string[]; watch: string[] }[] = [];
  for (const g of groups) {
    const region = g.with === members ? all : regionOf(ctx, ov, g.with, drivers);
    const inputs = g.with === members ? allInputs : inputsOf(ctx, ov, g.with, region);
    const part = g.with === members ? edit : split(new Set(region.map((d) => nl.devices[d].name)), new Set(g.with.map(lineOf)));
    const watch = g.watch.map(lineOf);
    runs.push({ region, edit: part, inputs, watch });
    bad.push(...sim.contention(region, part, inputs, watch).filter((b) => evaluate(on, b.vector) === 1));
  }
  const { margin: fight, needs } = contention(ctx, bad);
  const allowed = needs.length ? (v: Record<string, 0 | 1>) => needs.every((a) => holds(a, v)) : undefined;
  const reports = runs.map((x) => sim.sneak(x.region, x.edit, x.inputs, x.watch, allowed));
  const joined = { bad: reports.flatMap((r) => r.bad), vectors: reports.reduce((n, r) => n + r.vectors, 0) };
  return { fight, backFeed: { ...sneakMargin(joined), name: 'back-feed between lines' }, needs };
}

export const commonOverride = defineRule({
  id: 'common-override',
  meta: {
    description:
      'Finds override (clear/preset) transistors driven by one control, each pulling its own pulled-up line, and proposes the fewest common override transistors that pull the lines through steering diodes, checked for sink current, forced β, the steered low level against the receivers, contention and back-feed between lines.',
    messages: {
      share: '{count} override transistors on {control} ({where}) can be {drivers} common override transistor(s) steering the lines through {diodes} diodes',
      failing: '{count} override transistors on {control} ({where}) could share one override through steering diodes, but it fails {failed}',
    },
    optionsSchema: OptionsSchema,
    defaultOptions: { minCopies: 2, sneakExhaustiveLimit: 10 },
  },
  find(ctx, options) {
    const ov = findOverrides(ctx);
    if (ov.length < options.minCopies) return;
    const byControl = new Map<string, number[]>();
    ov.forEach((o, i) => byControl.set(o.control, [...(byControl.get(o.control) ?? []), i]));
    const nl = ctx.netlist;
    const loads = new NetIndex(nl, ctx.view);
    const readers = new Map<string, LogicNode[]>();
    for (const n of ctx.view.nodes) for (const i of n.inputs) readers.set(i, [...(readers.get(i) ?? []), n]);
    for (const [key, members] of byControl) {
      if (members.length < options.minCopies) continue;
      const control = key.slice(key.indexOf('|') + 1);
      const nodes = members.map((i) => ctx.view.nodes[ov[i].node]);
      const lines = nodes.map((n) => n.name);
      const lineNets = new Set(nodes.map((n) => n.net));
      // Anything else that drives a line (an active pull-up the extractor does not explain still
      // contends in the switch-level model), per line net, found in one pass.
      const drivers = new Map<number, number[]>();
      nl.devices.forEach((d, i) => {
        if (d.kind === 'resistor' || d.kind === 'diode' || d.kind === 'capacitor' || d.kind === 'gate') return;
        const hit = new Set(d.terminals.filter((t, k) => k !== 1 && lineNets.has(t)));
        for (const t of hit) drivers.set(t, [...(drivers.get(t) ?? []), i]);
      });

      const marginsFor = (chunks: Chunk[]) => worstPerName(chunks.flatMap((ch) => chunkMargins(ctx, ov, ch, loads, readers, pullUpMemo)));
      const pullUpMemo = new Map<number, number[]>();
      // A receiver whose threshold the steered low level misses fails every split: stop at once.
      const { parts, margins: electrical, passes: electricalPass } = fewestParts(members, marginsFor, (m) => m.name === LOW_LEVEL);
      const chunks = chunked(members, parts);
      const edit = steeringEdit(ctx, ov, chunks, control);
      const { fight, backFeed, needs } = switchChecks(ctx, ov, members, chunks, edit, drivers, options.sneakExhaustiveLimit);
      const margins = [...electrical, fight, backFeed];
      const passes = electricalPass && fight.status !== 'fail' && backFeed.status !== 'fail';
      const failed = margins.filter((m) => m.status === 'fail').map((m) => m.name).join(', ');
      const diodes = edit.addDevices.length;
      ctx.report({
        messageId: passes ? 'share' : 'failing',
        data: { count: members.length, control, where: describePlaces(nodes), drivers: parts, diodes, ...(failed ? { failed } : {}) },
        location: {
          devices: members.flatMap((i) => [ov[i].transistor, ...ov[i].baseDevices].map((d) => nl.devices[d].name)),
          instances: [...new Set(members.map((i) => nl.devices[ov[i].transistor].path.join('.')).filter(Boolean))],
          nets: lines,
        },
        proposals: [
          {
            title: parts === 1 ? `One override on ${control} for ${members.length} lines through steering diodes` : `${parts} common overrides on ${control} through steering diodes`,
            edit,
            assumptions: needs.map((a) => a.id),
            margins,
          },
        ],
      });
    }
  },
});
