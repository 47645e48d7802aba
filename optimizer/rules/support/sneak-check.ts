// Switch-level check of a rewritten region for sneak paths, contention and floating nodes: the
// devices of the involved logic nodes (before) and the same region after the edit are simulated
// on every input combination (a seeded sample beyond `exhaustiveLimit` inputs) and the outputs
// compared (Bryant 1984 strengths; optimizer/verify/switch-sim).
import type { MarginResult } from '../../margins/corners';
import type { FlatNetlist } from '../../netlist/ir';
import { applyProposals } from '../../rewrite/apply';
import { simulate } from '../../verify/switch-sim';
import type { Edit } from '../types';

const railSourceMemo = new WeakMap<object, number[]>();

/** The rails' sources, found once per netlist (a scan cuts many small regions from one design). */
export function railSources(nl: Readonly<FlatNetlist>): number[] {
  let r = railSourceMemo.get(nl);
  if (!r) {
    const railNets = new Set(nl.rails.map((x) => x.net));
    r = [];
    nl.devices.forEach((d, i) => {
      if (d.kind === 'vsource' && railNets.has(d.terminals[0])) r!.push(i);
    });
    railSourceMemo.set(nl, r);
  }
  return r;
}

/** The devices given (by index) and the rails' sources, as a netlist of its own. */
export function subNetlist(nl: Readonly<FlatNetlist>, devices: Iterable<number>): FlatNetlist {
  const keep = new Set(devices);
  for (const i of railSources(nl)) keep.add(i);
  const newId = new Map<number, number>();
  const nets: FlatNetlist['nets'] = [];
  const netOf = (id: number) => {
    let n = newId.get(id);
    if (n === undefined) {
      n = nets.length;
      newId.set(id, n);
      nets.push({ ...nl.nets[id], id: n });
    }
    return n;
  };
  netOf(0);
  const devs = [...keep].sort((a, b) => a - b).map((i) => {
    const d = nl.devices[i];
    return { ...d, terminals: d.terminals.map(netOf), params: { ...d.params }, path: [...d.path] };
  });
  for (const r of nl.rails) netOf(r.net);
  return {
    title: nl.title,
    devices: devs,
    nets,
    netByName: new Map(nets.map((n) => [n.name, n.id])),
    rails: nl.rails.map((r) => ({ ...r, net: newId.get(r.net)! })),
    ports: [],
    models: nl.models,
  };
}

/**
 * Input bits of each vector by input position: every combination up to `limit` inputs, beyond a
 * seeded sample of 2^limit (the same sequence for the same input count, whatever the names).
 */
export function vectorBits(count: number, limit: number): Uint8Array[] {
  const out: Uint8Array[] = [];
  if (count <= limit) {
    for (let m = 0; m < 2 ** count; m++) {
      const v = new Uint8Array(count);
      for (let i = 0; i < count; i++) v[i] = (m >> i) & 1;
      out.push(v);
    }
    return out;
  }
  let seed = 0x2545f491;
  for (let k = 0; k < 2 ** limit; k++) {
    const v = new Uint8Array(count);
    for (let i = 0; i < count; i++) {
      seed = (Math.imul(seed, 1103515245) + 12345) >>> 0;
      v[i] = (seed >>> 16) & 1;
    }
    out.push(v);
  }
  return out;
}

/** A vector's bits under the inputs' names. */
export function named(inputs: readonly string[], bits: Uint8Array): Record<string, 0 | 1> {
  const v: Record<string, 0 | 1> = {};
  inputs.forEach((n, i) => (v[n] = bits[i] as 0 | 1));
  return v;
}

export function vectorsFor(inputs: string[], limit: number): Record<string, 0 | 1>[] {
  return vectorBits(inputs.length, limit).map((b) => named(inputs, b));
}

/** The region netlist with the edit applied. */
export const editedRegion = (region: FlatNetlist, edit: Edit): FlatNetlist => applyProposals(region, [{ id: 'region', title: 'region', edit, assumptions: [], margins: [] }]);

export interface SneakReport {
  /** Input vectors on which some output differs after the edit (or newly contends or floats). */
  bad: { vector: Record<string, 0 | 1>; nets: string[] }[];
  vectors: number;
}

export function sneakCheck(
  nl: Readonly<FlatNetlist>,
  devices: Iterable<number>,
  edit: Edit,
  inputs: string[],
  outputs: string[],
  exhaustiveLimit = 10,
  allowed?: (vector: Record<string, 0 | 1>) => boolean,
): SneakReport {
  const before = subNetlist(nl, devices);
  const after = editedRegion(before, edit);
  const vectors = vectorsFor(inputs, exhaustiveLimit).filter((v) => !allowed || allowed(v));
  if (vectors.length === 0) return { bad: [], vectors: 0 };
  const watch = outputs.filter((o) => after.netByName.has(o));
  const a = simulate(before, { kind: 'vectors', vectors }, { watch });
  const b = simulate(after, { kind: 'vectors', vectors }, { watch });
  const bad: SneakReport['bad'] = [];
  vectors.forEach((vector, s) => {
    const nets = watch.filter((o) => {
      const x = a.waveforms[o][s];
      const y = b.waveforms[o][s];
      // X or Z the region already had is not the edit's doing; a new one, or a changed value, is.
      return x !== y;
    });
    if (nets.length) bad.push({ vector, nets });
  });
  return { bad, vectors: vectors.length };
}

export function sneakMargin(r: SneakReport): MarginResult {
  const first = r.bad[0];
  const shown = first ? ` e.g. ${Object.entries(first.vector).map(([k, v]) => `${k}=${v}`).join(' ')} changes ${first.nets.join(', ')}` : '';
  return {
    name: 'sneak paths',
    value: r.bad.length,
    limit: 0,
    unit: 'vectors',
    status: r.bad.length ? 'fail' : 'pass',
    corner: { supply: 0, resistors: 'nominal' },
    note: `switch-level simulation of the region before and after on ${r.vectors} input vectors (Bryant 1984)${shown}`,
  };
}

/**
 * Input vectors on which some output contends (X) after the edit — the rewritten region alone,
 * before any assumption is applied, so the caller can see which assumptions rule them out.
 */
export function contentionVectors(
  nl: Readonly<FlatNetlist>,
  devices: Iterable<number>,
  edit: Edit,
  inputs: string[],
  outputs: string[],
  exhaustiveLimit = 10,
): { vector: Record<string, 0 | 1>; nets: string[] }[] {
  const after = editedRegion(subNetlist(nl, devices), edit);
  const vectors = vectorsFor(inputs, exhaustiveLimit);
  const watch = outputs.filter((o) => after.netByName.has(o));
  const r = simulate(after, { kind: 'vectors', vectors }, { watch });
  const out: { vector: Record<string, 0 | 1>; nets: string[] }[] = [];
  vectors.forEach((vector, k) => {
    const nets = watch.filter((o) => r.waveforms[o][k] === 'X');
    if (nets.length) out.push({ vector, nets });
  });
  return out;
}
