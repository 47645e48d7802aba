// Lays the switch model out in evaluation order: nets and edges renumbered so that each group's
// nets and edges are consecutive and groups follow their ranks, which turns the simulator's reads
// of per-net and per-edge arrays into forward sweeps instead of jumps across the whole design.
// read when layOut runs, after both modules have loaded (switch-model imports this file)
import * as ops from './switch-model';
import { permute, type Csr } from './csr';
import { OWN_BUFFERS, type TypedAlloc } from '../netlist/typed-arena';

/** Per edge: the device, its two ends, strongest signal it passes, control kind and net. */
export interface EdgeTables {
  edgeDevice: Int32Array;
  edgeA: Int32Array;
  edgeB: Int32Array;
  edgeCap: Uint8Array;
  /** CTL_*: NMOS-like and PMOS-like edges read edgeGate, a bipolar edge runs its program. */
  edgeControl: Uint8Array;
  edgeGate: Int32Array;
  /** Diodes: a (anode) passes 1 toward b; b (cathode) passes 0 toward a. */
  edgeOneWay: Uint8Array;
  /** Per edge with CTL_EXPR: start of its base-drive program in `code`. */
  programAt: Int32Array;
  code: Int32Array;
}

/** Tables kept per net, in whichever numbering the tables around them use. */
interface NetTables {
  /**
   * Group per net (-1 for rails and inputs, which are sources). Group ids are the evaluation
   * order: a group fed only by lower ids comes later (feedback loops broken).
   */
  groupOf: Int32Array;
  /** Groups that must be re-evaluated when this net changes (controls and source adjacency). */
  readers: Csr;
  /** Gate-level devices reading a net. */
  gateReaders: Csr;
  /** Per net: 0 or 1 for a rail, -1 otherwise (array form of railValue for the inner loops). */
  railVal: Int8Array;
  isInput: Uint8Array;
}

/** The model's tables as built, in netlist ids (nets) and build order (edges). */
/** The per-edge tables (all but the programs' code), `n` long, from `alloc`; no edge has a program yet. */
export function edgeArrays(alloc: TypedAlloc, n: number): Omit<EdgeTables, 'code'> {
  return {
    edgeDevice: alloc.i32(n),
    edgeA: alloc.i32(n),
    edgeB: alloc.i32(n),
    edgeCap: alloc.u8(n),
    edgeControl: alloc.u8(n),
    edgeGate: alloc.i32(n),
    edgeOneWay: alloc.u8(n),
    programAt: alloc.i32(n).fill(-1),
  };
}

export interface BuiltTables extends EdgeTables, NetTables {
  nNets: number;
  /** Nets and edges of each ranked group, in the order the build met them. */
  groupNets: Csr;
  groupEdges: Csr;
}

/** The same tables in layout order: net k is netAt[k]; group g's nets and edges are ranges. */
export interface LaidOutTables extends EdgeTables, NetTables {
  /** Netlist net id → model id, and back. */
  netPos: Int32Array;
  netAt: Int32Array;
  edgeCount: number;
  /** Ranges of each group's nets and edges. */
  groupNetOff: Int32Array;
  groupEdgeOff: Int32Array;
  /**
   * Edges at each net of a group, in edge order (a group's edges are consecutive, so this is the
   * order they were built in). Sources have empty lists: a signal never spreads out of a source.
   */
  edgesAt: Csr;
}

/**
 * Renumbers nets and edges. Every list keeps its order (a group's nets and edges, the edges at a
 * net), so an evaluation visits the same things in the same sequence as before the renumbering and
 * its results, including which drivers a contention report names, do not change. Edges between two
 * sources belong to no group and are read by nothing; they are left out.
 */
export function layOut(t: BuiltTables, kept: TypedAlloc = OWN_BUFFERS, scratch: TypedAlloc = OWN_BUFFERS): LaidOutTables {
  const { nNets, groupOf, groupNets, groupEdges } = t;
  const netPos = kept.i32(nNets);
  const netAt = kept.i32(nNets);
  let k = 0;
  for (let i = 0; i < groupNets.list.length; i++) {
    const n = groupNets.list[i];
    netPos[n] = k;
    netAt[k++] = n;
  }
  // sources and nets outside every group follow, in netlist order
  for (let n = 0; n < nNets; n++) {
    if (groupOf[n] >= 0) continue;
    netPos[n] = k;
    netAt[k++] = n;
  }
  const pos = (n: number) => (n >= 0 ? netPos[n] : n);

  const edgeCount = groupEdges.list.length;
  const edges = edgeArrays(kept, edgeCount);
  const { edgeDevice, edgeA, edgeB, edgeCap, edgeControl, edgeGate, edgeOneWay, programAt } = edges;
  // filled here, then kept at its exact length (edges between two sources drop their programs)
  const code = scratch.i32(t.code.length);
  let codeLen = 0;
  const { OP_END, OP_NET } = ops;
  for (let e = 0; e < edgeCount; e++) {
    const old = groupEdges.list[e];
    edgeDevice[e] = t.edgeDevice[old];
    edgeA[e] = netPos[t.edgeA[old]];
    edgeB[e] = netPos[t.edgeB[old]];
    edgeCap[e] = t.edgeCap[old];
    edgeControl[e] = t.edgeControl[old];
    edgeGate[e] = pos(t.edgeGate[old]);
    edgeOneWay[e] = t.edgeOneWay[old];
    let pc = t.programAt[old];
    if (pc < 0) continue;
    // programs follow their edges, so a wave of evaluations reads them front to back too
    programAt[e] = codeLen;
    for (;;) {
      const op = t.code[pc];
      code[codeLen++] = op;
      code[codeLen++] = op === OP_NET ? netPos[t.code[pc + 1]] : t.code[pc + 1];
      pc += 2;
      if (op === OP_END) break;
    }
  }
  const edgesAt = edgesAtNets(edgeA, edgeB, nNets, groupNets.list.length, kept, scratch);

  const groupOfNew = kept.i32(nNets);
  const railVal = kept.i8(nNets);
  const isInput = kept.u8(nNets);
  for (let n = 0; n < nNets; n++) {
    const p = netPos[n];
    groupOfNew[p] = groupOf[n];
    railVal[p] = t.railVal[n];
    isInput[p] = t.isInput[n];
  }
  const keptCode = kept.i32(codeLen);
  keptCode.set(code.subarray(0, codeLen));
  return {
    netPos,
    netAt,
    edgeCount,
    ...edges,
    code: keptCode,
    groupOf: groupOfNew,
    groupNetOff: groupNets.off,
    groupEdgeOff: groupEdges.off,
    edgesAt,
    readers: permute(t.readers, netPos, netAt, kept),
    gateReaders: permute(t.gateReaders, netPos, netAt, kept),
    railVal,
    isInput,
  };
}

/**
 * Edges at each group net, built from the laid-out edges: a net's edges all lie in its own group,
 * whose edges are numbered in build order, so ascending ids give the order the simulator has always
 * walked them in (an edge with both ends on one net is listed twice, as before). Source nets, whose
 * lists the simulator never walks, get none.
 */
function edgesAtNets(edgeA: Int32Array, edgeB: Int32Array, nNets: number, groupNets: number, kept: TypedAlloc, scratch: TypedAlloc): Csr {
  const off = kept.i32(nNets + 1);
  // group nets are the first model ids
  const inGroup = (p: number) => p < groupNets;
  for (let e = 0; e < edgeA.length; e++) {
    if (inGroup(edgeA[e])) off[edgeA[e] + 1]++;
    if (inGroup(edgeB[e])) off[edgeB[e] + 1]++;
  }
  for (let p = 0; p < nNets; p++) off[p + 1] += off[p];
  const at = scratch.i32(nNets);
  at.set(off.subarray(0, nNets));
  const list = kept.i32(off[nNets]);
  for (let e = 0; e < edgeA.length; e++) {
    if (inGroup(edgeA[e])) list[at[edgeA[e]]++] = e;
    if (inGroup(edgeB[e])) list[at[edgeB[e]]++] = e;
  }
  return { off, list };
}
