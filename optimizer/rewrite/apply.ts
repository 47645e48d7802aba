// Applies accepted, non-overlapping proposals' edits to a FlatNetlist, giving a new netlist (the
// input is never touched), and turns a flat netlist back into a one-cell Design for the writers.
import { InputError, InternalError } from '../errors';
import type { Design, Device, FlatDevice, FlatNet, FlatNetlist, Rail } from '../netlist/ir';
import type { Proposal } from '../rules/types';
import { editProblems, overlapOf, touched } from './edits';

/** Refuses proposals that overlap, naming the pair and what they share. */
export function assertNoOverlap(proposals: Proposal[]): void {
  // One proposal overlaps nothing: its touched sets (a design-wide edit's are large) are not built.
  const sets = proposals.length > 1 ? proposals.map((p) => touched(p.edit)) : [];
  const clashes: string[] = [];
  for (let i = 0; i < proposals.length; i++) {
    for (let j = i + 1; j < proposals.length; j++) {
      const o = overlapOf(sets[i], sets[j]);
      if (o.devices.length || o.nets.length) {
        const what = [...o.devices.map((d) => `device ${d}`), ...o.nets.map((n) => `net ${n}`)].slice(0, 4).join(', ');
        clashes.push(`${proposals[i].id} and ${proposals[j].id} overlap (both change ${what}); accept one and scan again`);
      }
    }
  }
  if (clashes.length) throw new InputError(clashes.map((message) => ({ severity: 'error' as const, code: 'apply.overlap', message })));
  const ids = new Set<string>();
  for (const p of proposals) {
    if (ids.has(p.id)) throw InputError.at('apply.duplicate', `${p.id} is listed twice`);
    ids.add(p.id);
  }
}

/**
 * The shared copy's names: every net of the input under its own name, leading to its net after the
 * merges, and the names the edit adds. Read through the input's index rather than copied: a large
 * board's proof would otherwise build a second map of every net name. Iterating builds it whole.
 */
class SharedNames extends Map<string, number> {
  private whole?: Map<string, number>;
  constructor(
    private readonly input: FlatNetlist,
    private readonly find: (id: number) => number,
  ) {
    super();
  }
  /** The input's net of this name, when it is that net's own name (not an alias the input keeps). */
  private old(name: string): number | undefined {
    const id = this.input.netByName.get(name);
    return id !== undefined && this.input.nets[id]?.name === name ? this.find(id) : undefined;
  }
  // Until something iterates, deletes or clears, look-ups go to the input; from then on, to the whole copy.
  override get(name: string): number | undefined {
    return this.whole ? this.whole.get(name) : (super.get(name) ?? this.old(name));
  }
  override has(name: string): boolean {
    return this.whole ? this.whole.has(name) : super.has(name) || this.old(name) !== undefined;
  }
  override set(name: string, id: number): this {
    this.whole?.set(name, id);
    return super.set(name, id);
  }
  override delete(name: string): boolean {
    super.delete(name);
    return this.all().delete(name);
  }
  override clear(): void {
    super.clear();
    this.all().clear();
  }
  private all(): Map<string, number> {
    if (!this.whole) {
      const m = new Map<string, number>();
      for (const n of this.input.nets) m.set(n.name, this.find(n.id));
      for (const [k, v] of super.entries()) m.set(k, v);
      this.whole = m;
    }
    return this.whole;
  }
  override get size(): number {
    return this.all().size;
  }
  override entries() {
    return this.all().entries();
  }
  override keys() {
    return this.all().keys();
  }
  override values() {
    return this.all().values();
  }
  override [Symbol.iterator]() {
    return this.all()[Symbol.iterator]();
  }
  override forEach(f: (value: number, key: string, map: Map<string, number>) => void, thisArg?: unknown): void {
    this.all().forEach((value, key) => f.call(thisArg, value, key, this));
  }
}

export interface ApplyOptions {
  /**
   * For a proof's throw-away copy of a frozen design: keep the input's net ids (a net merged away
   * stays as an entry nothing connects to, its name leading to the kept net) and reuse the input's
   * device objects where nothing about them changes. By default everything is copied and renumbered.
   */
  share?: boolean;
}

export function applyProposals(nl: FlatNetlist, proposals: Proposal[], options: ApplyOptions = {}): FlatNetlist {
  assertNoOverlap(proposals);
  for (const p of proposals) {
    const problems = editProblems(nl, p.edit);
    if (problems.length) {
      throw new InputError(problems.map((m) => ({ severity: 'error' as const, code: 'apply.bad-edit', message: `${p.id}: ${m}` })));
    }
  }
  // Net ids: union-find over the old ids for merges; new names get fresh ids afterwards.
  const parent = nl.nets.map((n) => n.id);
  const find = (x: number): number => {
    while (parent[x] !== x) x = parent[x] = parent[parent[x]];
    return x;
  };
  const rails = new Set(nl.rails.map((r) => r.net));
  for (const p of proposals) {
    for (const m of p.edit.mergeNets) {
      let keep = find(nl.netByName.get(m.keep)!);
      let gone = find(nl.netByName.get(m.remove)!);
      if (keep === gone) continue;
      if (rails.has(gone) && !rails.has(keep)) [keep, gone] = [gone, keep];
      parent[gone] = keep;
    }
  }
  const share = options.share === true;
  const nets: FlatNet[] = share ? [...nl.nets] : [];
  const newId = new Map<number, number>();
  const netByName = share ? new SharedNames(nl, find) : new Map<string, number>();
  if (!share) {
    for (const n of nl.nets) {
      if (find(n.id) !== n.id) continue;
      newId.set(n.id, nets.length);
      nets.push({ ...n, id: nets.length });
    }
    for (const n of nl.nets) netByName.set(n.name, newId.get(find(n.id))!);
  }
  const netOf = (name: string): number => {
    const found = netByName.get(name);
    if (found !== undefined) return found;
    const id = nets.length;
    nets.push({ id, name });
    netByName.set(name, id);
    return id;
  };
  const mapOld = share ? find : (id: number) => newId.get(find(id))!;

  const removed = new Set(proposals.flatMap((p) => p.edit.removeDevices));
  const reconnect = new Map<string, { terminal: number; net: string }[]>();
  for (const p of proposals) for (const r of p.edit.reconnect) reconnect.set(r.device, [...(reconnect.get(r.device) ?? []), r]);

  const devices: FlatDevice[] = [];
  for (const d of nl.devices) {
    if (removed.has(d.name)) continue;
    const moved = reconnect.get(d.name);
    if (share && !moved && d.terminals.every((t) => parent[t] === t)) {
      devices.push(d);
      continue;
    }
    const terminals = d.terminals.map(mapOld);
    if (moved) for (const r of moved) terminals[r.terminal] = netOf(r.net);
    devices.push(share ? { ...d, terminals } : { ...d, terminals, params: { ...d.params }, path: [...d.path] });
  }
  for (const p of proposals) {
    for (const a of p.edit.addDevices) {
      devices.push({
        name: a.name,
        kind: a.kind,
        ...(a.op ? { op: a.op } : {}),
        terminals: a.terminals.map(netOf),
        ...(a.value !== undefined ? { value: a.value } : {}),
        ...(a.model ? { model: a.model } : {}),
        params: { ...(a.params ?? {}) },
        path: [...(a.path ?? [])],
        cell: '(rewrite)',
      });
    }
  }
  const railOut: Rail[] = [];
  const seenRail = new Set<number>();
  for (const r of nl.rails) {
    const id = mapOld(r.net);
    if (seenRail.has(id)) continue;
    seenRail.add(id);
    railOut.push({ ...r, net: id });
  }
  const models = { ...nl.models };
  for (const p of proposals) for (const m of p.edit.addModels ?? []) if (!models[m.name.toLowerCase()]) models[m.name.toLowerCase()] = { ...m, params: { ...m.params } };
  return {
    title: nl.title,
    devices,
    nets,
    netByName,
    rails: railOut,
    ports: [...new Set(nl.ports.map(mapOld))],
    models,
  };
}

const KIND_LETTER: Record<string, string> = { npn: 'Q', pnp: 'Q', nmos: 'M', pmos: 'M', resistor: 'R', capacitor: 'C', diode: 'D', vsource: 'V', isource: 'I' };

/**
 * One flat cell holding every device, for the writers. Hierarchical device names become valid
 * element names (the kind's letter first, dots as underscores: "XS3.Q1" → "Q_XS3_Q1").
 */
export function flatToDesign(nl: FlatNetlist, format: Design['format'] = 'spice'): Design {
  const used = new Set<string>();
  const devices: Device[] = nl.devices.map((d) => {
    const letter = d.kind === 'gate' ? '' : KIND_LETTER[d.kind];
    if (letter === undefined) throw new InternalError(`no element letter for ${d.kind}`);
    let name = d.name.includes('.') || (letter && d.name[0]?.toUpperCase() !== letter) ? `${letter}${letter ? '_' : ''}${d.name.replace(/\./g, '_')}` : d.name;
    while (used.has(name.toUpperCase())) name += '_';
    used.add(name.toUpperCase());
    return {
      name,
      kind: d.kind,
      ...(d.op ? { op: d.op } : {}),
      terminals: d.terminals.map((t) => nl.nets[t].name),
      ...(d.value !== undefined ? { value: d.value } : {}),
      ...(d.model ? { model: d.model } : {}),
      params: { ...d.params },
      ...(d.waveform ? { waveform: d.waveform } : {}),
      ...(d.loc ? { loc: d.loc } : {}),
    };
  });
  const top = 'TOP';
  const globals = [...new Set(['0', ...nl.rails.map((r) => nl.nets[r.net].name)])];
  return {
    title: nl.title,
    format,
    top,
    cells: { [top]: { name: top, ports: nl.ports.map((p) => nl.nets[p].name), devices, instances: [] } },
    models: { ...nl.models },
    globals,
    params: {},
    extraCards: [],
  };
}
