// Canonical key of one part of a design-wide edit (see rules/cut-parts), read straight off the
// design: the part's devices in design order with their values and how they connect, rails,
// ports, the nets compared and cut, the edit and the assumptions, every net numbered by first use.
// Two parts with one key are the same region and the same change up to names, so a proof of one
// holds for the other. Names are left out: a part's verdict is reused only when proved, and a
// proof does not depend on what the nets are called.
import type { Expr } from '../logic/expr';
import type { FlatDevice, FlatNetlist } from '../netlist/ir';
import type { Edit } from '../rules/types';

/** Device text (kind, operation, model, value, waveform, parameters) by device index, interned. */
interface DeviceTexts {
  ids: Int32Array;
  texts: Map<string, number>;
  params: WeakMap<object, string>;
}

const textCache = new WeakMap<FlatNetlist, DeviceTexts>();

function textsOf(nl: FlatNetlist): DeviceTexts {
  let t = textCache.get(nl);
  if (!t) textCache.set(nl, (t = { ids: new Int32Array(nl.devices.length).fill(-1), texts: new Map(), params: new WeakMap() }));
  return t;
}

function deviceText(nl: FlatNetlist, i: number): number {
  const t = textsOf(nl);
  if (t.ids[i] >= 0) return t.ids[i];
  const d = nl.devices[i];
  const id = intern(t, describe(t, d));
  t.ids[i] = id;
  return id;
}

const NO_PARAMS = {};

function describe(t: DeviceTexts, d: Pick<FlatDevice, 'kind' | 'op' | 'model' | 'value' | 'waveform'> & { params?: FlatDevice['params'] }): string {
  const params = d.params ?? NO_PARAMS;
  let p = t.params.get(params);
  if (p === undefined) t.params.set(params, (p = JSON.stringify(params)));
  return `${d.kind}|${d.op ?? ''}|${d.model ?? ''}|${d.value ?? ''}|${d.waveform ?? ''}|${p}`;
}

function intern(t: DeviceTexts, text: string): number {
  let id = t.texts.get(text);
  if (id === undefined) t.texts.set(text, (id = t.texts.size));
  return id;
}

export interface PartKeyInput {
  /** The region's devices by design index, ascending. */
  devices: number[];
  /** Nets the region keeps even when no device touches them (compared nets, the edit's nets), by id. */
  keep: number[];
  /** Compared nets by id (each named by its own name). */
  changed: ArrayLike<number>;
  /** Driven nets taken as free values in the proof, by design net id. */
  cut: number[];
  edit: Edit;
  /** Device indices of edit.removeDevices and of edit.reconnect's devices, in order. */
  removed: number[];
  moved: number[];
  assumptions: readonly { expr: Expr }[];
  extra: string;
  /** The design's terminals in typed rows (rules/region terminalRows). */
  terminals: { start: Int32Array; list: Int32Array };
  /** Device index by name in the design (rail sources). */
  deviceIndex: (name: string) => number | undefined;
}

export interface PartKey {
  /** Hash text of the stream (two 32-bit hashes and the length); equal streams give equal keys. */
  key: string;
  /** The key's full content, numbers only (valid until the next call). */
  stream: Int32Array;
  /** Each changed net's number in the key, as `changed`. */
  places: Int32Array;
}

// Section marks in the stream (negative: never a count or a number).
const DEVICE = -1, NETS = -2, KIND = -3, RAIL = -4, PORTS = -5, CHANGED = -6, CUT = -7, REMOVE = -8, MOVE = -9, MERGE = -10, ADD = -11, MODELS = -12, ASSUME = -13, UNKNOWN = -14, FRESH = -15; // prettier-ignore

/** Per-design tables and scratch for keys, stamped per key so the scratch needs no clearing. */
class KeyWriter {
  private stamp = 0;
  private readonly seen: Int32Array;
  private readonly at: Int32Array;
  private readonly deviceSeen: Int32Array;
  private readonly deviceAt: Int32Array;
  private out = new Int32Array(1024);
  private len = 0;
  private nets = 0;
  private readonly texts: DeviceTexts;
  /** Text id + 1 of each net's kind (0: none). */
  private readonly netKind: Int32Array;
  private readonly railNet: Int32Array;
  private readonly railVolts: Int32Array;
  private readonly railSource: Int32Array;
  private readonly pathClass = new Map<number, number>();
  /** Each device's instance path, numbered (by the path list's identity: one list per instance), or -1 before first use. */
  private readonly pathIds: Int32Array;
  private readonly paths = new Map<readonly string[], number>();
  private readonly fresh = new Map<string, number>();
  private readonly outside = new Map<string, number>();

  constructor(
    private readonly nl: FlatNetlist,
    deviceIndex: (name: string) => number | undefined,
  ) {
    const n = nl.nets.length;
    const m = nl.devices.length;
    this.seen = new Int32Array(n);
    this.at = new Int32Array(n);
    this.deviceSeen = new Int32Array(m);
    this.deviceAt = new Int32Array(m);
    this.pathIds = new Int32Array(m).fill(-1);
    this.texts = textsOf(nl);
    this.netKind = new Int32Array(n);
    for (let i = 0; i < n; i++) {
      const kind = nl.nets[i].kind;
      if (kind) this.netKind[i] = intern(this.texts, kind) + 1;
    }
    this.railNet = Int32Array.from(nl.rails, (r) => r.net);
    this.railVolts = Int32Array.from(nl.rails, (r) => intern(this.texts, String(r.volts)));
    this.railSource = Int32Array.from(nl.rails, (r) => (r.source === undefined ? -1 : (deviceIndex(r.source) ?? -1)));
  }

  private pathOf(i: number): number {
    if (this.pathIds[i] < 0) {
      const path = this.nl.devices[i].path;
      let id = this.paths.get(path);
      if (id === undefined) this.paths.set(path, (id = this.paths.size));
      this.pathIds[i] = id;
    }
    return this.pathIds[i];
  }

  private put(x: number): void {
    if (this.len === this.out.length) {
      const grown = new Int32Array(this.out.length * 2);
      grown.set(this.out);
      this.out = grown;
    }
    this.out[this.len++] = x;
  }

  private text(s: string): void {
    this.put(intern(this.texts, s));
  }

  private net(id: number): number {
    if (this.seen[id] !== this.stamp) {
      this.seen[id] = this.stamp;
      this.at[id] = this.nets++;
    }
    return this.at[id];
  }

  private place(name: string, id: number): number {
    return this.net(id) * 2 + (this.nl.nets[id].name === name ? 1 : 0);
  }

  private netRef(name: string): void {
    const id = this.nl.netByName.get(name);
    if (id !== undefined) return this.put(this.place(name, id));
    let k = this.fresh.get(name);
    if (k === undefined) this.fresh.set(name, (k = this.fresh.size));
    this.put(FRESH);
    this.put(k);
  }

  private deviceRef(i: number): number {
    return this.deviceSeen[i] === this.stamp ? this.deviceAt[i] : UNKNOWN;
  }

  private assumed(name: string): string {
    const id = this.nl.netByName.get(name);
    if (id !== undefined && this.seen[id] === this.stamp) return String(this.place(name, id));
    let k = this.outside.get(name);
    if (k === undefined) this.outside.set(name, (k = this.outside.size));
    return `o${k}`;
  }

  key(input: PartKeyInput): PartKey {
    const nl = this.nl;
    const stamp = ++this.stamp;
    this.len = 0;
    this.nets = 0;
    this.pathClass.clear();
    this.fresh.clear();
    this.outside.clear();
    this.text(input.extra);
    this.put(input.devices.length);
    this.net(0);
    for (let k = 0; k < this.railNet.length; k++) this.net(this.railNet[k]);
    const devices = input.devices;
    const { start, list } = input.terminals;
    for (let k = 0; k < devices.length; k++) {
      const i = devices[k];
      this.deviceSeen[i] = stamp;
      this.deviceAt[i] = k;
      const path = this.pathOf(i);
      let pc = this.pathClass.get(path);
      if (pc === undefined) this.pathClass.set(path, (pc = this.pathClass.size));
      this.put(DEVICE);
      this.put(deviceText(nl, i));
      this.put(pc);
      for (let j = start[i]; j < start[i + 1]; j++) {
        const t = list[j];
        this.put(this.net(t));
        // A net's kind (Verilog tri, wand …) beside its number.
        if (this.netKind[t] !== 0) {
          this.put(KIND);
          this.put(this.netKind[t]);
        }
      }
    }
    for (const id of input.keep) this.net(id);
    this.put(NETS);
    this.put(this.nets);
    for (let k = 0; k < this.railNet.length; k++) {
      const source = this.railSource[k];
      this.put(RAIL);
      this.put(this.at[this.railNet[k]]);
      this.put(this.railVolts[k]);
      this.put(source < 0 ? -2 : this.deviceSeen[source] === stamp ? this.deviceAt[source] : -1);
    }
    this.put(PORTS);
    for (const p of nl.ports) if (this.seen[p] === stamp) this.put(this.at[p]);

    const places = new Int32Array(input.changed.length);
    for (let k = 0; k < places.length; k++) places[k] = this.net(input.changed[k]);
    this.put(CHANGED);
    for (const x of places.slice().sort()) this.put(x);
    this.put(CUT);
    for (const x of Int32Array.from(input.cut, (id) => this.net(id)).sort()) this.put(x);

    // The edit, in the part's own numbering; nets it creates by order of first mention.
    const e = input.edit;
    this.put(REMOVE);
    for (const x of Int32Array.from(input.removed, (i) => this.deviceRef(i)).sort()) this.put(x);
    for (let k = 0; k < e.reconnect.length; k++) {
      const r = e.reconnect[k];
      this.put(MOVE);
      this.put(this.deviceRef(input.moved[k]));
      this.put(r.terminal);
      this.netRef(r.net);
    }
    for (const m of e.mergeNets) {
      this.put(MERGE);
      this.netRef(m.keep);
      this.netRef(m.remove);
    }
    for (const d of e.addDevices) {
      this.put(ADD);
      this.text(describe(this.texts, d));
      for (const t of d.terminals) this.netRef(t);
    }
    if (e.addModels?.length) {
      this.put(MODELS);
      this.text(JSON.stringify(e.addModels));
    }
    // Assumptions: names in the region by net, others by first appearance.
    for (const a of input.assumptions) {
      this.put(ASSUME);
      this.text(exprText(a.expr, (name) => this.assumed(name)));
    }
    const stream = this.out.subarray(0, this.len);
    return { key: hashText(stream), stream, places };
  }
}

const writerCache = new WeakMap<FlatNetlist, KeyWriter>();

export function partKey(nl: FlatNetlist, input: PartKeyInput): PartKey {
  let w = writerCache.get(nl);
  if (!w) writerCache.set(nl, (w = new KeyWriter(nl, input.deviceIndex)));
  return w.key(input);
}

/** Two independent 32-bit hashes (FNV-1a and a multiply–xorshift) and the length. */
function hashText(s: Int32Array): string {
  let h1 = 0x811c9dc5;
  let h2 = 0x9e3779b9;
  for (let i = 0; i < s.length; i++) {
    const x = s[i];
    h1 = Math.imul(h1 ^ x, 0x01000193);
    h2 = Math.imul(h2 ^ (x + 0x7f4a7c15), 0x85ebca6b);
    h2 ^= h2 >>> 13;
  }
  return `${(h1 >>> 0).toString(36)}.${(h2 >>> 0).toString(36)}.${s.length}`;
}

/** Values by part key; a hit is confirmed on the whole stream, so a hash collision cannot match. */
export class PartTable<T> {
  private readonly entries = new Map<string, { stream: Int32Array; value: T }[]>();

  get(k: PartKey): T | undefined {
    for (const e of this.entries.get(k.key) ?? []) if (sameStream(e.stream, k.stream)) return e.value;
    return undefined;
  }

  set(k: PartKey, value: T): void {
    const list = this.entries.get(k.key);
    const entry = { stream: k.stream.slice(), value };
    if (list) list.push(entry);
    else this.entries.set(k.key, [entry]);
  }
}

function sameStream(a: Int32Array, b: Int32Array): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

function exprText(e: Expr, name: (n: string) => string): string {
  switch (e.op) {
    case 'const':
      return e.value ? '1' : '0';
    case 'var':
      return `v${name(e.name)}`;
    case 'not':
      return `!(${exprText(e.arg, name)})`;
    case 'implies':
    case 'iff':
      return `${e.op}(${exprText(e.left, name)},${exprText(e.right, name)})`;
    default:
      return `${e.op}(${e.args.map((a) => exprText(a, name)).join(',')})`;
  }
}
