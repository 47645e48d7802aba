// Turns a mapped two-level network into devices of a family, as a proposal's added devices:
// gate primitives, static CMOS, NMOS with resistor loads, RTL NOR gates and DTL NAND gates, in
// the textbook forms whose part counts family-parts.ts states (so savings match what is built).
import { InternalError } from '../errors';
import type { MapFamily } from '../logic/family-parts';
import type { MappedNetwork } from '../logic/map-family';
import type { ParamValue } from '../netlist/ir';
import type { AddedDevice } from '../rules/types';

export interface EmitContext {
  /** Prefix for new device and net names (unique per proposal), e.g. "XALU3.TLM". */
  prefix: string;
  /** Positive supply net name and ground net name. */
  vcc: string;
  gnd: string;
  /** Instance path recorded on the new devices. */
  path: string[];
  /** Models to use, taken from the devices being replaced. */
  models: { npn?: string; nmos?: string; pmos?: string; diode?: string };
  /** Instance parameters (W, L …) to copy onto new MOS devices. */
  mosParams?: { nmos?: Record<string, ParamValue>; pmos?: Record<string, ParamValue> };
  /** Resistor values, Ω, taken from the replaced gates where they had them. */
  ohms: { load: number; base: number; diodePullUp: number; bleed: number };
  /** Signal names in the network that are existing nets (inputs and outputs); others get the prefix. */
  existing: ReadonlySet<string>;
}

/** Emits every gate of `net`; returns the devices and the net each mapped signal landed on. */
export function emitNetwork(net: MappedNetwork, family: MapFamily, cx: EmitContext): AddedDevice[] {
  const out: AddedDevice[] = [];
  let seq = 0;
  const clean = (s: string) => s.replace(/'/g, '_N').replace(/[^A-Za-z0-9_.\[\]]/g, '_');
  const netOf = (signal: string) => (cx.existing.has(signal) ? signal : `${cx.prefix}.${clean(signal)}`);
  const name = (letter: string) => `${letter}${cx.prefix.replace(/\./g, '_')}_${seq++}`;
  const add = (d: Omit<AddedDevice, 'path'>) => out.push({ ...d, path: [...cx.path] });
  const model = (kind: 'npn' | 'nmos' | 'pmos' | 'diode') => {
    const m = cx.models[kind];
    if (!m) throw new InternalError(`no ${kind} model to build ${family} gates with`);
    return m;
  };
  for (const g of net.gates) {
    const o = netOf(g.output);
    const ins = g.inputs.map(netOf);
    const op = g.op;
    switch (family) {
      case 'gate':
        add({ name: name('G'), kind: 'gate', op, terminals: [o, ...ins], params: {} });
        break;
      case 'cmos': {
        const n = { model: model('nmos'), params: { ...(cx.mosParams?.nmos ?? {}) } };
        const p = { model: model('pmos'), params: { ...(cx.mosParams?.pmos ?? {}) } };
        const series = (kind: 'nmos' | 'pmos', from: string, to: string, bulk: string) => {
          let node = from;
          ins.forEach((x, k) => {
            const next = k === ins.length - 1 ? to : `${cx.prefix}.s${seq++}`;
            add({ name: name('M'), kind, terminals: [node, x, next, bulk], ...(kind === 'nmos' ? n : p) });
            node = next;
          });
        };
        const parallel = (kind: 'nmos' | 'pmos', rail: string) => {
          for (const x of ins) add({ name: name('M'), kind, terminals: [o, x, rail, rail], ...(kind === 'nmos' ? n : p) });
        };
        if (op === 'nor') {
          parallel('nmos', cx.gnd);
          series('pmos', o, cx.vcc, cx.vcc);
        } else {
          // NAND and the inverter (a one-input NAND).
          parallel('pmos', cx.vcc);
          series('nmos', o, cx.gnd, cx.gnd);
        }
        break;
      }
      case 'nmos': {
        const n = { model: model('nmos'), params: { ...(cx.mosParams?.nmos ?? {}) } };
        add({ name: name('R'), kind: 'resistor', terminals: [cx.vcc, o], value: cx.ohms.load, params: {} });
        if (op === 'nor') for (const x of ins) add({ name: name('M'), kind: 'nmos', terminals: [o, x, cx.gnd, cx.gnd], ...n });
        else {
          let node = o;
          ins.forEach((x, k) => {
            const next = k === ins.length - 1 ? cx.gnd : `${cx.prefix}.s${seq++}`;
            add({ name: name('M'), kind: 'nmos', terminals: [node, x, next, cx.gnd], ...n });
            node = next;
          });
        }
        break;
      }
      case 'rtl': {
        if (op === 'nand') throw new InternalError('RTL networks are NOR–NOR');
        add({ name: name('R'), kind: 'resistor', terminals: [cx.vcc, o], value: cx.ohms.load, params: {} });
        for (const x of ins) {
          const b = `${cx.prefix}.b${seq++}`;
          add({ name: name('R'), kind: 'resistor', terminals: [x, b], value: cx.ohms.base, params: {} });
          add({ name: name('Q'), kind: 'npn', terminals: [o, b, cx.gnd], model: model('npn'), params: {} });
        }
        break;
      }
      case 'dtl': {
        if (op === 'nor') throw new InternalError('DTL networks are NAND–NAND');
        const p = `${cx.prefix}.p${seq++}`;
        const m = `${cx.prefix}.m${seq++}`;
        const b = `${cx.prefix}.b${seq++}`;
        add({ name: name('R'), kind: 'resistor', terminals: [cx.vcc, p], value: cx.ohms.diodePullUp, params: {} });
        for (const x of ins) add({ name: name('D'), kind: 'diode', terminals: [p, x], model: model('diode'), params: {} });
        add({ name: name('D'), kind: 'diode', terminals: [p, m], model: model('diode'), params: {} });
        add({ name: name('D'), kind: 'diode', terminals: [m, b], model: model('diode'), params: {} });
        add({ name: name('R'), kind: 'resistor', terminals: [b, cx.gnd], value: cx.ohms.bleed, params: {} });
        add({ name: name('R'), kind: 'resistor', terminals: [cx.vcc, o], value: cx.ohms.load, params: {} });
        add({ name: name('Q'), kind: 'npn', terminals: [o, b, cx.gnd], model: model('npn'), params: {} });
        break;
      }
    }
  }
  return out;
}
