// constant-input: a gate input tied to a rail, or to a net the stated assumptions hold constant,
// does not need its transistor (or its input): switches that never conduct go, switches that always
// conduct are shorted out, base resistors / input diodes of constant inputs go, and gate-level
// primitives lose the input. A gate whose output becomes constant is left alone.
import { z } from 'zod';
import type { LogicNode, SwitchNetwork } from '../extract/types';
import { c, support, substitute, type Expr } from '../logic/expr';
import type { GateOp } from '../netlist/ir';
import type { MapFamily } from '../logic/family-parts';
import { defineRule } from './define-rule';
import { fixedByAssumptions, type FixedValue } from './support/fixed-nets';
import { instancesOf, listWords, placeOf } from './support/finding-words';
import { lineLoads, lineMargins } from './support/driver-margins';
import { NetIndex } from './support/net-index';
import { emptyEdit, type Edit, type FindingReport, type RuleContext } from './types';

const MAX_PATHS = 256;

/** Every conduction path of a switch network as a device list (series = concatenation). */
export function networkPaths(n: SwitchNetwork): number[][] {
  if (n.type === 'switch') return [[n.device]];
  if (n.type === 'parallel') return n.parts.flatMap(networkPaths).slice(0, MAX_PATHS + 1);
  let acc: number[][] = [[]];
  for (const part of n.parts) {
    const next: number[][] = [];
    for (const a of acc) for (const b of networkPaths(part)) next.push([...a, ...b]);
    acc = next.slice(0, MAX_PATHS + 1);
  }
  return acc;
}

function switchesOn(n: SwitchNetwork, into = new Map<number, Expr>()): Map<number, Expr> {
  if (n.type === 'switch') into.set(n.device, n.on);
  else for (const p of n.parts) switchesOn(p, into);
  return into;
}

/**
 * Whether substituting the fixed nets could make the switch's condition constant: it holds a
 * constant, a fixed net, or an empty and/or/xor (the constructors fold only constants, so a tree
 * with none of these stays non-constant).
 */
function mayFold(e: Expr, fixed: ReadonlyMap<string, unknown>): boolean {
  switch (e.op) {
    case 'const':
      return true;
    case 'var':
      return fixed.has(e.name);
    case 'not':
      return mayFold(e.arg, fixed);
    case 'and':
    case 'or':
    case 'xor':
      if (e.args.length === 0) return true;
      for (const a of e.args) if (mayFold(a, fixed)) return true;
      return false;
    case 'implies':
    case 'iff':
      return mayFold(e.left, fixed) || mayFold(e.right, fixed);
  }
}

function networkMayFold(n: SwitchNetwork, fixed: ReadonlyMap<string, unknown>): boolean {
  if (n.type === 'switch') return mayFold(n.on, fixed);
  for (const p of n.parts) if (networkMayFold(p, fixed)) return true;
  return false;
}

/**
 * A cheap test that transistorLevel can find nothing in a node: no switch condition folds to a
 * constant and no base resistor or input diode hangs on a fixed net, so every path survives,
 * nothing is shorted and nothing can go. Most gates of a design read no fixed net.
 */
function readsFixed(nl: RuleContext['netlist'], node: LogicNode, fixed: ReadonlyMap<string, unknown>): boolean {
  for (const g of node.groups) {
    if (g.pullDown && networkMayFold(g.pullDown, fixed)) return true;
    if (g.pullUp && networkMayFold(g.pullUp, fixed)) return true;
    for (const b of g.bases) {
      if (b.kind === 'resistor-sum') {
        for (const r of b.baseResistors) if (fixed.has(nl.nets[r.from].name)) return true;
      } else if (b.kind === 'diode-and') {
        for (const d of b.inputDiodes) if (fixed.has(nl.nets[nl.devices[d].terminals[1]].name)) return true;
      }
    }
  }
  return false;
}

interface Fixed extends FixedValue {
  why: string;
}

export const constantInput = defineRule({
  id: 'constant-input',
  meta: {
    description: 'A gate input tied to a rail or held constant by the assumptions: drop the input and the transistor that serves it.',
    messages: {
      simplify: '{gate} ({place}) has {inputs}; {removed} part(s) can go and it still computes the same output',
      simplifyEach: '{gate} in {count} instances of {cell} ({place}) has {inputs}; {removed} part(s) can go in each, {total} in all, and each still computes the same output',
      gate: 'gate {gate} ({place}) has {inputs}; it becomes {result}',
    },
    optionsSchema: z.object({}),
    defaultOptions: {},
  },
  find(ctx) {
    const { netlist: nl, view } = ctx;
    const idx = new NetIndex(nl, view);
    const fixed = new Map<string, Fixed>();
    for (const r of nl.rails) {
      const { name, kind } = nl.nets[r.net];
      // gate-level supplies carry no voltage: say which constant they are
      const why = kind === 'supply1' ? 'tied to 1' : kind === 'supply0' ? 'tied to 0' : `on a ${r.volts} V rail`;
      fixed.set(name, { value: r.volts > 0 ? 1 : 0, assumptions: [], why });
    }
    for (const [name, f] of fixedByAssumptions(ctx.assumptions)) {
      if (!fixed.has(name)) fixed.set(name, { ...f, why: `held at ${f.value} by ${f.assumptions.join(', ')}` });
    }
    if (fixed.size === 0) return;
    const found: Simplified[] = [];
    for (const node of view.nodes) {
      if (!['static', 'open-collector', 'wired'].includes(node.kind) || !idx.ownsAlone(node)) continue;
      if (node.family !== 'gate' && !readsFixed(nl, node, fixed)) continue;
      const one = node.family === 'gate' ? gateLevel(ctx, idx, node, fixed) : transistorLevel(ctx, idx, node, fixed);
      if (one) found.push(one);
    }
    for (const r of acrossInstances(found)) ctx.report(r);
  },
});

/** One simplified gate: its report, and the instance it lies in (when all its parts lie in one). */
interface Simplified {
  report: FindingReport;
  /** The gate's output net (a port net's name differs from copy to copy). */
  net: string;
  path: readonly string[];
  cell?: string;
}

/**
 * The same simplification inside every instance of a slice subcircuit is one finding: gates in
 * instances of the same cell whose reports are equal once the instance prefix is taken off (the
 * same parts, the same tied nets, the same margins) are reported together, one proposal removing
 * the parts of every copy. A copy that differs (another tie, other loads) stays on its own.
 */
function acrossInstances(found: readonly Simplified[]): FindingReport[] {
  const groups = new Map<string, Simplified[]>();
  const alone: Simplified[] = [];
  for (const f of found) {
    if (f.cell === undefined || f.path.length === 0) {
      alone.push(f);
      continue;
    }
    // (joined so the key is one flat string: map look-ups on a concatenated one are slow)
    const key = [f.cell, f.report.messageId, relativeKey(f)].join('\u0000');
    const list = groups.get(key);
    if (list) list.push(f);
    else groups.set(key, [f]);
  }
  const out = alone.map((f) => f.report);
  for (const list of groups.values()) out.push(list.length === 1 ? list[0].report : merged(list));
  return out;
}

/**
 * The copy's words (its place left out), edit, margin figures and assumptions as one text, with
 * its own instance prefix taken off names and its output net's name (which may be a port net
 * named outside the instance) replaced by one mark.
 * Plain substring replacement: a name that merely contains the prefix can only make two copies
 * look alike, which changes the wording, never the edit (the union of each copy's own edit).
 */
function relativeKey(f: Simplified): string {
  const prefix = `${f.path.join('.')}.`;
  const net = f.net;
  // (replaceAll of a plain string is split/join; most parts hold neither name and are kept as they are)
  const strip = (x: string) => {
    const y = x.includes(prefix) ? x.replaceAll(prefix, '\u0001.') : x;
    // (an empty name splits between every character, which replaceAll('') does not match)
    if (net === '') return y.split(net).join('\u0002');
    return y.includes(net) ? y.replaceAll(net, '\u0002') : y;
  };
  const r = f.report;
  const p = r.proposals[0];
  const e = p.edit;
  const { place: _place, ...data } = r.data ?? {};
  // what the copy is and does: its words, its edit, its margins' figures and its assumptions
  const parts: (string | number)[] = [r.messageId, ...Object.entries(data).flat(), ...e.removeDevices];
  for (const m of e.mergeNets) parts.push('m', m.keep, m.remove);
  for (const d of e.addDevices) parts.push('a', d.name, d.op ?? d.kind, ...d.terminals);
  for (const m of p.margins ?? []) parts.push('g', m.name, m.value, m.limit, m.status);
  parts.push('s', ...(p.assumptions ?? []));
  return parts.map((x) => (typeof x === 'string' ? strip(x) : String(x))).join('\u0000');
}

function merged(list: readonly Simplified[]): FindingReport {
  const first = list[0].report;
  const cat = <T>(pick: (r: FindingReport) => readonly T[] | undefined) => list.flatMap((f) => pick(f.report) ?? []);
  const proposal = first.proposals[0];
  const edits = list.map((f) => f.report.proposals[0].edit);
  const removed = proposal.edit.removeDevices.length;
  return {
    messageId: first.messageId === 'simplify' ? 'simplifyEach' : first.messageId,
    data: {
      ...first.data,
      count: list.length,
      cell: list[0].cell!,
      place: listWords(list.map((f) => placeOf(f.path))),
      removed,
      total: removed * list.length,
    },
    location: { devices: cat((r) => r.location.devices), instances: cat((r) => r.location.instances), nets: [...new Set(cat((r) => r.location.nets))] },
    proposals: [
      {
        ...proposal,
        title: `${proposal.title} (and the same in ${list.length - 1} more instance${list.length === 2 ? '' : 's'} of ${list[0].cell})`,
        edit: {
          ...emptyEdit(),
          removeDevices: edits.flatMap((e) => e.removeDevices),
          addDevices: edits.flatMap((e) => e.addDevices),
          reconnect: edits.flatMap((e) => e.reconnect),
          mergeNets: edits.flatMap((e) => e.mergeNets),
        },
      },
    ],
  };
}

function sameNames(a: readonly string[], b: readonly string[]): boolean {
  if (a === b) return true;
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

/** The instance all of a gate's parts lie in, with its cell, or none when they span instances. */
function instanceOf(nl: RuleContext['netlist'], devices: readonly number[]): Pick<Simplified, 'path' | 'cell'> {
  const d0 = nl.devices[devices[0]];
  const key = d0.path.join('.');
  for (const d of devices) {
    const dev = nl.devices[d];
    if (dev.cell !== d0.cell || (!sameNames(dev.path, d0.path) && dev.path.join('.') !== key)) return { path: [] };
  }
  return { path: d0.path, cell: d0.cell };
}

function transistorLevel(ctx: RuleContext, idx: NetIndex, node: LogicNode, fixed: Map<string, Fixed>): Simplified | undefined {
  const nl = ctx.netlist;
  const removed = new Set<number>();
  const merges: { keep: string; remove: string }[] = [];
  const reasons = new Map<string, Fixed>();
  const railName = (net: number) => (idx.railNets.has(net) ? nl.nets[net].name : undefined);
  for (const g of node.groups) {
    const nets = [g.pullDown, g.pullUp].filter((x): x is SwitchNetwork => !!x);
    for (const network of nets) {
      const on = switchesOn(network);
      const value = new Map<number, Expr>();
      for (const [d, e] of on) {
        const used = [...support(e)].filter((n) => fixed.has(n) && !idx.railNets.has(idx.netId(n)!));
        const after = substitute(e, (n) => (fixed.has(n) ? c(fixed.get(n)!.value) : undefined));
        value.set(d, after);
        if (after.op !== 'const') continue;
        for (const n of used) reasons.set(n, fixed.get(n)!);
        if (e.op === 'const') {
          // tied to a rail where the extractor read it: name the control net the device sees
          const dev = nl.devices[d];
          const base = g.bases.find((b) => b.transistor === d);
          // (a base resistor from a 0 V rail is read as the base's bleed: look through the whole base network)
          const railNet = base
            ? base.baseResistors.map((r) => railName(r.from)).find(Boolean) ?? base.devices.flatMap((bd) => nl.devices[bd].terminals).map(railName).find(Boolean) ?? railName(dev.terminals[1])
            : railName(dev.terminals[1]);
          if (railNet) reasons.set(railNet, fixed.get(railNet)!);
        }
      }
      const isOpen = (d: number) => value.get(d)!.op === 'const' && (value.get(d) as { value: number }).value === 0;
      const isShort = (d: number) => value.get(d)!.op === 'const' && (value.get(d) as { value: number }).value === 1;
      const paths = networkPaths(network);
      if (paths.length > MAX_PATHS) return;
      const surviving = paths.filter((p) => !p.some(isOpen));
      // a network that never or always conducts makes the output constant: not this rule's rewrite
      if (surviving.length === 0 || surviving.some((p) => p.every(isShort))) return;
      const keep = new Set(surviving.flat().filter((d) => !isShort(d)));
      for (const d of on.keys()) {
        if (keep.has(d)) continue;
        removed.add(d);
        const base = g.bases.find((b) => b.transistor === d);
        for (const bd of base?.devices ?? []) removed.add(bd);
        if (isShort(d) && surviving.some((p) => p.includes(d))) {
          const [a, , b] = nl.devices[d].terminals;
          const [k, r] = idx.railNets.has(b) || b === node.net ? [b, a] : [a, b];
          merges.push({ keep: nl.nets[k].name, remove: nl.nets[r].name });
        }
      }
      // Base networks of kept transistors: summed base resistors from nets held at 0, DTL input
      // diodes on nets held at 1 (the AND ignores them) — each only while another input remains.
      for (const b of g.bases) {
        if (!keep.has(b.transistor)) continue;
        if (b.kind === 'resistor-sum') {
          const dead = b.baseResistors.filter((r) => fixed.get(nl.nets[r.from].name)?.value === 0 && !idx.railNets.has(r.from));
          if (dead.length && dead.length < b.baseResistors.length) for (const r of dead) { removed.add(r.device); reasons.set(nl.nets[r.from].name, fixed.get(nl.nets[r.from].name)!); }
        } else if (b.kind === 'diode-and') {
          const dead = b.inputDiodes.filter((d) => fixed.get(nl.nets[nl.devices[d].terminals[1]].name)?.value === 1);
          if (dead.length && dead.length < b.inputDiodes.length) for (const d of dead) { removed.add(d); const n = nl.nets[nl.devices[d].terminals[1]].name; reasons.set(n, fixed.get(n)!); }
        }
      }
    }
  }
  if (removed.size === 0 || reasons.size === 0) return;
  const devices = [...removed].map((d) => nl.devices[d].name);
  const margins = lineMargins(node, lineLoads(idx, node.net, ctx.margins), node.family as MapFamily, ctx.margins);
  // the gate is named by a part that stays (the first device may be a tied-off one that goes)
  const gate = node.groups[0].devices.find((d) => !removed.has(d)) ?? node.groups[0].devices[0];
  const rep = report(node, nl.devices[gate].name, reasons, {
    messageId: 'simplify',
    data: { removed: removed.size },
    location: { devices, instances: instancesOf([...removed].map((d) => nl.devices[d].path)), nets: [node.name, ...reasons.keys()] },
    proposals: [{ title: `simplify the gate driving ${node.name}: remove ${listWords(devices)}`, edit: { ...emptyEdit(), removeDevices: devices, mergeNets: merges }, margins }],
  });
  return { report: rep, net: node.name, ...instanceOf(nl, [...node.devices, ...removed]) };
}

const SIMPLE: Partial<Record<GateOp, { controlling?: 0 | 1; invert: boolean; parity?: boolean }>> = {
  and: { controlling: 0, invert: false },
  nand: { controlling: 0, invert: true },
  or: { controlling: 1, invert: false },
  nor: { controlling: 1, invert: true },
  xor: { invert: false, parity: true },
  xnor: { invert: true, parity: true },
};

function gateLevel(ctx: RuleContext, idx: NetIndex, node: LogicNode, fixed: Map<string, Fixed>): Simplified | undefined {
  const nl = ctx.netlist;
  if (node.devices.length !== 1) return;
  const dev = nl.devices[node.devices[0]];
  const shape = dev.op ? SIMPLE[dev.op] : undefined;
  if (!shape) return;
  const ins = dev.terminals.slice(1).map((t) => nl.nets[t].name);
  const held = ins.filter((n) => fixed.has(n));
  if (held.length === 0) return;
  if (!shape.parity && held.some((n) => fixed.get(n)!.value === shape.controlling)) return; // constant output
  const rest = ins.filter((n) => !fixed.has(n));
  if (rest.length === 0) return;
  let invert = shape.invert;
  if (shape.parity) for (const n of held) if (fixed.get(n)!.value === 1) invert = !invert;
  const base = dev.op === 'and' || dev.op === 'nand' ? 'and' : dev.op === 'or' || dev.op === 'nor' ? 'or' : 'xor';
  const op: GateOp = rest.length === 1 ? (invert ? 'not' : 'buf') : (({ and: ['and', 'nand'], or: ['or', 'nor'], xor: ['xor', 'xnor'] } as const)[base][invert ? 1 : 0]);
  const reasons = new Map(held.map((n) => [n, fixed.get(n)!]));
  const named = new Set<string>();
  for (const a of ctx.assumptions) support(a.expr, named);
  const edit: Edit = { ...emptyEdit(), removeDevices: [dev.name] };
  let margins = lineMargins(node, lineLoads(idx, node.net, ctx.margins), 'gate', ctx.margins);
  let result: string;
  if (op === 'buf' && !named.has(node.name) && !idx.ports.has(node.net)) {
    // a buffer is a wire: its loads move onto the remaining input
    edit.mergeNets.push({ keep: rest[0], remove: node.name });
    const inNet = idx.netId(rest[0])!;
    margins = lineMargins(idx.nodeOfNet(inNet), [...lineLoads(idx, inNet, ctx.margins, new Set([node.devices[0]])), ...lineLoads(idx, node.net, ctx.margins)], 'gate', ctx.margins);
    result = `a wire from ${rest[0]}`;
  } else {
    edit.addDevices.push({ name: dev.name, kind: 'gate', op, terminals: [node.name, ...rest], path: [...dev.path] });
    result = `${op}(${rest.join(', ')})`;
  }
  const rep = report(node, dev.name, reasons, {
    messageId: 'gate',
    data: { result },
    location: { devices: [dev.name], instances: instancesOf([dev.path]), nets: [node.name, ...held] },
    proposals: [{ title: `make ${dev.name} ${result}`, edit, margins }],
  });
  return { report: rep, net: node.name, ...instanceOf(nl, node.devices) };
}

function report(node: LogicNode, gate: string, reasons: Map<string, Fixed>, r: FindingReport): FindingReport {
  const assumptions = [...new Set([...reasons.values()].flatMap((f) => f.assumptions))].sort();
  const inputs = [...reasons].map(([n, f]) => `input ${n} ${f.why}`);
  return {
    ...r,
    data: { gate, place: placeOf(node.groups[0]?.path ?? []), inputs: listWords(inputs), ...r.data },
    proposals: r.proposals.map((p) => ({ ...p, assumptions })),
  };
}
