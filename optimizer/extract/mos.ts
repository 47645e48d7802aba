// MOS channel-connected components (Bryant, "Boolean analysis of MOS circuits", IEEE TCAD 6(4),
// 1987): nets joined by transistor channels (union-find; rails and driven/input nets cut them),
// then per observed net the conduction paths to each source give its function, drive condition
// and kind (static CMOS, NMOS with resistor/depletion load, tri-state, pass/transmission gate).
import { and, evaluateWords, not, or, support, c, type Expr } from '../logic/expr';
import type { DriverGroup, Family, LogicNode, NodeKind, PullUp, SwitchNetwork } from './types';
import { commonPath, controlOf, eachTerminal, isHighRail, isRail, netName, otherEnd, varOf, type ExtractContext } from './context';
import { isMosSteeringNode, withMosSteering } from './mos-steering';

const D = 0;
const G = 1;
const S = 2;
const MAX_PATHS = 4096;
const MAX_COMPONENT = 256;

const isMos = (k: string) => k === 'nmos' || k === 'pmos';

function modelVto(cx: ExtractContext, dev: number): number | undefined {
  const m = cx.nl.devices[dev].model;
  const p = m ? cx.nl.models[m.toLowerCase()]?.params : undefined;
  const raw = p ? (p.VTO ?? p.vto ?? p.Vto) : undefined;
  return typeof raw === 'number' ? raw : undefined;
}

/**
 * An always-on load transistor from a positive rail: depletion NMOS (negative VTO, or gate tied
 * to its own source), or a PMOS with its gate on ground (pseudo-NMOS). Returns the loaded net.
 */
export function loadTransistor(cx: ExtractContext, dev: number): { net: number; rail: number } | undefined {
  const d = cx.nl.devices[dev];
  const [dr, g, s] = d.terminals;
  const railEnd = isHighRail(cx, dr) ? dr : isHighRail(cx, s) ? s : -1;
  if (railEnd < 0) return undefined;
  const net = railEnd === dr ? s : dr;
  if (isRail(cx, net)) return undefined;
  if (d.kind === 'nmos' && ((modelVto(cx, dev) ?? 0) < 0 || g === net)) return { net, rail: railEnd };
  if (d.kind === 'pmos' && isRail(cx, g) && !isHighRail(cx, g)) return { net, rail: railEnd };
  return undefined;
}

function find(parent: Int32Array, x: number): number {
  while (parent[x] !== x) {
    parent[x] = parent[parent[x]];
    x = parent[x];
  }
  return x;
}

interface Path {
  cond: Expr;
  source: number;
  devices: number[];
  /** The path goes through another observed net before reaching its source. */
  viaOutput: boolean;
}

/**
 * @param driven nets driven by something other than MOS channels (bipolar nodes, gate outputs):
 *   sources for the MOS analysis, never joined into a component.
 */
export function extractMos(cx: ExtractContext, driven: Set<number>, isControlRead: (net: number) => boolean): LogicNode[] {
  const nl = cx.nl;
  const nNets = nl.nets.length;
  const loads = new Map<number, PullUp[]>();
  const loadDevs = new Set<number>();
  const mosDevs: number[] = [];
  // Nets a transistor connects straight to a rail: their drive is not in doubt.
  const railAdjacent = new Uint8Array(nNets);
  nl.devices.forEach((d, i) => {
    if (!isMos(d.kind)) return;
    const load = loadTransistor(cx, i);
    if (load) {
      loadDevs.add(i);
      const list = loads.get(load.net) ?? [];
      list.push({ device: i, kind: 'depletion', rail: load.rail, railVolts: cx.railVolts[load.rail] });
      loads.set(load.net, list);
      return;
    }
    mosDevs.push(i);
    const [dr, , s] = d.terminals;
    if (isRail(cx, dr)) railAdjacent[s] = 1;
    if (isRail(cx, s)) railAdjacent[dr] = 1;
  });
  if (mosDevs.length === 0) return [];
  const portSet = new Set(nl.ports);
  const hasStimulus = new Uint8Array(nNets);
  for (let k = 0; k < nl.devices.length; k++) {
    const d = nl.devices[k];
    if ((d.kind === 'vsource' || d.kind === 'isource') && !isRail(cx, d.terminals[0])) hasStimulus[d.terminals[0]] = 1;
  }
  const resistorLoad = (net: number): PullUp[] => {
    const out: PullUp[] = [];
    eachTerminal(cx, net, (di, t) => {
      const dev = nl.devices[di];
      if (dev.kind !== 'resistor') return;
      const o = otherEnd(cx, di, t);
      if (o !== net && isHighRail(cx, o)) out.push({ device: di, kind: 'resistor', ohms: dev.value, rail: o, railVolts: cx.railVolts[o] });
    });
    return out;
  };
  // Channel neighbours and transistor types per net.
  const neighbours = new Map<number, number[]>();
  const chanTypes = new Uint8Array(nNets); // bit 1 = nmos, bit 2 = pmos
  for (const i of mosDevs) {
    const d = nl.devices[i];
    const [dr, , s] = d.terminals;
    const bit = d.kind === 'nmos' ? 1 : 2;
    chanTypes[dr] |= bit;
    chanTypes[s] |= bit;
    // rails gather thousands of transistors and are never analysed: keep no list for them
    if (!isRail(cx, dr)) (neighbours.get(dr) ?? neighbours.set(dr, []).get(dr)!).push(s);
    if (!isRail(cx, s)) (neighbours.get(s) ?? neighbours.set(s, []).get(s)!).push(dr);
  }
  for (const n of neighbours.keys()) {
    if (!isRail(cx, n) && !loads.has(n)) {
      const r = resistorLoad(n);
      if (r.length) loads.set(n, r);
    }
  }
  const read = (n: number) => isControlRead(n) || portSet.has(n) || loads.has(n);
  // Sources: rails, nets other devices drive, stimulated nets, and primary inputs — a net no
  // control reads, not next to a rail, whose channel neighbours are all read signals (the data
  // side of a pass transistor or transmission gate).
  const isSource = new Uint8Array(nNets);
  for (let n = 0; n < nNets; n++) {
    if (isRail(cx, n) || driven.has(n) || hasStimulus[n]) isSource[n] = 1;
  }
  for (const [n, ms] of neighbours) {
    if (isSource[n] || railAdjacent[n] || loads.has(n) || isControlRead(n)) continue;
    if (ms.every((m) => !isRail(cx, m) && read(m))) isSource[n] = 1;
  }
  for (const [n, list] of [...loads]) {
    if (list[0]?.kind === 'depletion') {
      const r = resistorLoad(n);
      if (r.length) loads.set(n, [...list, ...r]);
    }
  }
  // Union-find over channels, never through sources.
  const parent = new Int32Array(nNets);
  for (let i = 0; i < nNets; i++) parent[i] = i;
  for (const i of mosDevs) {
    const [dr, , s] = nl.devices[i].terminals;
    if (isSource[dr] || isSource[s]) continue;
    const a = find(parent, dr);
    const b = find(parent, s);
    if (a !== b) parent[a] = b;
  }
  // Component sizes bound the path search: a huge component is reported, not searched.
  const size = new Map<number, number>();
  for (const i of mosDevs) {
    const [dr, , s] = nl.devices[i].terminals;
    const n = isSource[dr] ? s : dr;
    if (isSource[n]) continue;
    const r = find(parent, n);
    size.set(r, (size.get(r) ?? 0) + 1);
  }
  // Observed nets: non-source channel nets that something other than a channel reads (or with a load).
  const nodes: LogicNode[] = [];
  const observed = new Uint8Array(nNets);
  for (const i of mosDevs) {
    for (const t of [D, S]) {
      const n = nl.devices[i].terminals[t];
      if (isSource[n] || observed[n] || isMosSteeringNode(cx, n)) continue;
      let other = false;
      eachTerminal(cx, n, (di, ti) => {
        const k = nl.devices[di].kind;
        if (isMos(k) && (ti === D || ti === S) && !loadDevs.has(di)) return;
        if (k === 'capacitor' && isRail(cx, otherEnd(cx, di, ti))) return; // node capacitance
        other = true;
      });
      if (other || portSet.has(n) || loads.has(n) || chanTypes[n] === 3) observed[n] = 1;
    }
  }
  for (let n = 0; n < nNets; n++) {
    if (!observed[n]) continue;
    const compSize = size.get(find(parent, n)) ?? 0;
    if (compSize > MAX_COMPONENT) {
      cx.diagnostics.push({
        severity: 'warning',
        code: 'extract.too-complex',
        message: `net ${netName(cx, n)}: its channel-connected component has ${compSize} transistors (limit ${MAX_COMPONENT}); left out of the logic view`,
      });
      continue;
    }
    const node = analyseNet(cx, n, isSource, observed, loads.get(n) ?? [], loadDevs);
    if (node) nodes.push(withMosSteering(cx, node));
  }
  return nodes;
}

function analyseNet(
  cx: ExtractContext,
  net: number,
  isSource: Uint8Array,
  observed: Uint8Array,
  loads: PullUp[],
  loadDevs: Set<number>,
): LogicNode | undefined {
  const nl = cx.nl;
  const paths: Path[] = [];
  const onNet = new Set<number>([net]);
  const stackDevs: number[] = [];
  const stackConds: Expr[] = [];
  let overflow = false;
  let viaOutput = false;
  const walk = (n: number) => {
    if (overflow) return;
    eachTerminal(cx, n, (di, ti) => {
      if (overflow) return;
      const dev = nl.devices[di];
      if (!isMos(dev.kind) || (ti !== D && ti !== S) || loadDevs.has(di)) return;
      const next = dev.terminals[ti === D ? S : D];
      if (onNet.has(next)) return;
      const g = controlOf(cx, dev.terminals[G]);
      const on = dev.kind === 'nmos' ? g : not(g);
      stackDevs.push(di);
      stackConds.push(on);
      if (isSource[next]) {
        paths.push({ cond: and(...stackConds), source: next, devices: [...stackDevs], viaOutput });
        if (paths.length > MAX_PATHS) overflow = true;
      } else {
        const saved = viaOutput;
        if (observed[next]) viaOutput = true;
        onNet.add(next);
        walk(next);
        onNet.delete(next);
        viaOutput = saved;
      }
      stackDevs.pop();
      stackConds.pop();
    });
  };
  walk(net);
  if (overflow) {
    cx.diagnostics.push({
      severity: 'warning',
      code: 'extract.too-complex',
      message: `net ${netName(cx, net)}: more than ${MAX_PATHS} conduction paths; left out of the logic view`,
    });
    return undefined;
  }
  if (paths.length === 0 && loads.length === 0) return undefined;
  const valueOf = (s: number): Expr => (isRail(cx, s) ? c(isHighRail(cx, s) ? 1 : 0) : varOf(cx, s));
  const toHigh = paths.filter((p) => isRail(cx, p.source) && isHighRail(cx, p.source));
  const toLow = paths.filter((p) => isRail(cx, p.source) && !isHighRail(cx, p.source));
  const toSignal = paths.filter((p) => !isRail(cx, p.source));
  const enable = or(...paths.map((p) => p.cond));
  const value = or(...paths.map((p) => and(p.cond, valueOf(p.source))));
  const pullsLow = or(...toLow.map((p) => p.cond));
  const pullsHigh = or(...toHigh.map((p) => p.cond));
  const hasP = paths.some((p) => p.devices.some((d) => nl.devices[d].kind === 'pmos'));
  const family: Family = hasP ? 'cmos' : 'nmos';
  let kind: NodeKind;
  let fn: Expr;
  let en: Expr | undefined;
  if (loads.length) {
    fn = toSignal.length ? or(not(enable), value) : not(pullsLow);
    kind = 'static';
  } else if (tautology(enable)) {
    kind = 'static';
    fn = toSignal.length ? value : not(pullsLow);
  } else {
    en = enable;
    fn = value;
    kind = paths.some((p) => isRail(cx, p.source) && !p.viaOutput) ? 'tristate' : 'pass';
  }
  const asNetwork = (ps: Path[]): SwitchNetwork | undefined => {
    if (!ps.length) return undefined;
    const series = ps.map((p): SwitchNetwork => {
      const sw = p.devices.map((d): SwitchNetwork => {
        const g = controlOf(cx, nl.devices[d].terminals[G]);
        return { type: 'switch', device: d, on: nl.devices[d].kind === 'nmos' ? g : not(g) };
      });
      return sw.length === 1 ? sw[0] : { type: 'series', parts: sw };
    });
    return series.length === 1 ? series[0] : { type: 'parallel', parts: series };
  };
  const switches = [...new Set(paths.flatMap((p) => p.devices))];
  const group: DriverGroup = {
    family,
    pullDown: asNetwork(toLow),
    pullUp: asNetwork(toHigh),
    pullsLow,
    pullsHigh: loads.length ? or(pullsHigh, not(pullsLow)) : pullsHigh,
    bases: [],
    devices: [...switches, ...loads.map((l) => l.device)],
    path: commonPath(cx, switches),
    openCollector: loads.length === 0 && toHigh.length === 0 && toSignal.length === 0,
  };
  if (group.openCollector) kind = 'open-collector';
  return {
    net,
    name: netName(cx, net),
    kind,
    family,
    fn: group.openCollector ? not(pullsLow) : fn,
    inputs: [],
    devices: group.devices,
    pullUp: loads[0],
    pullUps: loads,
    groups: [group],
    enable: group.openCollector ? undefined : en,
  };
}

/** Exhaustive check over the support (bit-parallel); large supports are treated as not proven. */
export function tautology(e: Expr): boolean {
  if (e.op === 'const') return e.value === 1;
  const vars = [...support(e)];
  if (vars.length > 20) return false;
  const low = Math.min(vars.length, 5);
  const words = new Map<string, number>();
  const patterns = [0xaaaaaaaa, 0xcccccccc, 0xf0f0f0f0, 0xff00ff00, 0xffff0000];
  vars.slice(0, low).forEach((n, i) => words.set(n, patterns[i] | 0));
  const full = low === 5 ? -1 : (1 << (1 << low)) - 1;
  for (let hi = 0; hi < 1 << Math.max(0, vars.length - low); hi++) {
    vars.slice(low).forEach((n, i) => words.set(n, (hi >> i) & 1 ? -1 : 0));
    if ((evaluateWords(e, words) & full) !== (full | 0)) return false;
  }
  return true;
}
