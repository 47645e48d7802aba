// A small builder for FlatNetlists in code: rule and extraction tests describe circuits in a few
// lines (`b.rail('VCC', 5); b.npn('Q1', 'Y', 'B1', '0'); b.resistor('RC', 'VCC', 'Y', 1000)`).
import { GROUND, type DeviceKind, type FlatDevice, type FlatNetlist, type GateOp, type ParamValue } from './ir';

export interface BuildOptions {
  /** Instance path given to devices added from now on (e.g. ["XSLICE3"]); names get it as prefix. */
  path?: string[];
  model?: string;
  params?: Record<string, ParamValue>;
}

export class NetlistBuilder {
  private readonly nl: FlatNetlist;
  private path: string[] = [];

  constructor(title = 'built in code') {
    this.nl = { title, devices: [], nets: [], netByName: new Map(), rails: [], ports: [], models: {} };
    this.net(GROUND);
    this.nl.rails.push({ net: 0, volts: 0 });
  }

  /** Net id by name, created on first use. Names are case-sensitive here; readers normalise. */
  net(name: string): number {
    const found = this.nl.netByName.get(name);
    if (found !== undefined) return found;
    const id = this.nl.nets.length;
    this.nl.nets.push({ id, name });
    this.nl.netByName.set(name, id);
    return id;
  }

  /** Devices added inside `fn` get the instance path (hierarchical names like "XS3.Q1"). */
  within(path: string[], fn: () => void): this {
    const saved = this.path;
    this.path = [...saved, ...path];
    try {
      fn();
    } finally {
      this.path = saved;
    }
    return this;
  }

  /** Net name inside the current instance path ("XS3.N1"); rails and ground stay global. */
  local(name: string): string {
    if (name.startsWith('/')) return name.slice(1);
    return this.path.length && !this.isGlobal(name) ? `${this.path.join('.')}.${name}` : name;
  }

  private isGlobal(name: string): boolean {
    const id = this.nl.netByName.get(name);
    return name === GROUND || (id !== undefined && this.nl.rails.some((r) => r.net === id));
  }

  /** A DC supply: a vsource from the net to ground, making the net a rail. */
  rail(name: string, volts: number): this {
    const net = this.net(name);
    const source = `V${name}`;
    this.add('vsource', source, [name, GROUND], { value: volts, raw: true });
    this.nl.rails.push({ net, volts, source });
    return this;
  }

  port(...names: string[]): this {
    for (const n of names) this.nl.ports.push(this.net(this.local(n)));
    return this;
  }

  model(name: string, type: string, params: Record<string, ParamValue>): this {
    this.nl.models[name.toLowerCase()] = { name, type, params };
    return this;
  }

  npn(name: string, c: string, b: string, e: string, o: BuildOptions = {}): this {
    return this.add('npn', name, [c, b, e], { model: o.model ?? 'QN', ...o });
  }
  pnp(name: string, c: string, b: string, e: string, o: BuildOptions = {}): this {
    return this.add('pnp', name, [c, b, e], { model: o.model ?? 'QP', ...o });
  }
  nmos(name: string, d: string, g: string, s: string, o: BuildOptions & { bulk?: string } = {}): this {
    return this.add('nmos', name, [d, g, s, o.bulk ?? GROUND], { model: o.model ?? 'NM', ...o });
  }
  pmos(name: string, d: string, g: string, s: string, o: BuildOptions & { bulk: string }): this {
    return this.add('pmos', name, [d, g, s, o.bulk], { model: o.model ?? 'PM', ...o });
  }
  resistor(name: string, a: string, b: string, ohms: number, o: BuildOptions = {}): this {
    return this.add('resistor', name, [a, b], { value: ohms, ...o });
  }
  capacitor(name: string, a: string, b: string, farads: number, o: BuildOptions = {}): this {
    return this.add('capacitor', name, [a, b], { value: farads, ...o });
  }
  diode(name: string, anode: string, cathode: string, o: BuildOptions = {}): this {
    return this.add('diode', name, [anode, cathode], { model: o.model ?? 'DN', ...o });
  }
  /** A gate-level primitive: terminals in IR order ([output, ...inputs] etc.). */
  gate(name: string, op: GateOp, terminals: string[], o: BuildOptions = {}): this {
    return this.add('gate', name, terminals, { op, ...o });
  }

  private add(
    kind: DeviceKind,
    name: string,
    terms: string[],
    o: BuildOptions & { value?: number; op?: GateOp; raw?: boolean },
  ): this {
    const path = [...this.path, ...(o.path ?? [])];
    const full = path.length ? `${path.join('.')}.${name}` : name;
    // "/NAME" reaches a net outside the instance (a port connection made by the caller).
    const withPath = (n: string) =>
      n.startsWith('/') ? n.slice(1) : !o.raw && path.length && !this.isGlobal(n) ? `${path.join('.')}.${n}` : n;
    const dev: FlatDevice = {
      name: full,
      kind,
      terminals: terms.map((t) => this.net(withPath(t))),
      params: { ...(o.params ?? {}) },
      path,
      cell: path.length ? path[path.length - 1] : 'top',
    };
    if (o.op) dev.op = o.op;
    if (o.value !== undefined) dev.value = o.value;
    if (o.model) dev.model = o.model;
    this.nl.devices.push(dev);
    return this;
  }

  build(): FlatNetlist {
    return this.nl;
  }
}

export const netlist = (title?: string): NetlistBuilder => new NetlistBuilder(title);
