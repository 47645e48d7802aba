// Gate-level primitives (kind 'gate' devices) go straight into the logic view: one node per
// driven net; several drivers on a net resolve by its kind (wand/wor, tri-state buses, pull-ups).
import { and, not, or, xor, TRUE, FALSE, type Expr } from '../logic/expr';
import type { GateOp } from '../netlist/ir';
import type { DriverGroup, LogicNode, NodeKind, PullUp } from './types';
import { controlOf, netName, type ExtractContext } from './context';

interface Drive {
  device: number;
  value: Expr;
  /** Undefined = always driving. */
  enable?: Expr;
  storage: boolean;
}

/** Function of one primitive: its value and, for tri-state primitives, its enable. */
export function gateFunction(op: GateOp, ins: Expr[], q?: Expr): { value: Expr; enable?: Expr; storage?: boolean } {
  switch (op) {
    case 'buf':
      return { value: ins[0] };
    case 'not':
      return { value: not(ins[0]) };
    case 'and':
      return { value: and(...ins) };
    case 'or':
      return { value: or(...ins) };
    case 'nand':
      return { value: not(and(...ins)) };
    case 'nor':
      return { value: not(or(...ins)) };
    case 'xor':
      return { value: xor(...ins) };
    case 'xnor':
      return { value: not(xor(...ins)) };
    case 'bufif1':
      return { value: ins[0], enable: ins[1] };
    case 'bufif0':
      return { value: ins[0], enable: not(ins[1]) };
    case 'notif1':
      return { value: not(ins[0]), enable: ins[1] };
    case 'notif0':
      return { value: not(ins[0]), enable: not(ins[1]) };
    case 'pullup':
      return { value: TRUE, enable: FALSE };
    case 'pulldown':
      return { value: FALSE, enable: FALSE };
    case 'latch':
      // transparent while enabled, holds otherwise: next state over the cut state bit q
      return { value: or(and(ins[1], ins[0]), and(not(ins[1]), q ?? FALSE)), storage: true };
    case 'dff':
      return { value: ins[0], storage: true };
  }
}

export function extractGates(cx: ExtractContext): LogicNode[] {
  const byNet = new Map<number, Drive[]>();
  const pulls = new Map<number, { up: PullUp[]; down: number[] }>();
  cx.nl.devices.forEach((d, i) => {
    if (d.kind !== 'gate' || !d.op) return;
    const out = d.terminals[0];
    if (d.op === 'pullup' || d.op === 'pulldown') {
      const p = pulls.get(out) ?? { up: [], down: [] };
      if (d.op === 'pullup') p.up.push({ device: i, kind: 'gate', rail: out, railVolts: 1 });
      else p.down.push(i);
      pulls.set(out, p);
      return;
    }
    const ins = d.terminals.slice(1).map((n) => controlOf(cx, n));
    const f = gateFunction(d.op, ins, controlOf(cx, out));
    const list = byNet.get(out) ?? [];
    list.push({ device: i, value: f.value, enable: f.enable, storage: !!f.storage });
    byNet.set(out, list);
  });
  const nodes: LogicNode[] = [];
  for (const [net, drives] of byNet) {
    const p = pulls.get(net);
    const netKind = cx.nl.nets[net].kind;
    const always = drives.filter((d) => !d.enable);
    const tri = drives.filter((d) => d.enable);
    let fn: Expr;
    let enable: Expr | undefined;
    let kind: NodeKind;
    if (drives.some((d) => d.storage)) {
      kind = 'latch';
      fn = drives[0].value;
    } else if (tri.length === 0) {
      kind = drives.length > 1 ? 'wired' : 'static';
      fn = drives.length === 1 ? drives[0].value : netKind === 'wor' ? or(...drives.map((d) => d.value)) : and(...drives.map((d) => d.value));
    } else {
      const en = or(...tri.map((d) => d.enable!), ...always.map(() => TRUE));
      const value = or(...tri.map((d) => and(d.enable!, d.value)), ...always.map((d) => d.value));
      if (p?.up.length) {
        fn = or(not(en), value);
        kind = drives.length > 1 ? 'wired' : 'open-collector';
      } else if (p?.down.length) {
        fn = and(en, value);
        kind = drives.length > 1 ? 'wired' : 'open-collector';
      } else {
        fn = value;
        enable = en.op === 'const' && en.value === 1 ? undefined : en;
        kind = enable ? 'tristate' : 'static';
      }
    }
    const groups: DriverGroup[] = drives.map((d) => ({
      family: 'gate',
      pullsLow: d.enable ? and(d.enable, not(d.value)) : not(d.value),
      pullsHigh: d.enable ? and(d.enable, d.value) : d.value,
      bases: [],
      devices: [d.device],
      path: cx.nl.devices[d.device].path,
      openCollector: false,
    }));
    const ups = p?.up ?? [];
    nodes.push({
      net,
      name: netName(cx, net),
      kind,
      family: 'gate',
      fn,
      inputs: [],
      devices: [...drives.map((d) => d.device), ...ups.map((u) => u.device), ...(p?.down ?? [])],
      pullUp: ups[0],
      pullUps: ups,
      groups,
      enable,
    });
  }
  return nodes;
}
