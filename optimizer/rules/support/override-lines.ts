// The override transistors of a design and what each of their lines carries, found once per scan:
// NPN or NMOS switches from a pulled-up line to ground beside another pull-down, per line its
// pull-up conductance, transistor-load current, diode-input receivers and reading families; and
// the shared node several lines already have (their pull-ups hang from it, or diodes join them on it).
import { resistorPullUps } from '../../extract/bipolar';
import { isHighRail, isRail, otherEnd, type ExtractContext } from '../../extract/context';
import type { LogicNode } from '../../extract/types';
import { exprToString, type Expr } from '../../logic/expr';
import type { MapFamily } from '../../logic/family-parts';
import type { RuleContext } from '../types';
import { loadSaturationAmps } from './mos-params';
import { deviceOwnerCounts } from './same-function';

/**
 * A candidate override on one line: a lone NPN or NMOS from the line to ground beside another
 * pull-down. The ones whose control several lines share are the overrides.
 */
export interface Override {
  node: number;
  transistor: number;
  kind: 'npn' | 'nmos';
  /** The transistor's base network (removed with it; none for a MOS gate). */
  baseDevices: number[];
  /** family | condition — equal keys are the same override control. */
  control: string;
  /** Condition under which the override conducts. */
  on: Expr;
  baseOhms?: number;
  driveVolts?: number;
  /** Supply the line is pulled to. */
  vcc: number;
  /** Set when the line's only pull-up is a resistor from a non-rail node that is itself pulled up. */
  hungFrom?: { net: number; resistor: number; ohms: number };
}

/** A line pulled up only through a resistor from a node that a resistor pulls to a positive rail. */
function hungFrom(cx: ExtractContext, net: number): { net: number; resistor: number; ohms: number; vcc: number } | undefined {
  for (let i = cx.offsets[net]; i < cx.offsets[net + 1]; i++) {
    const d = cx.termDev[i];
    const dev = cx.nl.devices[d];
    if (dev.kind !== 'resistor' || dev.value === undefined) continue;
    const s = otherEnd(cx, d, cx.termIdx[i]);
    if (s === net || isRail(cx, s)) continue;
    const up = resistorPullUps(cx, s)[0];
    if (up && up.ohms !== undefined) return { net: s, resistor: d, ohms: dev.value, vcc: up.railVolts };
  }
  return undefined;
}

/**
 * Overrides whose control at least `min` lines share: candidates are keyed by control first, and
 * only those of a shared control get their base network and ownership checked (most switches of a
 * design have a control of their own).
 */
export function findOverrides(ctx: RuleContext, cx: ExtractContext, min = 1, mos = true): Override[] {
  const { netlist: nl, view } = ctx;
  const lowRails = new Set(nl.rails.filter((r) => r.volts <= 0).map((r) => r.net));
  type Candidate = { ni: number; br: { device: number; on: Expr }; control: string; vcc: number; hung?: ReturnType<typeof hungFrom> };
  const candidates: Candidate[] = [];
  const perControl = new Map<string, number>();
  view.nodes.forEach((node, ni) => {
    const bipolar = node.family === 'rtl' || node.family === 'dtl';
    if (!bipolar && !(mos && node.family === 'nmos')) return;
    // A line with nothing but the override is a plain inverter of the control: another rule's.
    // (counted first, without building the branch list: most gates of a design have one branch)
    let branchCount = 0;
    for (const g of node.groups) if (g.pullDown) branchCount += g.pullDown.type === 'parallel' ? g.pullDown.parts.length : 1;
    if (branchCount < 2) return;
    let vcc = node.pullUp?.railVolts;
    let hung: ReturnType<typeof hungFrom>;
    const pulled = node.pullUps.some((u) => (u.kind === 'resistor' && u.ohms !== undefined) || (!bipolar && u.kind === 'depletion'));
    if (node.kind === 'open-collector' && node.pullUps.length === 0) {
      hung = hungFrom(cx, node.net);
      vcc = hung?.vcc;
    } else if (!((node.kind === 'static' || node.kind === 'wired') && pulled)) return;
    if (vcc === undefined) return;
    const branches = node.groups.flatMap((g) => (g.pullDown ? (g.pullDown.type === 'parallel' ? g.pullDown.parts : [g.pullDown]) : []));
    const seenOnLine: string[] = [];
    for (const br of branches) {
      if (br.type !== 'switch') continue;
      const q = nl.devices[br.device];
      if (q.terminals[0] !== node.net || !lowRails.has(q.terminals[2])) continue;
      if (q.kind !== (bipolar ? 'npn' : 'nmos')) continue;
      // a switch whose control is a constant (a gate or base tied to a rail) is never an override
      if (br.on.op === 'const') continue;
      // (joined: a flat string is the fast kind of map key)
      const control = [node.family, exprToString(br.on)].join('|');
      // a second override of the same control on the same line is paralleled, not another line
      if (seenOnLine.includes(control)) continue;
      seenOnLine.push(control);
      candidates.push({ ni, br, control, vcc, ...(hung ? { hung } : {}) });
      perControl.set(control, (perControl.get(control) ?? 0) + 1);
    }
  });
  const owners = deviceOwnerCounts(view, nl.devices.length);
  const out: Override[] = [];
  for (const c of candidates) {
    if (perControl.get(c.control)! < min) continue;
    const { ni, br, vcc, hung } = c;
    const node = view.nodes[ni];
    const line = { node: ni, transistor: br.device, control: c.control, on: br.on, vcc, ...(hung ? { hungFrom: { net: hung.net, resistor: hung.resistor, ohms: hung.ohms } } : {}) };
    if (nl.devices[br.device].kind === 'nmos') {
      if (owners[br.device] === 1) out.push({ ...line, kind: 'nmos', baseDevices: [] });
      continue;
    }
    const base = node.groups.flatMap((g) => g.bases).find((b) => b.transistor === br.device);
    if (!base || base.kind === 'direct') continue;
    if (![br.device, ...base.devices].every((d) => owners[d] === 1)) continue;
    const ohms = base.baseResistors.map((r) => r.ohms).filter((x): x is number => x !== undefined);
    const dtl = base.kind === 'diode-and' && base.diodePullUp?.ohms !== undefined;
    out.push({
      ...line,
      kind: 'npn',
      baseDevices: base.devices,
      ...(dtl ? { baseOhms: base.diodePullUp!.ohms } : ohms.length ? { baseOhms: Math.max(...ohms) } : {}),
      ...(dtl ? { driveVolts: vcc - base.levelShiftDiodes.length * ctx.margins.vDiode } : {}),
    });
  }
  return out;
}

/** What one line puts on an override, and who reads it. */
export interface LineInfo {
  /** Σ 1/R of the line's resistor pull-ups to its rail, S, and how many. */
  pullUpSiemens: number;
  pullUps: number;
  /** Saturation current of the line's transistor loads while it is low, A. */
  loadAmps: number;
  /** Pull-ups of diode-input (DTL) receivers on the line, Ω: they feed the line while it is low. */
  inputPullUps: number[];
  /** Families of the stages that read the line (the line's own family when nothing here reads it). */
  receivers: MapFamily[];
}

/** Readers of the given nets (all when absent), by name, in one pass. */
export function readersByName(nodes: readonly LogicNode[], only?: ReadonlySet<string>): Map<string, LogicNode[]> {
  const readers = new Map<string, LogicNode[]>();
  for (const n of nodes) {
    for (const i of n.inputs) {
      if (only && !only.has(i)) continue;
      const r = readers.get(i);
      if (r) r.push(n);
      else readers.set(i, [n]);
    }
  }
  return readers;
}

/** `exclude`: a net whose stage is not a receiver (the shared node the lines' diodes feed). */
export function lineInfo(ctx: RuleContext, cx: ExtractContext, o: Override, readers: Map<string, LogicNode[]>, exclude = -1): LineInfo {
  const nl = ctx.netlist;
  const line = ctx.view.nodes[o.node];
  const inputPullUps: number[] = [];
  for (let i = cx.offsets[line.net]; i < cx.offsets[line.net + 1]; i++) {
    const d = nl.devices[cx.termDev[i]];
    if (d.kind !== 'diode' || cx.termIdx[i] !== 1) continue;
    const up = resistorPullUps(cx, d.terminals[0])[0];
    if (up && up.ohms !== undefined) inputPullUps.push(up.ohms);
  }
  let pullUpSiemens = 0;
  let pullUps = 0;
  let loadAmps = 0;
  const railVolts = (net: number) => (isRail(cx, net) ? cx.railVolts[net] : undefined);
  for (const u of line.pullUps) {
    if (u.kind === 'resistor' && u.ohms !== undefined) {
      pullUpSiemens += 1 / u.ohms;
      pullUps++;
    } else if (u.kind === 'depletion') loadAmps += loadSaturationAmps(nl, u.device, u.railVolts, railVolts);
  }
  const r = (readers.get(line.name) ?? []).filter((n) => n.net !== exclude);
  return { pullUpSiemens, pullUps, loadAmps, inputPullUps, receivers: [...new Set(r.length ? r.map((n) => n.family) : [line.family])] };
}

/** A node the lines already share: their pull-ups hang from it, or each line has a diode onto it. */
export interface SharedNode {
  net: number;
  via: 'pull-up' | 'diode';
  /** Indices (into the overrides) of the lines on it, in design order. */
  members: number[];
  /** The link of each member (its pull-up resistor, or its diode), same order. */
  links: number[];
  /** Every other device on the node (its own pull-up or pull-down, readers): part of the region. */
  others: number[];
  /** For pull-up nodes: the node's own pull-up resistor, Ω, and its rail volts. */
  sourceOhms?: number;
}

/**
 * The shared node with the most of `members` on it (at least `min`), if any. A pull-up node must
 * carry nothing but the lines' pull-ups and its own pull-up to a rail (pulling it low must not
 * change anything else). A diode node is the cathode of one diode from each line; any other
 * diode onto it must come from a member too, so that the node's value with every line overridden
 * is what the override gives it.
 */
export function sharedNodeOf(ctx: RuleContext, cx: ExtractContext, ov: Override[], members: number[], min: number): SharedNode | undefined {
  const nl = ctx.netlist;
  const byNet = new Map<number, { via: 'pull-up' | 'diode'; members: number[]; links: number[] }>();
  const add = (net: number, via: 'pull-up' | 'diode', m: number, link: number) => {
    let e = byNet.get(net);
    if (!e) byNet.set(net, (e = { via, members: [], links: [] }));
    if (e.via !== via || e.members[e.members.length - 1] === m) return;
    e.members.push(m);
    e.links.push(link);
  };
  for (const m of members) {
    const o = ov[m];
    if (o.hungFrom) {
      add(o.hungFrom.net, 'pull-up', m, o.hungFrom.resistor);
      continue;
    }
    const net = ctx.view.nodes[o.node].net;
    for (let i = cx.offsets[net]; i < cx.offsets[net + 1]; i++) {
      const d = nl.devices[cx.termDev[i]];
      if (d.kind === 'diode' && cx.termIdx[i] === 0 && !isRail(cx, d.terminals[1]) && d.terminals[1] !== net) add(d.terminals[1], 'diode', m, cx.termDev[i]);
    }
  }
  let best: SharedNode | undefined;
  for (const [net, e] of byNet) {
    if (e.members.length < min || (best && best.members.length >= e.members.length)) continue;
    const linked = new Set(e.links);
    const others: number[] = [];
    let ok = true;
    let sourceOhms: number | undefined;
    for (let i = cx.offsets[net]; i < cx.offsets[net + 1] && ok; i++) {
      const d = cx.termDev[i];
      if (linked.has(d)) continue;
      const dev = nl.devices[d];
      // A MOS gate only reads the node.
      if ((dev.kind === 'nmos' || dev.kind === 'pmos') && cx.termIdx[i] === 1 && e.via === 'diode') continue;
      if (e.via === 'pull-up') {
        const far = dev.kind === 'resistor' ? otherEnd(cx, d, cx.termIdx[i]) : -1;
        if (far >= 0 && isHighRail(cx, far) && dev.value !== undefined) sourceOhms = sourceOhms === undefined ? dev.value : (sourceOhms * dev.value) / (sourceOhms + dev.value);
        else ok = false;
      } else if (dev.kind === 'diode' && cx.termIdx[i] === 1) ok = false;
      others.push(d);
    }
    if (!ok) continue;
    best = { net, via: e.via, members: e.members, links: e.links, others, ...(sourceOhms !== undefined ? { sourceOhms } : {}) };
  }
  return best;
}
