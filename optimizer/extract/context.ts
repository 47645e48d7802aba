// Shared state of one extraction: the per-net index of device terminals (so no step ever scans
// all devices for one net), rail voltages, and helpers to name nets and read control inputs.
import type { Diagnostic } from '../errors';
import type { FlatNetlist } from '../netlist/ir';
import { c, v, type Expr } from '../logic/expr';
import { OWN_BUFFERS, type TypedAlloc } from '../netlist/typed-arena';

export interface ExtractContext {
  nl: FlatNetlist;
  /** CSR index: terminals on net n are entries offsets[n] .. offsets[n+1]-1. */
  offsets: Int32Array;
  termDev: Int32Array;
  termIdx: Int8Array;
  /** Rail voltage per net, NaN where the net is not a rail. */
  railVolts: Float64Array;
  diagnostics: Diagnostic[];
  /** One shared variable node per net, so functions do not allocate a node per reference. */
  vars: (Expr | undefined)[];
  /**
   * Per-net answers of the bipolar steering-node test (0 not asked yet, 1 yes, 2 no), made on first
   * use: every line of a shared override node asks about that node, and the answer depends only on
   * the netlist, which never changes under a context.
   */
  steering?: Uint8Array;
}

/** @param alloc where the index's arrays come from (the switch model passes its build arena) */
export function makeContext(nl: FlatNetlist, alloc: TypedAlloc = OWN_BUFFERS): ExtractContext {
  const nNets = nl.nets.length;
  const devices = nl.devices;
  const counts = alloc.i32(nNets + 1);
  for (let di = 0; di < devices.length; di++) {
    const ts = devices[di].terminals;
    for (let ti = 0; ti < ts.length; ti++) counts[ts[ti] + 1]++;
  }
  for (let i = 0; i < nNets; i++) counts[i + 1] += counts[i];
  const offsets = counts;
  const fill = alloc.i32(nNets);
  fill.set(counts.subarray(0, nNets));
  const termDev = alloc.i32(offsets[nNets]);
  const termIdx = alloc.i8(offsets[nNets]);
  for (let di = 0; di < devices.length; di++) {
    const ts = devices[di].terminals;
    for (let ti = 0; ti < ts.length; ti++) {
      const at = fill[ts[ti]]++;
      termDev[at] = di;
      termIdx[at] = ti;
    }
  }
  const railVolts = alloc.f64(nNets).fill(NaN);
  for (const r of nl.rails) railVolts[r.net] = r.volts;
  return { nl, offsets, termDev, termIdx, railVolts, diagnostics: [], vars: new Array(nNets) };
}

export const isRail = (cx: ExtractContext, net: number): boolean => !Number.isNaN(cx.railVolts[net]);
/** Ground or a negative rail: where pull-down paths end. */
export const isLowRail = (cx: ExtractContext, net: number): boolean => cx.railVolts[net] <= 0;
export const isHighRail = (cx: ExtractContext, net: number): boolean => cx.railVolts[net] > 0;
export const netName = (cx: ExtractContext, net: number): string => cx.nl.nets[net].name;

/** Calls fn(device, terminal) for every terminal on a net. */
export function eachTerminal(cx: ExtractContext, net: number, fn: (dev: number, term: number) => void): void {
  for (let i = cx.offsets[net], end = cx.offsets[net + 1]; i < end; i++) fn(cx.termDev[i], cx.termIdx[i]);
}

export function terminalCount(cx: ExtractContext, net: number): number {
  return cx.offsets[net + 1] - cx.offsets[net];
}

/** The logic value a control terminal on this net sees: rails are constants, other nets variables. */
export function controlOf(cx: ExtractContext, net: number): Expr {
  if (isRail(cx, net)) return c(cx.railVolts[net] > 0 ? 1 : 0);
  return varOf(cx, net);
}

/** The shared variable node of a net. */
export function varOf(cx: ExtractContext, net: number): Expr {
  return (cx.vars[net] ??= v(netName(cx, net)));
}

/** The other end of a two-terminal device. */
export function otherEnd(cx: ExtractContext, dev: number, term: number): number {
  return cx.nl.devices[dev].terminals[term === 0 ? 1 : 0];
}

/** Longest common prefix of the instance paths of some devices. */
export function commonPath(cx: ExtractContext, devs: number[]): string[] {
  if (devs.length === 0) return [];
  let p = cx.nl.devices[devs[0]].path;
  for (const d of devs) {
    const q = cx.nl.devices[d].path;
    let i = 0;
    while (i < p.length && i < q.length && p[i] === q[i]) i++;
    if (i < p.length) p = p.slice(0, i);
  }
  return p;
}
