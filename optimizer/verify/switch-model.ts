// The switch network a switch-level simulation walks, built once from a FlatNetlist: channel
// edges (MOS channels, bipolar collector–emitter paths, loads, plain resistors, one-way diodes)
// with their controls, groups of nets joined by edges (union-find), and who reads each net.
import { InputError, InternalError } from '../errors';
import type { FlatNetlist } from '../netlist/ir';
import type { Expr } from '../logic/expr';
import { makeContext, isRail } from '../extract/context';
import { BaseResolver } from '../extract/bipolar';
import { loadTransistor } from '../extract/mos';
import { grow, Pairs, permute, type Csr } from './csr';
import { edgeArrays, layOut, type LaidOutTables } from './switch-layout';
import { TypedArena, type TypedAlloc } from '../netlist/typed-arena';

export type { Csr } from './csr';

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

/** Edge controls: resistor/load (always on), NMOS-like (on at 1), PMOS/PNP (on at 0), bipolar base drive. */
export const CTL_ALWAYS = 0;
export const CTL_NMOS = 1;
export const CTL_PMOS = 2;
export const CTL_EXPR = 3;

/** Base-drive programs, postfix, two ints an instruction (opcode, argument), OP_END last. */
export const OP_CONST = 0;
export const OP_NET = 1;
export const OP_NOT = 2;
export const OP_AND = 3;
export const OP_OR = 4;
export const OP_XOR = 5;
export const OP_END = 6;

/**
 * Everything is in typed arrays indexed by edge, net or group: a million-transistor design has
 * millions of edges and nets, and an object or array apiece would be most of the heap.
 *
 * Nets and edges are numbered in layout order (switch-layout.ts), not as in the netlist: group g's
 * nets are groupNetOff[g] .. groupNetOff[g+1]-1 and its edges likewise, groups in evaluation order.
 * `netPos` takes a netlist net id to its model id, `netAt` back; names, stimulus and results speak
 * netlist ids and convert at the boundary.
 */
export interface SwitchModel extends LaidOutTables {
  nl: FlatNetlist;
  groupCount: number;
  /** Gate-level devices whose output net is in the group. */
  groupGates: Csr;
  /** Gate-level devices (indices into nl.devices; their terminals are netlist ids). */
  gates: number[];
  /** Rail values by netlist id. */
  railValue: Map<number, 0 | 1>;
  /** Netlist id of a named net (stimulus inputs first; an InputError for an unknown name). */
  netIdsOf: (name: string) => number;
  /** Where the model's tables came from: per-net and per-group state built on it (the simulator's) comes from here too. */
  alloc: TypedAlloc;
}

function find(p: Int32Array, x: number): number {
  while (p[x] !== x) {
    p[x] = p[p[x]];
    x = p[x];
  }
  return x;
}

/**
 * Ids of the named nets that exist. A netlist whose name index is a plain map answers from it; a
 * flattened one builds its index on first use (flatten.ts), and that index is the nets in id order
 * with a later name winning, which one pass over the nets reproduces without building it.
 */
function netsNamed(nl: FlatNetlist, names: readonly string[]): Map<string, number> {
  const found = new Map<string, number>();
  if (names.length === 0) return found;
  if (!Object.getOwnPropertyDescriptor(nl, 'netByName')?.get) {
    for (const n of names) {
      const id = nl.netByName.get(n);
      if (id !== undefined) found.set(n, id);
    }
    return found;
  }
  const wanted = new Set(names);
  const nets = nl.nets;
  for (let i = 0; i < nets.length; i++) if (wanted.has(nets[i].name)) found.set(nets[i].name, i);
  return found;
}

/**
 * Bytes the build's two arenas are sized at, from counts one pass over the devices gives: the
 * build's own working tables (`scratch`, dropped when it returns) and the tables the model keeps
 * together with the simulator's state (`kept`). Upper bounds where cheap (groups ≤ nets,
 * edges ≤ devices that can carry one), one program of one net per bipolar transistor (a wider
 * base drive makes the arena start a further buffer).
 */
export function arenaBytes(nl: FlatNetlist): { scratch: number; kept: number } {
  const N = nl.nets.length;
  const D = nl.devices.length;
  let T = 0;
  let E = 0;
  let P = 0;
  let G = 0;
  let GI = 0;
  for (let i = 0; i < D; i++) {
    const d = nl.devices[i];
    T += d.terminals.length;
    if (d.kind === 'gate') {
      G++;
      GI += d.terminals.length - 1;
    } else if (d.kind !== 'capacitor' && d.kind !== 'vsource' && d.kind !== 'isource') E++;
    if (d.kind === 'npn') P++;
  }
  const code = 4 * P + 64;
  // readers: a source end or a gate per edge end, one per program net, one per gate input
  const R = P + GI + 3 * E;
  const slack = 64 * 8; // alignment of the arrays
  const scratch = 95 * N + 5 * T + D + 4 * code + 39 * E + 24 * R + 16 * G + 12 * GI + slack;
  const kept = 49 * N + D + 4 * code + 32 * E + 4 * R + 4 * G + 4 * GI + slack;
  return { scratch, kept };
}

/**
 * The model's name lookup. Made outside buildSwitchModel so the closure holds only these two: a
 * closure made inside it would share the scope of every build table and keep them all alive for
 * as long as the model.
 */
function netLookup(nl: FlatNetlist, inputIds: Map<string, number>): (name: string) => number {
  return (name) => {
    const id = inputIds.get(name) ?? nl.netByName.get(name);
    if (id === undefined) throw InputError.at('simulate.unknown-net', `the stimulus names net "${name}", which the design does not have`);
    return id;
  };
}

export function buildSwitchModel(nl: FlatNetlist, inputNames: string[]): SwitchModel {
  // Both arenas are taken at once, before any table is filled: their memory then starts at most
  // one full collection of the heap around the model (typed-arena.ts), where a hundred separate
  // arrays started one per 64 MB of them.
  const bytes = arenaBytes(nl);
  const scratch = new TypedArena(bytes.scratch);
  const kept = new TypedArena(bytes.kept);
  const cx = makeContext(nl, scratch);
  const nNets = nl.nets.length;
  // The stimulus inputs are found in one pass over the nets: the netlist's name index would be
  // built for them otherwise, and on a large design it is one of its costliest structures.
  const netIdsOf = netLookup(nl, netsNamed(nl, inputNames));
  const isInput = scratch.u8(nNets);
  for (const n of inputNames) isInput[netIdsOf(n)] = 1;
  const railValue = new Map<number, 0 | 1>();
  for (const r of nl.rails) railValue.set(r.net, r.volts > 0 ? 1 : 0);
  const railVal = scratch.i8(nNets).fill(-1);
  for (const [net, v] of railValue) railVal[net] = v;
  // isRail inlined: the imported binding is read through a getter on every call, millions of times here
  const railVolts = cx.railVolts;
  const isSource = (n: number) => isInput[n] === 1 || !Number.isNaN(railVolts[n]);

  // Each transistor's base drive is resolved once and compiled on the spot into `code`, in device
  // order (the edges below meet the programs in the same order); the base-network marks are kept.
  const bases = new BaseResolver(cx);
  const nDev = nl.devices.length;
  const baseNet = scratch.u8(nNets);
  const inBaseNetwork = scratch.u8(nDev);
  const gates: number[] = [];
  let npnCount = 0;
  for (let i = 0; i < nDev; i++) if (nl.devices[i].kind === 'npn') npnCount++;
  // a resistor-fed base is one net: (net, end) per program; wider drives grow the buffer
  let code = scratch.i32(4 * npnCount + 64);
  let codeLen = 0;
  const emit = (op: number, arg: number): void => {
    if (codeLen + 2 > code.length) code = grow(code, scratch);
    code[codeLen++] = op;
    code[codeLen++] = arg;
  };
  /** Net of a variable of the drive being compiled: its inputs carry the context's shared nodes. */
  let driveInputs: readonly number[] = [];
  const netOfVar = (e: Expr & { op: 'var' }): number | undefined => {
    for (const n of driveInputs) if (cx.vars[n] === e) return n;
    return nl.netByName.get(e.name);
  };
  const compile = (e: Expr): void => {
    switch (e.op) {
      case 'const':
        return emit(OP_CONST, e.value ? 2 : 1);
      case 'var': {
        const id = netOfVar(e);
        return id === undefined ? emit(OP_CONST, 3) : emit(OP_NET, id);
      }
      case 'not':
        compile(e.arg);
        return emit(OP_NOT, 0);
      case 'and':
      case 'or':
      case 'xor':
        for (const a of e.args) compile(a);
        return emit(e.op === 'and' ? OP_AND : e.op === 'or' ? OP_OR : OP_XOR, e.args.length);
      case 'implies':
        compile(e.left);
        emit(OP_NOT, 0);
        compile(e.right);
        return emit(OP_OR, 2);
      case 'iff':
        compile(e.left);
        compile(e.right);
        emit(OP_XOR, 2);
        return emit(OP_NOT, 0);
    }
  };
  for (let i = 0; i < nDev; i++) {
    const d = nl.devices[i];
    if (d.kind === 'npn' || d.kind === 'pnp') {
      const drive = bases.transient(i);
      for (const x of drive.devices) inBaseNetwork[x] = 1;
      baseNet[d.terminals[1]] = 1;
      if (d.kind === 'npn') {
        driveInputs = drive.inputs;
        compile(drive.on);
        emit(OP_END, 0);
      }
      // the inputs' shared variable nodes are not needed again: dropped, they die young instead
      // of a million of them being promoted into a heap that may already hold the netlist
      for (const n of drive.inputs) cx.vars[n] = undefined;
    }
  }
  driveInputs = [];
  /** Whether a device is a switch-level edge (at most one per device). */
  const hasEdge = (i: number): boolean => {
    const d = nl.devices[i];
    const t = d.terminals;
    switch (d.kind) {
      case 'nmos':
      case 'pmos':
      case 'npn':
      case 'pnp':
        return true;
      case 'resistor':
        // base resistors belong to the transistor's base drive, not to the switch network
        return !inBaseNetwork[i] && !baseNet[t[0]] && !baseNet[t[1]];
      case 'diode':
        return !inBaseNetwork[i];
      default:
        return false; // gates drive their outputs; capacitors and non-rail sources carry no signal
    }
  };
  // Arrays sized exactly, and every list below sized before it is filled: on a million-device
  // design each regrown or trimmed copy is tens of megabytes, and such allocations force full
  // collections of the (large) heap holding the netlist.
  let edgeTotal = 0;
  for (let i = 0; i < nDev; i++) if (hasEdge(i)) edgeTotal++;
  const edges = edgeArrays(scratch, edgeTotal);
  const { edgeDevice, edgeA, edgeB, edgeCap, edgeControl, edgeGate, edgeOneWay, programAt } = edges;
  let nEdges = 0;
  let nextProgram = 0;
  const edge = (device: number, a: number, b: number, cap: number, control: number, gate: number, oneWay: boolean): void => {
    edgeDevice[nEdges] = device;
    edgeA[nEdges] = a;
    edgeB[nEdges] = b;
    edgeCap[nEdges] = cap;
    edgeControl[nEdges] = control;
    edgeGate[nEdges] = gate;
    edgeOneWay[nEdges] = oneWay ? 1 : 0;
    nEdges++;
  };
  for (let i = 0; i < nDev; i++) {
    const d = nl.devices[i];
    const t = d.terminals;
    if (!hasEdge(i)) {
      if (d.kind === 'gate') gates.push(i);
      continue;
    }
    switch (d.kind) {
      case 'nmos':
      case 'pmos':
        if (loadTransistor(cx, i)) edge(i, t[0], t[2], WEAK, CTL_ALWAYS, -1, false);
        else edge(i, t[0], t[2], DRIVEN, d.kind === 'nmos' ? CTL_NMOS : CTL_PMOS, t[1], false);
        break;
      case 'npn':
        programAt[nEdges] = nextProgram;
        while (code[nextProgram] !== OP_END) nextProgram += 2;
        nextProgram += 2;
        edge(i, t[0], t[2], DRIVEN, CTL_EXPR, -1, false);
        break;
      case 'pnp':
        // a PNP conducts while its base is pulled low
        edge(i, t[0], t[2], DRIVEN, CTL_PMOS, t[1], false);
        break;
      case 'resistor': {
        const toLow = (isRail(cx, t[0]) && !railValue.get(t[0])) || (isRail(cx, t[1]) && !railValue.get(t[1]));
        edge(i, t[0], t[1], toLow ? BLEED : WEAK, CTL_ALWAYS, -1, false);
        break;
      }
      case 'diode':
        edge(i, t[0], t[1], DRIVEN, CTL_ALWAYS, -1, true);
        break;
    }
  }
  // Groups: nets joined by edges, never through sources.
  const parent = scratch.i32(nNets);
  for (let i = 0; i < nNets; i++) parent[i] = i;
  for (let ei = 0; ei < nEdges; ei++) {
    const a = edgeA[ei];
    const b = edgeB[ei];
    if (isSource(a) || isSource(b)) continue;
    const x = find(parent, a);
    const y = find(parent, b);
    if (x !== y) parent[x] = y;
  }
  // Group ids and each group's nets in first-touch order (edges, then gate outputs).
  const groupOf = scratch.i32(nNets).fill(-1);
  const groupOfRoot = scratch.i32(nNets).fill(-1);
  const netPairs = new Pairs(nNets, scratch);
  let groupCount = 0;
  const groupFor = (n: number): number => {
    if (isSource(n)) return -1;
    if (groupOf[n] >= 0) return groupOf[n];
    const r = find(parent, n);
    let g = groupOfRoot[r];
    if (g < 0) g = groupOfRoot[r] = groupCount++;
    groupOf[n] = g;
    netPairs.push(g, n);
    return g;
  };
  // readers: an edge's two ends and its gate, the nets of its base-drive program, gate inputs
  let gateInputs = 0;
  for (const gi of gates) gateInputs += nl.devices[gi].terminals.length - 1;
  let programNets = 0;
  for (let pc = 0; pc < codeLen; pc += 2) if (code[pc] === OP_NET) programNets++;
  const edgePairs = new Pairs(nEdges, scratch);
  // at most one reader per source end and gate of an edge, one per program net, one per gate input
  let readerBound = programNets + gateInputs;
  for (let ei = 0; ei < nEdges; ei++) {
    if (isSource(edgeA[ei])) readerBound++;
    if (isSource(edgeB[ei])) readerBound++;
    if (edgeGate[ei] >= 0) readerBound++;
  }
  const readerPairs = new Pairs(readerBound, scratch);
  const lastReader = scratch.i32(nNets).fill(-1);
  const addReader = (net: number, g: number): void => {
    if (lastReader[net] === g) return;
    lastReader[net] = g;
    readerPairs.push(net, g);
  };
  for (let ei = 0; ei < nEdges; ei++) {
    const a = edgeA[ei];
    const b = edgeB[ei];
    const ga = groupFor(a);
    const g = ga >= 0 ? ga : groupFor(b);
    groupFor(b);
    if (g < 0) continue; // an edge between two sources carries nothing
    edgePairs.push(g, ei);
    if (isSource(a)) addReader(a, g);
    if (isSource(b)) addReader(b, g);
    if (edgeGate[ei] >= 0) addReader(edgeGate[ei], g);
    if (edgeControl[ei] === CTL_EXPR) {
      for (let pc = programAt[ei]; code[pc] !== OP_END; pc += 2) if (code[pc] === OP_NET) addReader(code[pc + 1], g);
    }
  }
  const gatePairs = new Pairs(gates.length, scratch);
  const gateReaderPairs = new Pairs(gateInputs, scratch);
  for (const gi of gates) {
    const d = nl.devices[gi];
    const g = groupFor(d.terminals[0]);
    if (g >= 0) gatePairs.push(g, gi);
    for (let k = 1; k < d.terminals.length; k++) {
      const n = d.terminals[k];
      gateReaderPairs.push(n, gi);
      if (g >= 0) addReader(n, g);
    }
  }
  // Groups are renumbered in evaluation order, so the simulator's worklist is a bitmap over group
  // ids and a wave of evaluations walks the group tables front to back.
  const oldNets = netPairs.toCsr(groupCount);
  const oldReaders = readerPairs.toCsr(nNets);
  // the ranking's working tables are released at once: the tables built after it reuse that memory
  const order = scratch.i32(groupCount);
  const beforeRanking = scratch.mark();
  rankGroups(groupCount, oldNets, oldReaders, scratch, order);
  scratch.release(beforeRanking);
  for (let n = 0; n < nNets; n++) if (groupOf[n] >= 0) groupOf[n] = order[groupOf[n]];
  for (let i = 0; i < oldReaders.list.length; i++) oldReaders.list[i] = order[oldReaders.list[i]];
  const byRank = scratch.i32(groupCount);
  for (let g = 0; g < groupCount; g++) byRank[order[g]] = g;
  const laid = layOut(
    {
      nNets,
      ...edges,
      code: code.subarray(0, codeLen),
      groupOf,
      // only the offsets are kept (the group ranges); the lists are read once, by layOut
      groupNets: permute(oldNets, order, byRank, kept, scratch),
      groupEdges: permute(edgePairs.toCsr(groupCount), order, byRank, kept, scratch),
      readers: oldReaders,
      gateReaders: gateReaderPairs.toCsr(nNets),
      railVal,
      isInput,
    },
    kept,
    scratch,
  );
  const groupGates = permute(gatePairs.toCsr(groupCount), order, byRank, kept);
  return { nl, ...laid, groupCount, groupGates, gates, railValue, netIdsOf, alloc: kept };
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
 * Groups on loops get ranks after their ranked predecessors. The ranks are written into `rank`.
 */
function rankGroups(n: number, groupNets: Csr, readers: Csr, alloc: TypedAlloc, rank: Int32Array): void {
  // successors of each group in first-seen order, without a set per group
  // each net belongs to one group, so a group's successors number at most its nets' readers
  const succPairs = new Pairs(readers.list.length, alloc);
  const seenBy = alloc.i32(n).fill(-1);
  for (let g = 0; g < n; g++) {
    for (let i = groupNets.off[g]; i < groupNets.off[g + 1]; i++) {
      const net = groupNets.list[i];
      for (let j = readers.off[net]; j < readers.off[net + 1]; j++) {
        const r = readers.list[j];
        if (seenBy[r] === g) continue;
        seenBy[r] = g;
        succPairs.push(g, r);
      }
    }
  }
  const succ = succPairs.toCsr(n);
  const indeg = alloc.i32(n);
  for (let g = 0; g < n; g++) for (let i = succ.off[g]; i < succ.off[g + 1]; i++) if (succ.list[i] !== g) indeg[succ.list[i]]++;
  rank.fill(-1);
  // every group enters the queue once: when its last predecessor is ranked, or to start a loop
  const queue = alloc.i32(n);
  let tail = 0;
  for (let g = 0; g < n; g++) if (indeg[g] === 0) queue[tail++] = g;
  let next = 0;
  let head = 0;
  let assigned = 0;
  let firstUnranked = 0;
  for (;;) {
    while (head < tail) {
      const g = queue[head++];
      if (rank[g] >= 0) continue;
      rank[g] = next++;
      assigned++;
      for (let i = succ.off[g]; i < succ.off[g + 1]; i++) {
        const t = succ.list[i];
        if (t !== g && --indeg[t] === 0 && rank[t] < 0) queue[tail++] = t;
      }
    }
    if (assigned === n) break;
    // a loop: start it at its first unranked group (ranked groups stay ranked: the scan resumes)
    while (rank[firstUnranked] >= 0) firstUnranked++;
    indeg[firstUnranked] = 0;
    if (tail >= n) throw new InternalError('switch model: group ranking queued a group twice');
    queue[tail++] = firstUnranked;
  }
}
