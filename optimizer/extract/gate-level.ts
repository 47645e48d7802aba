// The gate-level view of an extracted design: every driven net becomes a small tree of IEEE 1364
// primitives (tri-state nets a bufif1 on their enable), as a one-cell Design the Verilog writer
// and the simulators take like any other gate-level design.
import type { Cell, Design, Device, GateOp } from '../netlist/ir';
import type { Expr } from '../logic/expr';
import type { LogicView } from './types';

export function toGateLevel(view: LogicView): Design {
  const devices: Device[] = [];
  let counter = 0;
  const fresh = (base: string) => `${base}$${++counter}`;
  const emit = (op: GateOp, out: string, ins: string[]) => {
    devices.push({ name: `G${devices.length + 1}`, kind: 'gate', op, terminals: [out, ...ins], params: {} });
  };
  const constNet = (value: 0 | 1): string => {
    const name = value ? '$one' : '$zero';
    if (!devices.some((d) => d.terminals[0] === name)) emit(value ? 'pullup' : 'pulldown', name, []);
    return name;
  };
  /** Net carrying e; `out` names the net when the caller needs a particular one. */
  const net = (e: Expr, base: string, out?: string): string => {
    const gate = (op: GateOp, ins: string[]) => {
      const o = out ?? fresh(base);
      emit(op, o, ins);
      return o;
    };
    switch (e.op) {
      case 'const':
        return out ? gate('buf', [constNet(e.value)]) : constNet(e.value);
      case 'var':
        return out ? gate('buf', [e.name]) : e.name;
      case 'not': {
        const a = e.arg;
        if (a.op === 'and' || a.op === 'or' || a.op === 'xor') {
          const op = ({ and: 'nand', or: 'nor', xor: 'xnor' } as const)[a.op];
          return gate(op, a.args.map((x) => net(x, base)));
        }
        return gate('not', [net(a, base)]);
      }
      case 'and':
      case 'or':
      case 'xor':
        return gate(e.op, e.args.map((x) => net(x, base)));
      case 'implies':
        return gate('or', [net({ op: 'not', arg: e.left }, base), net(e.right, base)]);
      case 'iff':
        return gate('xnor', [net(e.left, base), net(e.right, base)]);
    }
  };
  for (const n of view.nodes) {
    if (n.enable) {
      const data = net(n.fn, n.name);
      const en = net(n.enable, n.name);
      emit('bufif1', n.name, [data, en]);
    } else net(n.fn, n.name, n.name);
  }
  const cell: Cell = {
    name: 'top',
    ports: [...view.inputs, ...view.nodes.map((n) => n.name)].filter((p, i, a) => a.indexOf(p) === i),
    directions: Object.fromEntries([
      ...view.inputs.map((i) => [i, 'input' as const]),
      ...view.nodes.map((n) => [n.name, 'output' as const]),
    ]),
    devices,
    instances: [],
    netKinds: Object.fromEntries(view.nodes.filter((n) => n.enable).map((n) => [n.name, 'tri' as const])),
  };
  return { title: view.title, format: 'verilog', top: 'top', cells: { top: cell }, models: {}, globals: ['0'], params: {}, extraCards: [] };
}
