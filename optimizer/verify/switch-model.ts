// The switch network a switch-level simulation walks, built once from a FlatNetlist: channel
// edges (MOS channels, bipolar collector–emitter paths, loads, plain resistors, one-way diodes)
// with their controls, groups of nets joined by edges (union-find), and who reads each net.
import { InputError } from '../errors';
import type { FlatNetlist } from '../netlist/ir';
import type { Expr } from '../logic/expr';
import { makeContext, isRail } from '../extract/context';
import { BaseResolver } from '../extract/bipolar';
import { loadTransistor } from '../extract/mos';

/**
 * Strengths (Bryant 1984): rail > driven transistor > pull-up resistor > stored charge, plus a
 * bleed level below the pull-ups for resistors to ground (loads and base bleeds), so an output
 * pulled up against a load to ground reads high, as it does on the bench.
 */
export const RAIL = 5;
export const DRIVEN = 4;
export const WEAK = 3;
export const BLEED = 2;
export const CHARGE = 1;

export interface Edge {
  device: number;
  a: number;
  b: number;
  /** Strongest signal the edge passes. */
  cap: number;
  /** 'nmos' on at 1, 'pmos' on at 0, 'expr' = bipolar base drive, 'always' = resistor/load. */
  control: 'nmos' | 'pmos' | 'expr' | 'always';
  gate: number;
  expr?: Expr;
  /** Diodes: a (anode) passes 1 toward b; b (cathode) passes 0 toward a. */
  oneWay: boolean;
}

export interface SwitchModel {
  nl: FlatNetlist;
  edges: Edge[];
  /** Group per net (-1 for rails and inputs, which are sources). */
  groupOf: Int32Array;
  groups: { nets: number[]; edges: number[]; gates: number[] }[];
  /** Edges per net (adjacency, by edge index). */
  edgesAt: number[][];
  /** Groups that must be re-evaluated when this net changes (controls and source adjacency). */
  readers: number[][];
  /** Evaluation order: groups fed only by earlier ranks come later (feedback loops broken). */
  rank: Int32Array;
  /** Gate-level devices reading a net. */
  gateReaders: number[][];
  /** Gate-level devices (indices into nl.devices) and their output net. */
  gates: number[];
  railValue: Map<number, 0 | 1>;
  /** Per net: 0 or 1 for a rail, -1 otherwise (array form of railValue for the inner loops). */
  railVal: Int8Array;
  /** Per edge with control 'expr': the base drive compiled over net ids. */
  compiled: (CompiledExpr | undefined)[];
  isInput: Uint8Array;
  netIdsOf: (name: string) => number;
}

function find(p: Int32Array, x: number): number {
  while (p[x] !== x) {
    p[x] = p[p[x]];
    x = p[x];
  }
  return x;
}

export function buildSwitchModel(nl: FlatNetlist, inputNames: string[]): SwitchModel {
  const cx = makeContext(nl);
  const nNets = nl.nets.length;
  const netIdsOf = (name: string): number => {
    const id = nl.netByName.get(name);
    if (id === undefined) throw InputError.at('simulate.unknown-net', `the stimulus names net "${name}", which the design does not have`);
    return id;
  };
  const isInput = new Uint8Array(nNets);
  for (const n of inputNames) isInput[netIdsOf(n)] = 1;
  const railValue = new Map<number, 0 | 1>();
  for (const r of nl.rails) railValue.set(r.net, r.volts > 0 ? 1 : 0);
  const isSource = (n: number) => isInput[n] === 1 || isRail(cx, n);

  const bases = new BaseResolver(cx);
  const baseNet = new Set<number>();
  const inBaseNetwork = new Uint8Array(nl.devices.length);
  const edges: Edge[] = [];
  const gates: number[] = [];
  nl.devices.forEach((d, i) => {
    if (d.kind === 'npn' || d.kind === 'pnp') {
      const drive = bases.drive(i);
      for (const x of drive.devices) inBaseNetwork[x] = 1;
      baseNet.add(d.terminals[1]);
    }
  });
  nl.devices.forEach((d, i) => {
    const t = d.terminals;
    switch (d.kind) {
      case 'nmos':
      case 'pmos': {
        if (loadTransistor(cx, i)) edges.push({ device: i, a: t[0], b: t[2], cap: WEAK, control: 'always', gate: -1, oneWay: false });
        else edges.push({ device: i, a: t[0], b: t[2], cap: DRIVEN, control: d.kind, gate: t[1], oneWay: false });
        break;
      }
      case 'npn':
        edges.push({ device: i, a: t[0], b: t[2], cap: DRIVEN, control: 'expr', gate: -1, expr: bases.drive(i).on, oneWay: false });
        break;
      case 'pnp':
        // a PNP conducts while its base is pulled low
        edges.push({ device: i, a: t[0], b: t[2], cap: DRIVEN, control: 'pmos', gate: t[1], oneWay: false });
        break;
      case 'resistor':
        if (!inBaseNetwork[i] && !baseNet.has(t[0]) && !baseNet.has(t[1])) {
          const toLow = (isRail(cx, t[0]) && !railValue.get(t[0])) || (isRail(cx, t[1]) && !railValue.get(t[1]));
          edges.push({ device: i, a: t[0], b: t[1], cap: toLow ? BLEED : WEAK, control: 'always', gate: -1, oneWay: false });
        }
        break;
      case 'diode':
        if (!inBaseNetwork[i]) edges.push({ device: i, a: t[0], b: t[1], cap: DRIVEN, control: 'always', gate: -1, oneWay: true });
        break;
      case 'gate':
        gates.push(i);
        break;
      default:
        break; // capacitors and non-rail sources carry no switch-level signal
    }
  });
  // Groups: nets joined by edges, never through sources.
  const parent = new Int32Array(nNets);
  for (let i = 0; i < nNets; i++) parent[i] = i;
  for (const e of edges) {
    if (isSource(e.a) || isSource(e.b)) continue;
    const x = find(parent, e.a);
    const y = find(parent, e.b);
    if (x !== y) parent[x] = y;
  }
  const groupOf = new Int32Array(nNets).fill(-1);
  const groups: SwitchModel['groups'] = [];
  const rootGroup = new Map<number, number>();
  const groupFor = (n: number): number => {
    if (isSource(n)) return -1;
    if (groupOf[n] >= 0) return groupOf[n];
    const r = find(parent, n);
    let g = rootGroup.get(r);
    if (g === undefined) {
      g = groups.length;
      groups.push({ nets: [], edges: [], gates: [] });
      rootGroup.set(r, g);
    }
    groupOf[n] = g;
    groups[g].nets.push(n);
    return g;
  };
  const edgesAt: number[][] = Array.from({ length: nNets }, () => []);
  const readers: number[][] = Array.from({ length: nNets }, () => []);
  const gateReaders: number[][] = Array.from({ length: nNets }, () => []);
  const addReader = (net: number, g: number) => {
    const list = readers[net];
    if (list[list.length - 1] !== g) list.push(g);
  };
  edges.forEach((e, ei) => {
    const g = groupFor(e.a) >= 0 ? groupFor(e.a) : groupFor(e.b);
    groupFor(e.b);
    if (g < 0) return; // an edge between two sources carries nothing
    groups[g].edges.push(ei);
    edgesAt[e.a].push(ei);
    edgesAt[e.b].push(ei);
    if (isSource(e.a)) addReader(e.a, g);
    if (isSource(e.b)) addReader(e.b, g);
    if (e.gate >= 0) addReader(e.gate, g);
    if (e.expr) for (const n of exprNets(e.expr, nl)) addReader(n, g);
  });
  for (const gi of gates) {
    const d = nl.devices[gi];
    const g = groupFor(d.terminals[0]);
    if (g >= 0) groups[g].gates.push(gi);
    for (const n of d.terminals.slice(1)) {
      gateReaders[n].push(gi);
      if (g >= 0) addReader(n, g);
    }
  }
  const rank = rankGroups(groups, readers);
  const railVal = new Int8Array(nNets).fill(-1);
  for (const [net, v] of railValue) railVal[net] = v;
  const compiled = edges.map((e) => (e.expr ? compileExpr(e.expr, nl) : undefined));
  return { nl, edges, groupOf, groups, edgesAt, readers, rank, gateReaders, gates, railValue, railVal, compiled, isInput, netIdsOf };
}

/** A control expression with net names resolved to ids once, evaluated in three values. */
export type CompiledExpr =
  | { op: 'const'; mask: number }
  | { op: 'net'; net: number }
  | { op: 'not'; arg: CompiledExpr }
  | { op: 'and' | 'or' | 'xor'; args: CompiledExpr[] };

export function compileExpr(e: Expr, nl: FlatNetlist): CompiledExpr {
  switch (e.op) {
    case 'const':
      return { op: 'const', mask: e.value ? 2 : 1 };
    case 'var': {
      const id = nl.netByName.get(e.name);
      return id === undefined ? { op: 'const', mask: 3 } : { op: 'net', net: id };
    }
    case 'not':
      return { op: 'not', arg: compileExpr(e.arg, nl) };
    case 'and':
    case 'or':
    case 'xor':
      return { op: e.op, args: e.args.map((a) => compileExpr(a, nl)) };
    case 'implies':
      return { op: 'or', args: [{ op: 'not', arg: compileExpr(e.left, nl) }, compileExpr(e.right, nl)] };
    case 'iff':
      return { op: 'not', arg: { op: 'xor', args: [compileExpr(e.left, nl), compileExpr(e.right, nl)] } };
  }
}

/**
 * Topological ranks of the group graph (Kahn): evaluating in rank order settles acyclic logic with
 * one evaluation per group instead of unit-delay ripples that are quadratic in chain length.
 * Groups on loops get ranks after their ranked predecessors.
 */
function rankGroups(groups: SwitchModel['groups'], readers: number[][]): Int32Array {
  const n = groups.length;
  const succ: number[][] = groups.map((g) => {
    const out = new Set<number>();
    for (const net of g.nets) for (const r of readers[net]) if (r !== -1) out.add(r);
    return [...out];
  });
  const indeg = new Int32Array(n);
  succ.forEach((s, g) => s.forEach((t) => t !== g && indeg[t]++));
  const rank = new Int32Array(n).fill(-1);
  const queue: number[] = [];
  for (let g = 0; g < n; g++) if (indeg[g] === 0) queue.push(g);
  let next = 0;
  let head = 0;
  let assigned = 0;
  for (;;) {
    while (head < queue.length) {
      const g = queue[head++];
      if (rank[g] >= 0) continue;
      rank[g] = next++;
      assigned++;
      for (const t of succ[g]) if (t !== g && --indeg[t] === 0 && rank[t] < 0) queue.push(t);
    }
    if (assigned === n) break;
    // a loop: start it at its first unranked group
    let g = 0;
    while (rank[g] >= 0) g++;
    indeg[g] = 0;
    queue.push(g);
  }
  return rank;
}

function exprNets(e: Expr, nl: FlatNetlist, out: number[] = []): number[] {
  switch (e.op) {
    case 'var': {
      const id = nl.netByName.get(e.name);
      if (id !== undefined) out.push(id);
      break;
    }
    case 'not':
      exprNets(e.arg, nl, out);
      break;
    case 'and':
    case 'or':
    case 'xor':
      for (const a of e.args) exprNets(a, nl, out);
      break;
    case 'implies':
    case 'iff':
      exprNets(e.left, nl, out);
      exprNets(e.right, nl, out);
      break;
    default:
      break;
  }
  return out;
}
