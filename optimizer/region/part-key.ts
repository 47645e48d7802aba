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
  changed: number[];
  /** Driven nets taken as free values in the proof, by design net id. */
  cut: number[];
  edit: Edit;
  /** Device indices of edit.removeDevices and of edit.reconnect's devices, in order. */
  removed: number[];
  moved: number[];
  assumptions: readonly { expr: Expr }[];
  extra: string;
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

/** Scratch per design, stamped per key so it needs no clearing. */
interface Scratch {
  stamp: number;
  seen: Int32Array;
  at: Int32Array;
  deviceSeen: Int32Array;
  deviceAt: Int32Array;
  out: Int32Array;
}

const scratchCache = new WeakMap<FlatNetlist, Scratch>();

// Section marks in the stream (negative: never a count or a number).
const DEVICE = -1, NETS = -2, KIND = -3, RAIL = -4, PORTS = -5, CHANGED = -6, CUT = -7, REMOVE = -8, MOVE = -9, MERGE = -10, ADD = -11, MODELS = -12, ASSUME = -13, UNKNOWN = -14, FRESH = -15;

export function partKey(nl: FlatNetlist, input: PartKeyInput): PartKey {
  let scratch = scratchCache.get(nl);
  if (!scratch) {
    const n = nl.nets.length;
    const m = nl.devices.length;
    scratch = { stamp: 0, seen: new Int32Array(n), at: new Int32Array(n), deviceSeen: new Int32Array(m), deviceAt: new Int32Array(m), out: new Int32Array(1024) };
    scratchCache.set(nl, scratch);
  }
  const sc = scratch;
  const { seen, at, deviceSeen, deviceAt } = sc;
  const stamp = ++sc.stamp;
  const texts = textsOf(nl);
  let len = 0;
  const put = (x: number) => {
    if (len === sc.out.length) {
      const grown = new Int32Array(sc.out.length * 2);
      grown.set(sc.out);
      sc.out = grown;
    }
    sc.out[len++] = x;
  };
  const text = (s: string) => put(intern(texts, s));
  let nets = 0;
  const net = (id: number) => {
    if (seen[id] !== stamp) {
      seen[id] = stamp;
      at[id] = nets++;
    }
    return at[id];
  };
  const has = (id: number) => seen[id] === stamp;
  const place = (name: string, id: number) => net(id) * 2 + (nl.nets[id].name === name ? 1 : 0);

  text(input.extra);
  put(input.devices.length);
  net(0);
  for (const r of nl.rails) net(r.net);
  const pathClass = new Map<readonly string[], number>();
  input.devices.forEach((i, k) => {
    deviceSeen[i] = stamp;
    deviceAt[i] = k;
    const d = nl.devices[i];
    let pc = pathClass.get(d.path);
    if (pc === undefined) pathClass.set(d.path, (pc = pathClass.size));
    put(DEVICE);
    put(deviceText(nl, i));
    put(pc);
    for (const t of d.terminals) put(net(t));
  });
  for (const id of input.keep) net(id);
  put(NETS);
  put(nets);
  // Net kinds (Verilog tri/wand …) of every numbered net, by number.
  for (const d of input.devices) {
    for (const t of nl.devices[d].terminals) {
      const kind = nl.nets[t].kind;
      if (kind) {
        put(KIND);
        put(at[t]);
        text(kind);
      }
    }
  }
  const sources = railSources(nl, input.deviceIndex);
  nl.rails.forEach((r, k) => {
    const source = sources[k];
    put(RAIL);
    put(at[r.net]);
    text(String(r.volts));
    put(source < 0 ? -2 : deviceSeen[source] === stamp ? deviceAt[source] : -1);
  });
  put(PORTS);
  for (const p of nl.ports) if (has(p)) put(at[p]);

  const places = new Int32Array(input.changed.length);
  input.changed.forEach((id, k) => (places[k] = net(id)));
  put(CHANGED);
  for (const x of [...places].sort((a, b) => a - b)) put(x);
  put(CUT);
  for (const x of input.cut.map(net).sort((a, b) => a - b)) put(x);

  // The edit, in the part's own numbering; nets it creates by order of first mention.
  const fresh = new Map<string, number>();
  const netRef = (name: string) => {
    const id = nl.netByName.get(name);
    if (id !== undefined) return put(place(name, id));
    let k = fresh.get(name);
    if (k === undefined) fresh.set(name, (k = fresh.size));
    put(FRESH);
    put(k);
  };
  const deviceRef = (i: number): number => (deviceSeen[i] === stamp ? deviceAt[i] : UNKNOWN);
  const e = input.edit;
  put(REMOVE);
  for (const x of input.removed.map(deviceRef).sort((a, b) => a - b)) put(x);
  for (let k = 0; k < e.reconnect.length; k++) {
    const r = e.reconnect[k];
    put(MOVE);
    put(deviceRef(input.moved[k]));
    put(r.terminal);
    netRef(r.net);
  }
  for (const m of e.mergeNets) {
    put(MERGE);
    netRef(m.keep);
    netRef(m.remove);
  }
  for (const d of e.addDevices) {
    put(ADD);
    text(describe(texts, d));
    for (const t of d.terminals) netRef(t);
  }
  if (e.addModels?.length) {
    put(MODELS);
    text(JSON.stringify(e.addModels));
  }
  // Assumptions: names in the region by net, others by first appearance.
  const outside = new Map<string, number>();
  for (const a of input.assumptions) {
    put(ASSUME);
    text(
      exprText(a.expr, (name) => {
        const id = nl.netByName.get(name);
        if (id !== undefined && has(id)) return String(place(name, id));
        let k = outside.get(name);
        if (k === undefined) outside.set(name, (k = outside.size));
        return `o${k}`;
      }),
    );
  }
  const stream = sc.out.subarray(0, len);
  return { key: hashText(stream), stream, places };
}

const railSourceCache = new WeakMap<FlatNetlist, Int32Array>();

/** Device index of each rail's source (-1 when it has none), once per design. */
function railSources(nl: FlatNetlist, deviceIndex: (name: string) => number | undefined): Int32Array {
  let a = railSourceCache.get(nl);
  if (!a) {
    a = Int32Array.from(nl.rails, (r) => (r.source === undefined ? -1 : (deviceIndex(r.source) ?? -1)));
    railSourceCache.set(nl, a);
  }
  return a;
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
