// Switch-level runs of small regions before and after an edit, shared between the checks of one
// region and between regions of the same structure: a region is keyed by a canonical form of its
// devices, nets, edit, inputs and watched nets (names replaced by first-appearance numbers), so the
// identical bit-slice regions of a register are simulated once and each answer read back by name.
import type { FlatDevice, FlatNetlist } from '../../netlist/ir';
import { simulate, type Level } from '../../verify/switch-sim';
import type { Edit } from '../types';
import { editedRegion, named, railSources, subNetlist, vectorBits, type SneakReport } from './sneak-check';

interface Shape {
  /** The first region seen with this key: its netlists and names stand for every region like it. */
  before: FlatNetlist;
  after: FlatNetlist;
  inputs: string[];
  /** Watched nets present after the edit (names of the first region) and their positions. */
  watch: string[];
  watchAt: number[];
  bits: Uint8Array[];
  afterAll?: Level[][];
  /** Vectors (by index) and watched positions that contend after the edit. */
  contended?: { at: number; nets: number[] }[];
  sneakByMask: Map<string, { bad: { at: number; nets: number[] }[]; vectors: number }>;
}

/** A device's own content (kind, model, value, parameters) without its name, place or nets. */
const deviceForm = (d: FlatDevice): string => JSON.stringify([d.kind, d.op ?? '', d.value ?? null, d.model?.toLowerCase() ?? '', d.params, d.waveform ?? '']);

/** One region with its shape: the checks of a region ask it without recomputing the key. */
export interface RegionRun {
  contention(): { vector: Record<string, 0 | 1>; nets: string[] }[];
  sneak(allowed?: (v: Record<string, 0 | 1>) => boolean): SneakReport;
}

export class RegionSims {
  private readonly shapes = new Map<string, Shape>();
  private readonly bitsByCount = new Map<number, Uint8Array[]>();
  /** Per device index: a small number standing for its content (equal content, equal number). */
  private readonly formOf: Int32Array;
  private readonly formIds = new Map<string, number>();

  private formIdOf(i: number): number {
    let id = this.formOf[i];
    if (id < 0) {
      const f = deviceForm(this.nl.devices[i]);
      id = this.formIds.get(f) ?? -1;
      if (id < 0) this.formIds.set(f, (id = this.formIds.size));
      this.formOf[i] = id;
    }
    return id;
  }

  constructor(
    readonly nl: Readonly<FlatNetlist>,
    readonly limit: number,
  ) {
    this.formOf = new Int32Array(nl.devices.length).fill(-1);
  }

  private bits(count: number): Uint8Array[] {
    let b = this.bitsByCount.get(count);
    if (!b) this.bitsByCount.set(count, (b = vectorBits(count, this.limit)));
    return b;
  }

  /**
   * The canonical form of a region: nets numbered as subNetlist numbers them, new nets of the edit
   * by first appearance, device names by position in the region. Null when a device reads nets by
   * name (gate expressions), which a renamed copy would not reproduce.
   */
  private keyOf(devices: number[], edit: Edit, inputs: string[], watch: string[]): string | null {
    const nl = this.nl;
    const keep = [...new Set([...devices, ...railSources(nl)])].sort((a, b) => a - b);
    const netNo = new Map<number, number>();
    const no = (id: number) => {
      let n = netNo.get(id);
      if (n === undefined) netNo.set(id, (n = netNo.size));
      return n;
    };
    no(0);
    const parts: string[] = [];
    const position = new Map<string, number>();
    for (const i of keep) {
      const d = nl.devices[i];
      if (d.kind === 'gate') return null;
      position.set(d.name, position.size);
      let form = `${this.formIdOf(i)}`;
      for (const t of d.terminals) form += nl.nets[t].kind ? ` ${no(t)}:${nl.nets[t].kind}` : ` ${no(t)}`;
      parts.push(form);
    }
    for (const r of nl.rails) parts.push(`rail ${no(r.net)} ${r.volts}`);
    const fresh = new Map<string, number>();
    const net = (name: string): string => {
      const id = nl.netByName.get(name);
      if (id !== undefined && netNo.has(id)) return `${netNo.get(id)}`;
      let f = fresh.get(name);
      if (f === undefined) fresh.set(name, (f = fresh.size));
      // A net outside the region is a new net of the region's copy, numbered like a fresh name.
      return `n${f}`;
    };
    const dev = (name: string) => (position.has(name) ? `${position.get(name)}` : `?${name}`);
    parts.push(`rm ${edit.removeDevices.map(dev).sort().join(',')}`);
    for (const r of edit.reconnect) parts.push(`rc ${dev(r.device)} ${r.terminal} ${net(r.net)}`);
    for (const m of edit.mergeNets) parts.push(`mg ${net(m.keep)} ${net(m.remove)}`);
    for (const a of edit.addDevices) parts.push(`add ${JSON.stringify([a.kind, a.op ?? '', a.value ?? null, a.model?.toLowerCase() ?? '', a.params ?? {}])} ${a.terminals.map(net).join(',')}`);
    parts.push(`models ${JSON.stringify(edit.addModels ?? [])}`);
    parts.push(`in ${inputs.map(net).join(',')}`);
    parts.push(`watch ${watch.map(net).join(',')}`);
    return parts.join('\n');
  }

  private shapeOf(devices: number[], edit: Edit, inputs: string[], watch: string[]): Shape {
    const key = this.keyOf(devices, edit, inputs, watch);
    const found = key === null ? undefined : this.shapes.get(key);
    if (found) return found;
    const before = subNetlist(this.nl, devices);
    const after = editedRegion(before, edit);
    const watchAt = watch.flatMap((o, i) => (after.netByName.has(o) ? [i] : []));
    const shape: Shape = { before, after, inputs, watch: watchAt.map((i) => watch[i]), watchAt, bits: this.bits(inputs.length), sneakByMask: new Map() };
    if (key !== null) this.shapes.set(key, shape);
    return shape;
  }

  region(devices: number[], edit: Edit, inputs: string[], watch: string[]): RegionRun {
    const s = this.shapeOf(devices, edit, inputs, watch);
    return {
      contention: () => this.contention(s, inputs, watch),
      sneak: (allowed) => this.sneak(s, inputs, watch, allowed),
    };
  }

  /** Vectors (by this region's names) on which a watched net contends after the edit, before any assumption. */
  private contention(s: Shape, inputs: string[], watch: string[]): { vector: Record<string, 0 | 1>; nets: string[] }[] {
    if (!s.afterAll) {
      const r = simulate(s.after, { kind: 'vectors', vectors: s.bits.map((b) => named(s.inputs, b)) }, { watch: s.watch });
      s.afterAll = s.watch.map((o) => r.waveforms[o]);
      s.contended = [];
      s.bits.forEach((_, k) => {
        const at = s.watchAt.filter((_, j) => s.afterAll![j][k] === 'X');
        if (at.length) s.contended!.push({ at: k, nets: at });
      });
    }
    return s.contended!.map((x) => ({ vector: named(inputs, s.bits[x.at]), nets: x.nets.map((i) => watch[i]) }));
  }

  /**
   * Before against after on the vectors `allowed` keeps (all when absent), as sneakCheck does —
   * the simulator keeps stored charge from one vector to the next, so the run is keyed by which
   * vectors it applies, not only by the region.
   */
  private sneak(s: Shape, inputs: string[], watch: string[], allowed?: (v: Record<string, 0 | 1>) => boolean): SneakReport {
    const kept = allowed ? s.bits.flatMap((b, k) => (allowed(named(inputs, b)) ? [k] : [])) : s.bits.map((_, k) => k);
    if (kept.length === 0) return { bad: [], vectors: 0 };
    const mask = kept.length === s.bits.length ? 'all' : kept.join(',');
    let run = s.sneakByMask.get(mask);
    if (!run) {
      const vectors = kept.map((k) => named(s.inputs, s.bits[k]));
      const a = simulate(s.before, { kind: 'vectors', vectors }, { watch: s.watch });
      const b = mask === 'all' && s.afterAll ? null : simulate(s.after, { kind: 'vectors', vectors }, { watch: s.watch });
      const afterAt = (j: number, x: number) => (b ? b.waveforms[s.watch[j]][x] : s.afterAll![j][x]);
      const bad: { at: number; nets: number[] }[] = [];
      kept.forEach((k, x) => {
        const nets = s.watch.flatMap((o, j) => (a.waveforms[o][x] !== afterAt(j, x) ? [j] : []));
        if (nets.length) bad.push({ at: k, nets });
      });
      run = { bad, vectors: kept.length };
      s.sneakByMask.set(mask, run);
    }
    return { bad: run.bad.map((x) => ({ vector: named(inputs, s.bits[x.at]), nets: x.nets.map((j) => watch[s.watchAt[j]]) })), vectors: run.vectors };
  }
}
